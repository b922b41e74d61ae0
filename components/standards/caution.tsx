// The caution every results page and calc sheet carries (product.md, "Caution").
export const CAUTION_TEXT =
  "Results from Gusset are only as good as the standard's assumptions and the inputs given. A competent engineer must review every result before it is relied on, and the governing local building code and licensed practice prevail.";

export function Caution() {
  return (
    <aside
      className="my-6 rounded-plate border-l-4 border-warn-700 bg-warn-100 px-4 py-3 text-sm text-ink-900"
      data-testid="caution"
      aria-label="Caution"
    >
      <strong className="font-semibold">Caution. </strong>
      {CAUTION_TEXT}
    </aside>
  );
}
