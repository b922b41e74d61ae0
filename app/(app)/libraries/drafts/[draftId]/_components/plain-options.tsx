// A select's options whose value is the word shown (a family, a unit, a purpose), for the entry forms.
export function PlainOptions({ values }: { values: readonly string[] }) {
  return values.map((value) => (
    <option key={value} value={value}>
      {value}
    </option>
  ));
}
