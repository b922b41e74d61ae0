// Every submission of a library draft, each comment with the entry it is about.
import type { LibraryReviewDto } from "@/lib/data/library-drafts";
import { ReviewHistory } from "@/components/drafts/review-history";

export function LibraryReviewHistory({ reviews }: { reviews: LibraryReviewDto[] }) {
  return (
    <ReviewHistory
      reviews={reviews}
      about={(comment) => ({
        label: <span className="mr-1 font-medium text-ink-700">{comment.entryKey ?? "The whole submission"}:</span>,
        data: { "data-entry": comment.entryKey ?? "" },
      })}
    />
  );
}
