"use client";
import { Button } from "@/components/ui/button";

/** Opens the browser's print dialog (to paper or to PDF). Not printed itself. */
export function PrintButton() {
  return (
    <Button type="button" variant="secondary" onClick={() => window.print()} data-testid="print-sheet">
      Print
    </Button>
  );
}
