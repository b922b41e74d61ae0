import type { VersionStatus } from "@/lib/data/standards";
import { Badge } from "@/components/ui/badge";

const LOOK: Record<VersionStatus, { tone: "pass" | "neutral" | "fault"; label: string }> = {
  published: { tone: "pass", label: "Published" },
  superseded: { tone: "neutral", label: "Superseded" },
  withdrawn: { tone: "fault", label: "Withdrawn" },
};

export function VersionStatusBadge({ status }: { status: VersionStatus }) {
  const { tone, label } = LOOK[status];
  return (
    <Badge tone={tone} testId="version-status">
      {label}
    </Badge>
  );
}
