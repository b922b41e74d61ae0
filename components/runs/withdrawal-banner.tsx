// Shown on a run's calc sheet (and so on its PDF) once the run's standard version has been withdrawn.
export function WithdrawalBanner({ withdrawal }: { withdrawal: { at: string; by: string | null; reason: string | null } }) {
  return (
    <div
      role="alert"
      className="my-3 border-2 border-fault-700 bg-fault-100 p-3 text-sm text-fault-700"
      data-testid="withdrawal-banner"
    >
      <p className="font-semibold">
        The standard version this run used was withdrawn{withdrawal.at ? ` on ${withdrawal.at.slice(0, 10)}` : ""}
        {withdrawal.by ? ` by ${withdrawal.by}` : ""}.
      </p>
      <p>
        {withdrawal.reason ? `Reason: ${withdrawal.reason}. ` : ""}Do not rely on these results until the run is repeated on a
        version in use.
      </p>
    </div>
  );
}
