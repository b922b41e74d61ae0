// Every submission of a draft (a standard's or a library's): the changelog line, the decision, the reviewer's
// note and each comment with what it is about (a line of the source, an entry of the library).
import type { ReactNode } from "react";
import { Badge } from "@/components/ui/badge";

export type ReviewRound = {
  id: string;
  round: number;
  changelog: string;
  submittedByName: string;
  outcome: "returned" | "approved" | null;
  reviewerName: string | null;
  note: string | null;
  comments: { id: number; body: string; authorName: string }[];
};

export function ReviewHistory<R extends ReviewRound>({
  reviews,
  about,
}: {
  reviews: R[];
  /** What a comment is about, shown before it, and the attributes that say so to tests. */
  about: (comment: R["comments"][number], review: R) => { label: ReactNode; data: Record<`data-${string}`, string> };
}) {
  if (reviews.length === 0) return null;
  return (
    <section aria-labelledby="reviews-heading" className="mt-8" data-testid="review-history">
      <h2 id="reviews-heading" className="mb-3 text-lg font-semibold text-ink-900">
        Reviews
      </h2>
      <ol className="space-y-3">
        {[...reviews].reverse().map((review) => (
          <li key={review.id} className="rounded-plate bg-paper-raised p-4 ring-1 ring-ink-200" data-testid="review-round">
            <p className="flex flex-wrap items-center gap-2 text-sm">
              <span className="font-semibold">Submission {review.round}</span>
              <span className="text-ink-700">
                “{review.changelog}” by {review.submittedByName}
              </span>
              <Badge tone={review.outcome === "approved" ? "pass" : review.outcome === "returned" ? "warn" : "neutral"}>
                {review.outcome === "approved"
                  ? `Approved by ${review.reviewerName}`
                  : review.outcome === "returned"
                    ? `Returned by ${review.reviewerName}`
                    : "Awaiting review"}
              </Badge>
            </p>
            {review.note ? <p className="mt-2 text-ink-900">{review.note}</p> : null}
            {review.comments.length > 0 ? (
              <ul className="mt-2 space-y-2">
                {review.comments.map((comment) => {
                  const { label, data } = about(comment, review);
                  return (
                    <li key={comment.id} className="text-sm" data-testid="review-comment" {...data}>
                      {label}
                      <span className="text-ink-900">{comment.body}</span>{" "}
                      <span className="text-ink-500">— {comment.authorName}</span>
                    </li>
                  );
                })}
              </ul>
            ) : null}
          </li>
        ))}
      </ol>
    </section>
  );
}

/** A draft's state in a word or two: a draft, in review, returned for changes (edited again after a review), … */
export function draftStateLabel(state: string, reviews: number): string {
  if (state === "in-review") return "In review";
  if (state === "editing") return reviews > 0 ? "Returned for changes" : "Draft";
  return state.charAt(0).toUpperCase() + state.slice(1);
}
