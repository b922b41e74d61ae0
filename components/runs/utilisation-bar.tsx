// A check's utilisation as a bar against its limit of 1.00: full width is 1.25, so a failing check runs past the
// limit line and shows by how much. Colour repeats what the words say (pass or fail), never replaces them.
export function UtilisationBar({ utilisation, shown, pass }: { utilisation: number; shown: string; pass: boolean }) {
  const scale = 1.25;
  const width = Math.min(Math.max(utilisation, 0), scale) / scale;
  return (
    <div className="flex items-center gap-3" data-testid="utilisation-bar" data-utilisation={shown}>
      <div
        className="relative h-2.5 flex-1 rounded-full bg-ink-100"
        role="meter"
        aria-valuemin={0}
        aria-valuemax={scale}
        aria-valuenow={Math.min(Math.max(utilisation, 0), scale)}
        aria-label={`Utilisation ${shown} of a limit of 1.00`}
      >
        <div
          className={`h-full rounded-full ${pass ? "bg-pass-700" : "bg-fault-600"}`}
          style={{ width: `${(width * 100).toFixed(1)}%` }}
        />
        <div
          className="absolute inset-y-[-3px] w-0.5 bg-ink-900"
          style={{ left: `${((1 / scale) * 100).toFixed(1)}%` }}
          aria-hidden="true"
        />
      </div>
      <span className="w-12 text-right text-sm font-medium text-ink-900 tabular">{shown}</span>
    </div>
  );
}
