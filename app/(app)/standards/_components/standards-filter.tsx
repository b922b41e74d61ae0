// Search and filters as a plain GET form: the address holds the filter, so it can be bookmarked and works
// without JavaScript.
import { Button } from "@/components/ui/button";
import { SelectField, TextField } from "@/components/ui/field";

const STATUS_LABELS: Record<string, string> = {
  current: "In use (not withdrawn)",
  published: "Published (latest)",
  superseded: "Superseded",
  withdrawn: "Withdrawn",
  all: "Any status",
};

export function StandardsFilter({
  q,
  category,
  status,
  categories,
  statuses,
}: {
  q: string;
  category: string;
  status: string;
  categories: string[];
  statuses: string[];
}) {
  return (
    <form
      method="get"
      className="mb-4 grid items-end gap-3 sm:grid-cols-[minmax(0,1fr)_12rem_14rem_auto]"
      data-testid="standards-filter"
    >
      <TextField label="Search title, tag or category" name="q" defaultValue={q} data-testid="standards-search" />
      <SelectField label="Category" name="category" defaultValue={category}>
        <option value="">All categories</option>
        {categories.map((value) => (
          <option key={value} value={value}>
            {value}
          </option>
        ))}
      </SelectField>
      <SelectField label="Status" name="status" defaultValue={status}>
        {statuses.map((value) => (
          <option key={value} value={value}>
            {STATUS_LABELS[value] ?? value}
          </option>
        ))}
      </SelectField>
      <Button type="submit" variant="secondary">
        Filter
      </Button>
    </form>
  );
}
