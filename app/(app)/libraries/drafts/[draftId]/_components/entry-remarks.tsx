// What is said about one entry of a draft: the problems the check finds in it, and the reviewer's comments on it
// from the last return; "No problems" when there is nothing to say.
import type { LibraryProblem } from "@/lib/libraries";
import { describeProblem } from "./draft-document";

export function EntryRemarks({ problems, comments }: { problems: LibraryProblem[]; comments: string[] }) {
  return (
    <ul className="space-y-1">
      {problems.map((problem, i) => (
        <li key={`p${i}`} className="text-fault-700" data-testid="draft-entry-problem">
          {describeProblem(problem)}
        </li>
      ))}
      {comments.map((comment, i) => (
        <li key={`c${i}`} className="text-warn-700" data-testid="draft-entry-comment">
          Reviewer: {comment}
        </li>
      ))}
      {problems.length + comments.length === 0 ? <li className="text-pass-700">No problems</li> : null}
    </ul>
  );
}
