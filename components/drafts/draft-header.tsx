// A draft's page header (a standard's or a library's): whose draft it is, its state in a badge, and what happens
// to it next.
import type { ReactNode } from "react";
import { Badge } from "@/components/ui/badge";
import { PageHeader } from "@/components/ui/page-header";
import { draftStateLabel } from "./review-history";

export function DraftHeader({
  slug,
  mine,
  authorName,
  state,
  reviews,
  children,
  actions,
}: {
  slug: string;
  mine: boolean;
  authorName: string;
  state: string;
  /** How many times it was submitted. */
  reviews: number;
  /** The rest of the lead, after the badge. */
  children: ReactNode;
  actions?: ReactNode;
}) {
  return (
    <PageHeader
      title={`${slug}: ${mine ? "your draft" : `${authorName}'s draft`}`}
      lead={
        <>
          <Badge tone={state === "in-review" ? "warn" : "neutral"} testId="draft-state">
            {draftStateLabel(state, reviews)}
          </Badge>{" "}
          {children}
        </>
      }
      actions={actions}
    />
  );
}
