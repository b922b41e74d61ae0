// A section's properties as engineers read them off a table (mm², 10⁶ mm⁴, 10³ mm³, mm, ratios; four
// significant figures), with the torsion constant's convention for the shape (lib/libraries/sections.ts).
// Given a catalogue's listed values, it sets them beside the builder's with the relative difference, and
// flags — in words, not only colour — those past the tolerance. Renders on the server.
import type { ListedProperty, Section, SectionShape } from "@/lib/libraries";
import { Badge } from "@/components/ui/badge";
import { TableFrame } from "@/components/ui/table";
import { formatPercent, formatProperty, propertyDisplay } from "./format";

export interface SectionPropertiesProps {
  /** The builder's section; its properties are SI (m², m⁴, m³, m, rad). */
  section: Pick<Section, "shape" | "properties">;
  /** A catalogue's listed values for the section, SI; shown beside the computed ones when given. */
  listed?: Partial<Record<ListedProperty, number>>;
  /** Largest relative difference not flagged; 0.01, the catalogue import's. */
  tolerance?: number;
  /** The table's name for assistive technology; "Section properties" unless given. */
  label?: string;
}

/** How the builder works out J for each shape: in the words of sections.ts' header. */
export const J_CONVENTION: Record<SectionShape, string> = {
  i: "J is thin-walled: Σ b t³/3 over the flanges and the web between them, plus the fillet and flange-tip corrections of El Darwish & Johnston (1965) when there is a root radius.",
  channel:
    "J is thin-walled: Σ b t³/3 over the flanges and the web between them, with no fillet correction (tables of rolled channels may include one).",
  angle:
    "J is thin-walled: Σ b t³/3 over the legs b and d − t, with no fillet correction (tables of rolled angles may include one).",
  "rectangular-hollow": "J is thin-walled: Bredt's formula 4Am²t/pm on the wall's mid-line, plus the open-wall term pm t³/3.",
  "circular-hollow": "J is exact: 2I, the polar second moment of area.",
  rectangle: "J is exact: Saint-Venant's series solution for a solid rectangle.",
  circle: "J is exact: πD⁴/32, the polar second moment of area.",
};

export function SectionProperties({ section, listed, tolerance = 0.01, label }: SectionPropertiesProps) {
  const properties = section.properties as unknown as Record<string, number>;
  const keys = Object.keys(properties);
  const compare = listed !== undefined && Object.keys(listed).length > 0;
  const headings = compare
    ? ["Symbol", "Property", "Unit", "Listed", "Computed", "Difference"]
    : ["Symbol", "Property", "Unit", "Value"];
  return (
    <div className="space-y-2" data-testid="section-properties">
      <TableFrame headings={headings} testId="section-properties-table" label={label ?? "Section properties"}>
        {keys.map((key) => {
          const show = propertyDisplay(key, section.shape);
          const computed = properties[key];
          const given = listed?.[key as ListedProperty];
          const difference =
            given === undefined ? null : computed === 0 ? Math.sign(given) : (given - computed) / Math.abs(computed);
          const flagged = difference !== null && !(Math.abs(difference) <= tolerance);
          return (
            <tr key={key} data-property={key} data-flagged={flagged || undefined}>
              <th scope="row" className="px-4 py-2 font-medium whitespace-nowrap text-ink-900 italic">
                {show.symbol}
              </th>
              <td className="px-4 py-2 text-ink-700">{show.name}</td>
              <td className="px-4 py-2 whitespace-nowrap text-ink-500">{show.unit || "ratio"}</td>
              {compare && (
                <td className="tabular px-4 py-2 text-right whitespace-nowrap" data-value="listed">
                  {given === undefined ? (
                    <span className="text-ink-400">not listed</span>
                  ) : (
                    formatProperty(key, given, section.shape)
                  )}
                </td>
              )}
              <td className="tabular px-4 py-2 text-right whitespace-nowrap" data-value="computed">
                {formatProperty(key, computed, section.shape)}
              </td>
              {compare && (
                <td className="tabular px-4 py-2 whitespace-nowrap" data-value="difference">
                  {difference === null ? (
                    ""
                  ) : (
                    <span className="inline-flex items-center gap-2">
                      {formatPercent(difference)}
                      {flagged && <Badge tone="warn">over {formatPercent(tolerance).replace("+", "")}</Badge>}
                    </span>
                  )}
                </td>
              )}
            </tr>
          );
        })}
      </TableFrame>
      <p className="text-sm text-ink-500" data-testid="j-convention">
        Values to four significant figures. {J_CONVENTION[section.shape]}
        {compare ? " Where the catalogue lists a value, runs use the listed one." : ""}
      </p>
    </div>
  );
}
