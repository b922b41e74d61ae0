// A section's properties as engineers read them off a table (mm², 10⁶ mm⁴, 10³ mm³, mm, ratios; four
// significant figures), with the conventions of the torsion constant, the shear centre and the warping constant
// for the shape and the builder's rules the properties follow (lib/libraries/sections.ts, section-torsion.ts).
// Given a catalogue's listed values, it sets them beside the builder's with the relative difference, and
// flags — in words, not only colour — those past the tolerance. Renders on the server.
import type { ListedProperty, Section, SectionShape } from "@/lib/libraries";
import { Badge } from "@/components/ui/badge";
import { TableFrame } from "@/components/ui/table";
import { formatPercent, formatProperty, formatSlope, propertyDisplay } from "./format";

export interface SectionPropertiesProps {
  /** The builder's section; its properties are SI (m², m⁴, m³, m, rad). */
  section: Pick<Section, "shape" | "properties"> & { rules?: number; dimensions?: Section["dimensions"] };
  /** A catalogue's listed values for the section, SI; shown beside the computed ones when given. */
  listed?: Partial<Record<ListedProperty, number>>;
  /** Largest relative difference not flagged; 0.01, the catalogue import's. */
  tolerance?: number;
  /** The table's name for assistive technology; "Section properties" unless given. */
  label?: string;
}

/** How the builder works out J for each shape under rules 1: in the words of sections.ts' header. */
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

/** Where rules 2 works J out otherwise. */
const J_CONVENTION_2: Partial<Record<SectionShape, string>> = {
  channel:
    "J is thin-walled: Σ b t³/3 over the flanges and the web between them, plus El Darwish & Johnston's fillet and flange-tip corrections when there is a root radius.",
  angle:
    "J is thin-walled: Σ b t³/3 over the legs b and d − t, plus, with a root radius, a fillet term and end terms in El Darwish & Johnston's form.",
};

/** The shear centre's and warping constant's convention for each shape (rules 2), in the words of section-torsion.ts. */
export const WARPING_CONVENTION: Record<SectionShape, string> = {
  i: "Shear centre at the centroid (x0 = y0 = 0). Cw = Iy h0²/4, thin-walled, with h0 = d − tf between the flanges' mid-planes.",
  channel:
    "Shear centre thin-walled, e0 = 3b′²tf/(6b′tf + h′tw) from the web's mid-line with b′ = b − tw/2 and h′ = d − tf; Cw = (tf b′³h′²/12)(3b′tf + 2h′tw)/(6b′tf + h′tw). Fillets are left out of both.",
  angle:
    "Shear centre where the legs' mid-lines meet, t/2 from each outer face. Cw is taken as 0: thin straight legs meeting at a point do not warp.",
  "rectangular-hollow": "Shear centre at the centroid. Cw is taken as 0: a closed section's warping is negligible.",
  "circular-hollow": "Shear centre at the centroid. Cw = 0: a circular tube does not warp.",
  rectangle: "Shear centre at the centroid. Cw is conventionally taken as 0: a solid rectangle's is small.",
  circle: "Shear centre at the centroid. Cw = 0: a solid circle does not warp.",
};

export function SectionProperties({ section, listed, tolerance = 0.01, label }: SectionPropertiesProps) {
  const properties = section.properties as unknown as Record<string, number>;
  const keys = Object.keys(properties);
  const rules = section.rules ?? ("Cw" in properties ? 2 : 1);
  const taper = Number((section.dimensions as Record<string, unknown> | undefined)?.taper ?? 0);
  const jConvention =
    taper > 0
      ? `The flanges' inner faces slope ${formatSlope(taper)}; tf is their thickness half-way along the outstand. J is thin-walled: ∫ t³/3 along each tapered outstand, the flange over the web and the web between the flanges' roots, with no fillet correction.`
      : ((rules >= 2 ? J_CONVENTION_2[section.shape] : undefined) ?? J_CONVENTION[section.shape]);
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
        Values to four significant figures, by the section builder&apos;s rules {rules}. {jConvention}
        {compare ? " Where the catalogue lists a value, runs use the listed one." : ""}
      </p>
      {"Cw" in properties ? (
        <p className="text-sm text-ink-500" data-testid="warping-convention">
          {WARPING_CONVENTION[section.shape]}
        </p>
      ) : (
        <p className="text-sm text-ink-500" data-testid="warping-convention">
          Built by rules 1, before the shear centre and the warping constant were worked out; a section added since gives them.
        </p>
      )}
    </div>
  );
}
