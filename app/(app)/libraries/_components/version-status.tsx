import type { LibraryVersionStatus } from "@/lib/data/libraries";
import { Badge } from "@/components/ui/badge";

const LOOK: Record<LibraryVersionStatus, { tone: "pass" | "neutral" | "fault"; label: string }> = {
  published: { tone: "pass", label: "Published" },
  superseded: { tone: "neutral", label: "Superseded" },
  withdrawn: { tone: "fault", label: "Withdrawn" },
};

export function LibraryStatusBadge({ status }: { status: LibraryVersionStatus }) {
  const { tone, label } = LOOK[status];
  return (
    <Badge tone={tone} testId="library-version-status">
      {label}
    </Badge>
  );
}
