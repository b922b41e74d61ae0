import { JOB_STATUS_LABELS, type JobStatusId } from "@/lib/domain/schemas/jobs";
import { Badge } from "@/components/ui/badge";

const TONE: Record<JobStatusId, "pass" | "warn" | "neutral"> = { active: "pass", "on-hold": "warn", closed: "neutral" };

export function JobStatusBadge({ status }: { status: JobStatusId }) {
  return (
    <Badge tone={TONE[status]} testId="job-status">
      {JOB_STATUS_LABELS[status]}
    </Badge>
  );
}
