// A section drawn to scale from its dimensions: outline with fillets and rounded corners, the centroid, the
// axes (an angle's principal axes too), dimension lines and callouts in mm, and a scale bar, since the
// drawing fills whatever width it is given. A pure function of its props: it renders on the server.
import type { Section } from "@/lib/libraries";
import { dimensionKeys, dimensionLabel, formatMm, SHAPE_TITLES, taperPhrase } from "./format";
import { FONT, layoutSection, type SectionScene } from "./section-drawing-layout";

export interface SectionDrawingProps {
  /** The builder's section (a library entry's: `sectionOfEntry(entry)`); dimensions in metres. */
  section: Pick<Section, "shape" | "dimensions" | "properties">;
  /** The designation, for the accessible name: "GI 300x150x10.5, I section: …". */
  name?: string;
  className?: string;
}

/** "I section: flange width b 150 mm, depth d 300 mm, …" — the drawing's accessible name. */
export function describeSection(section: SectionDrawingProps["section"], name?: string): string {
  const dims = section.dimensions as Record<string, unknown>;
  const parts = dimensionKeys(section.shape).map((key) => {
    const { symbol, name: what } = dimensionLabel(section.shape, key);
    return `${what} ${symbol} ${formatMm(Number(dims[key] ?? 0))} mm`;
  });
  return `${name ? `${name}, ` : ""}${SHAPE_TITLES[section.shape]} drawn to scale: ${parts.join(", ")}${taperPhrase(dims)}`;
}

const halo = { className: "stroke-paper-raised", strokeWidth: 3, strokeLinejoin: "round", paintOrder: "stroke" } as const;

export function SectionDrawing({ section, name, className }: SectionDrawingProps) {
  const scene = layoutSection(section);
  const label = describeSection(section, name);
  return (
    <figure
      className={`rounded-plate border border-ink-200 bg-paper-raised p-3 ${className ?? ""}`}
      data-testid="section-drawing"
    >
      <svg
        viewBox={`${scene.viewBox.x} ${scene.viewBox.y} ${scene.viewBox.width} ${scene.viewBox.height}`}
        role="img"
        aria-label={label}
        className="mx-auto block h-auto w-full max-w-xl font-sans"
        data-testid="section-drawing-svg"
        data-shape={section.shape}
      >
        <title>{label}</title>
        <SectionSvg scene={scene} />
      </svg>
      <figcaption className="mt-2 text-sm text-ink-500">
        Drawn to scale; the bar is {scene.scaleBar.millimetres} mm. Dimensions in mm. The dot in a ring marks the centroid;
        dash-dot lines are the axes
        {section.shape === "angle" ? " (u and v the principal axes); xc and yc are measured from the heel" : ""}
        {section.shape === "channel" ? "; xc is measured from the back of the web" : ""}
        {section.shape === "rectangular-hollow" ? "; the inner corner radius ri is max(ro − t, 0)" : ""}.
      </figcaption>
    </figure>
  );
}

function SectionSvg({ scene }: { scene: SectionScene }) {
  const { extent, centroid, scaleBar } = scene;
  return (
    <>
      <path
        d={scene.outline}
        fillRule="evenodd"
        className="fill-plate-100 stroke-plate-800"
        strokeWidth={1.5}
        strokeLinejoin="round"
        data-outline=""
        data-extent={`${extent.left} ${extent.top} ${extent.right} ${extent.bottom}`}
      />
      <g className="stroke-ink-500" strokeWidth={0.75} strokeDasharray="10 3 2 3" fill="none">
        {scene.axes.map((a) => (
          <line key={a.name} x1={a.from.x} y1={a.from.y} x2={a.to.x} y2={a.to.y} data-axis={a.name} />
        ))}
      </g>
      <g fontSize={FONT} className="fill-ink-700 italic" textAnchor="middle">
        {scene.axes.map((a) => (
          <text key={a.name} x={a.label.x} y={a.label.y} {...halo}>
            {a.name}
          </text>
        ))}
      </g>
      <g data-centroid={`${centroid.x} ${centroid.y}`}>
        <circle cx={centroid.x} cy={centroid.y} r={4.5} className="fill-paper-raised stroke-ink-900" strokeWidth={1} />
        <circle cx={centroid.x} cy={centroid.y} r={1.75} className="fill-ink-900" />
      </g>
      <g className="stroke-ink-700" strokeWidth={0.75} fill="none">
        {scene.dimensions.map((d) => (
          <g key={d.key} data-dimension={d.key}>
            {d.extensions.map(([a, b], i) => (
              <line key={i} x1={a.x} y1={a.y} x2={b.x} y2={b.y} className="stroke-ink-300" />
            ))}
            <line x1={d.from.x} y1={d.from.y} x2={d.to.x} y2={d.to.y} />
            <path d={`${tick(d.from)}${tick(d.to)}`} strokeWidth={1.25} />
          </g>
        ))}
        {scene.callouts.map((c) => (
          <g key={c.key} data-callout={c.key}>
            {c.across && (
              <>
                <line x1={c.across[0].x} y1={c.across[0].y} x2={c.across[1].x} y2={c.across[1].y} />
                <path d={`${tick(c.across[0])}${tick(c.across[1])}`} strokeWidth={1.25} />
              </>
            )}
            <path
              d={`M${c.anchor.x} ${c.anchor.y}L${c.label.x - 14} ${c.label.y - 4}H${c.label.x - 3}`}
              className="stroke-ink-400"
            />
          </g>
        ))}
      </g>
      <g fontSize={FONT} className="fill-ink-900 tabular">
        {scene.dimensions.map((d) => (
          <text
            key={d.key}
            x={d.label.x}
            y={d.label.y}
            textAnchor="middle"
            transform={d.label.rotate ? `rotate(-90 ${d.label.x} ${d.label.y})` : undefined}
            data-label={d.key}
            {...halo}
          >
            {d.label.text}
          </text>
        ))}
        {scene.callouts.map((c) => (
          <text key={c.key} x={c.label.x} y={c.label.y} data-label={c.key} {...halo}>
            {c.label.text}
          </text>
        ))}
      </g>
      <g data-scale-bar={scaleBar.millimetres}>
        <path
          d={`M${scaleBar.x} ${scaleBar.y - 4}V${scaleBar.y}H${scaleBar.x + scaleBar.length}V${scaleBar.y - 4}`}
          className="stroke-ink-900"
          strokeWidth={1.25}
          fill="none"
        />
        <text
          x={scaleBar.x + scaleBar.length}
          y={scaleBar.y - 7}
          fontSize={FONT}
          textAnchor="end"
          className="fill-ink-700 tabular"
        >
          {scaleBar.millimetres} mm
        </text>
      </g>
    </>
  );
}

/** A dimension line's end: a short oblique stroke, which reads at any size (arrowheads crowd a thin flange). */
const tick = (p: { x: number; y: number }) => `M${p.x - 3} ${p.y + 3}L${p.x + 3} ${p.y - 3}`;
