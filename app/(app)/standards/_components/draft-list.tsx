// The leads' working space on the Standards page: drafts being edited and drafts waiting for a review,
// saying whose move it is.
import Link from "next/link";
import type { DraftDto } from "@/lib/data/standards";
import { Badge } from "@/components/ui/badge";
import { formatDate } from "@/components/format-date";

export function DraftList({ drafts, actorId }: { drafts: DraftDto[]; actorId: string }) {
  if (drafts.length === 0) return null;
  return (
    <section aria-labelledby="drafts-heading" className="mb-8" data-testid="draft-list">
      <h2 id="drafts-heading" className="mb-3 text-base font-semibold text-ink-900">
        Drafts and reviews
      </h2>
      <ul className="divide-y divide-ink-100 rounded-plate bg-paper-raised shadow-sheet ring-1 ring-ink-200">
        {drafts.map((draft) => {
          const mine = draft.authorId === actorId;
          const move =
            draft.state === "in-review"
              ? mine
                ? "Waiting for a second lead's review"
                : "Waiting for your review"
              : mine
                ? "Your draft"
                : `${draft.authorName}'s draft`;
          return (
            <li key={draft.id} className="flex flex-wrap items-center justify-between gap-2 px-4 py-3" data-testid="draft-row">
              <span>
                <Link href={`/standards/drafts/${draft.id}`} className="font-medium text-plate-800 hover:underline">
                  {draft.slug}
                </Link>
                <span className="ml-2 text-sm text-ink-500">
                  {draft.basedOnNumber ? `from v${draft.basedOnNumber}` : "new standard"} · by {draft.authorName} · saved{" "}
                  {formatDate(draft.updatedAt)}
                </span>
              </span>
              <Badge tone={draft.state === "in-review" && !mine ? "warn" : "neutral"}>{move}</Badge>
            </li>
          );
        })}
      </ul>
    </section>
  );
}
