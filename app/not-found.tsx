import type { Metadata } from "next";
import { StatusPage } from "@/components/status-page";

export const metadata: Metadata = { title: "Page not found" };

export default function NotFound() {
  return (
    <StatusPage code="404" title="There is no page at this address" testId="not-found-page">
      <p>The link may be mistyped, or the page may have moved. Check the address, or start again from your home page.</p>
    </StatusPage>
  );
}
