import type { ModelInput } from "@/lib/engine";
import { FONT_SIZE, layoutModel, type ModelScene, type TextLabel } from "@/lib/standards/drawing";
import type { DeformedShape } from "@/lib/standards/deformed-shape";

export interface ModelDrawingProps {
  /** The engine's model, as a standard's evaluation gives it (SI: m, N, N/m, N·m). */
  model: ModelInput;
  /** The load case whose loads are drawn; default the first, `null` for none. */
  loadCase?: string | null;
  /** What the model is, for its accessible name: "Portal frame" → "Portal frame model: 4 nodes, …". */
  name?: string;
  /** Node and member ids; by default shown while the model is small enough to read them. */
  labels?: boolean;
  /** The box (viewBox units) the nodes are fitted into; the drawing always scales to its container's width. */
  width?: number;
  height?: number;
  /** The deformed shape under one result (`deformedShape` in lib/standards/deformed-shape.ts), drawn dashed over the model. */
  deformed?: DeformedShape;
  className?: string;
}

// Text sits on a halo of the figure's own background so it stays readable where it crosses a line.
function Label({ label, className }: { label: TextLabel; className: string }) {
  return (
    <text
      x={label.x}
      y={label.y}
      textAnchor={label.anchor}
      fontSize={FONT_SIZE}
      className={`${className} stroke-paper-raised`}
      strokeWidth={3}
      strokeLinejoin="round"
      paintOrder="stroke"
    >
      {label.text}
    </text>
  );
}

/** Phones get their own layout, fitted into a narrower box, so symbols and text stay readable at 390 px. */
const NARROW = { width: 300, height: 340 };

/** A structural model drawn to scale: members, hinges, supports and the loads of one load case. Server-rendered SVG. */
export function ModelDrawing({ model, loadCase, name, labels, width, height, deformed, className }: ModelDrawingProps) {
  const wide = layoutModel(model, { loadCase, name, labels, width, height, deformed });
  const narrow = layoutModel(model, { loadCase, name, labels, deformed, ...NARROW });
  return (
    <figure className={`rounded-plate border border-ink-200 bg-paper-raised p-3 ${className ?? ""}`} data-testid="model-drawing">
      <ModelSvg scene={wide} layout="wide" className="hidden max-h-[36rem] max-w-3xl sm:block" />
      <ModelSvg scene={narrow} layout="narrow" className="block max-h-[32rem] sm:hidden" />
      <figcaption className="mt-2 text-sm text-ink-500">
        {wide.loadCase
          ? `Loads of case ${wide.loadCase.id}${wide.loadCase.name ? ` (${wide.loadCase.name})` : ""}, in kN, kN/m and kN·m.`
          : "No loads shown."}
        {wide.hasTruss ? " Thin lines are truss members, pin-ended." : ""}
        {deformed ? (
          <span className="mt-1 block" data-testid="deformed-caption" data-factor={deformed.factor}>
            {deformed.caption}
          </span>
        ) : null}
      </figcaption>
    </figure>
  );
}

function ModelSvg({ scene, layout, className }: { scene: ModelScene; layout: "wide" | "narrow"; className: string }) {
  const { x, y, width: w, height: h } = scene.viewBox;
  return (
    <svg
      viewBox={`${x} ${y} ${w} ${h}`}
      role="img"
      aria-label={scene.summary}
      className={`mx-auto h-auto w-full font-sans ${className}`}
      data-testid="model-drawing-svg"
      data-layout={layout}
    >
      <title>{scene.summary}</title>
      {scene.deformed ? <desc>{scene.deformed.caption}</desc> : null}
      <g fill="none" strokeLinecap="round">
        {scene.members.map((m) => (
          <line
            key={m.id}
            x1={m.from.x}
            y1={m.from.y}
            x2={m.to.x}
            y2={m.to.y}
            data-member={m.id}
            data-kind={m.kind}
            className={m.kind === "truss" ? "stroke-ink-700" : "stroke-ink-900"}
            strokeWidth={m.kind === "truss" ? 1.25 : 2.5}
          />
        ))}
      </g>
      <g className="fill-paper-raised stroke-ink-900" strokeWidth={1.25}>
        {scene.hinges.map((c) => (
          <circle key={`${c.cx},${c.cy}`} cx={c.cx} cy={c.cy} r={c.r} data-hinge="" />
        ))}
      </g>
      {scene.deformed?.members.length ? (
        // Over the members and under the symbols and labels, so the model stays legible where the shape crosses it.
        <g
          fill="none"
          className="stroke-plate-700"
          strokeWidth={1.75}
          strokeDasharray="6 4"
          strokeLinejoin="round"
          data-deformed=""
        >
          {scene.deformed.members.map((m) => (
            <path key={m.id} d={m.d} data-member={m.id} />
          ))}
        </g>
      ) : null}
      {scene.supports.map((s) => (
        <g key={s.node} data-support={s.kind} data-node={s.node} className="stroke-ink-700" strokeWidth={1.25}>
          <path d={s.strokes} fill="none" />
          {s.outlines && <path d={s.outlines} className="fill-paper-raised" strokeLinejoin="round" />}
          {s.wheels.map((c) => (
            <circle key={`${c.cx},${c.cy}`} cx={c.cx} cy={c.cy} r={c.r} className="fill-paper-raised" />
          ))}
          {s.notes.map((t) => (
            <Label key={t.text} label={t} className="fill-ink-700" />
          ))}
        </g>
      ))}
      {scene.loads.map((l, i) => (
        <g key={i} data-load={l.kind} data-on={l.on}>
          <path d={l.shafts} fill="none" className="stroke-plate-600" strokeWidth={1.25} />
          <path d={l.heads} className="fill-plate-600" />
          {l.label && <Label label={l.label} className="fill-plate-800" />}
        </g>
      ))}
      {scene.members.map((m) => m.label && <Label key={m.id} label={m.label} className="fill-ink-400" />)}
      {scene.nodeLabels.map((t) => (
        <Label key={t.text} label={t} className="fill-ink-500 font-medium" />
      ))}
    </svg>
  );
}
