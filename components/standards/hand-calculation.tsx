// Where a verification case's expected values come from when they were worked out by hand: the checker, and
// the attached calculation as a download, named by its sha256 so a reader can tell it is the file cited.
import type { VerificationResult } from "@/lib/standards/verify";

export const handCalculationUrl = (sha256: string) => `/api/standards/hand-calculations/${sha256}`;

export function HandCalculationCitation({ result }: { result: VerificationResult }) {
  const hand = result.handCalculation;
  if (!hand) return null;
  return (
    <p className="max-w-sm text-xs text-ink-700" data-testid="hand-calculation">
      Hand calculation checked by {hand.checker}:{" "}
      <a className="underline" href={handCalculationUrl(hand.sha256)} download={hand.file}>
        {hand.file}
      </a>{" "}
      <span className="font-mono break-all text-ink-500">sha256 {hand.sha256}</span>
    </p>
  );
}
