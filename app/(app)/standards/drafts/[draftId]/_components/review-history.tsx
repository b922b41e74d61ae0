// Every submission of the draft, each comment with the line of the submitted source it is about.
import type { ReviewDto } from "@/lib/data/standards";
import { ReviewHistory as Rounds } from "@/components/drafts/review-history";

export function ReviewHistory({ reviews }: { reviews: ReviewDto[] }) {
  return (
    <Rounds
      reviews={reviews}
      about={(comment, review) => ({
        label: comment.line ? (
          <code className="mr-2 block truncate rounded bg-paper-sunk px-2 py-1 text-xs text-ink-700">
            {comment.line}: {review.source.split("\n")[comment.line - 1]}
          </code>
        ) : null,
        data: { "data-line": String(comment.line ?? "") },
      })}
    />
  );
}
