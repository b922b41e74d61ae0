// Shown on a run's page and its calc sheet (and so on its PDF) once its standard version, or a library version or
// entry it used, has been withdrawn: what, when, by whom and why, and where its impact report is.
import type { RunWithdrawal } from "@/lib/use-cases/runs";

export function WithdrawalBanner({ withdrawals }: { withdrawals: RunWithdrawal[] }) {
  if (withdrawals.length === 0) return null;
  return (
    <div
      role="alert"
      className="my-3 border-2 border-fault-700 bg-fault-100 p-3 text-sm text-fault-700"
      data-testid="withdrawal-banner"
    >
      {withdrawals.map((withdrawal) => (
        <p key={withdrawal.id} className="font-semibold">
          {withdrawal.label}, which this run used, was withdrawn on {withdrawal.occurredAt.slice(0, 10)}
          {withdrawal.actorName ? ` by ${withdrawal.actorName}` : ""}. Reason: {withdrawal.reason}{" "}
          <a href={`/withdrawals/${withdrawal.id}`} className="underline print:no-underline" data-testid="withdrawal-report-link">
            Impact report
          </a>
        </p>
      ))}
      <p>Do not rely on these results until the run is repeated on a version in use and checked again.</p>
    </div>
  );
}
