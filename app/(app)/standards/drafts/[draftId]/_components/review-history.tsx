// Every submission of the draft: the changelog line, the decision, the reviewer's note and each comment with
// the line of the submitted source it is about.
import type { ReviewDto } from "@/lib/data/standards";
import { Badge } from "@/components/ui/badge";

export function ReviewHistory({ reviews }: { reviews: ReviewDto[] }) {
  if (reviews.length === 0) return null;
  return (
    <section aria-labelledby="reviews-heading" className="mt-8" data-testid="review-history">
      <h2 id="reviews-heading" className="mb-3 text-lg font-semibold text-ink-900">
        Reviews
      </h2>
      <ol className="space-y-3">
        {[...reviews].reverse().map((review) => {
          const lines = review.source.split("\n");
          return (
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
                  {review.comments.map((comment) => (
                    <li key={comment.id} className="text-sm" data-testid="review-comment" data-line={comment.line ?? ""}>
                      {comment.line ? (
                        <code className="mr-2 block truncate rounded bg-paper-sunk px-2 py-1 text-xs text-ink-700">
                          {comment.line}: {lines[comment.line - 1]}
                        </code>
                      ) : null}
                      <span className="text-ink-900">{comment.body}</span>{" "}
                      <span className="text-ink-500">— {comment.authorName}</span>
                    </li>
                  ))}
                </ul>
              ) : null}
            </li>
          );
        })}
      </ol>
    </section>
  );
}
