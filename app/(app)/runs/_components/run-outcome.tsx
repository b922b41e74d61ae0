import { Badge } from "@/components/ui/badge";

/** Pass, fail, or failed in the engine (no results). */
export function RunOutcomeBadge({ outcome, pass }: { outcome: "succeeded" | "failed"; pass: boolean | null }) {
  if (outcome === "failed")
    return (
      <Badge tone="warn" testId="run-outcome">
        Not analysed
      </Badge>
    );
  return (
    <Badge tone={pass ? "pass" : "fault"} testId="run-outcome">
      {pass ? "Every check passes" : "A check fails"}
    </Badge>
  );
}
