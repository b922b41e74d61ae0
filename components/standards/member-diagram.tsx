import type { DiagramQuantity, MemberDiagram as EngineDiagram, MemberEnvelope } from "@/lib/engine";
import { FONT_SIZE, diagramData, diagramDisplay, layoutDiagram, type DiagramScene } from "@/lib/standards/drawing";
import type { DisplayUnits } from "@/lib/standards/display-units";

export interface MemberDiagramProps {
  /** From lib/engine's memberDiagram (one result) or memberEnvelope (max and min over several). */
  diagram: EngineDiagram | MemberEnvelope;
  /** N, V, M or deflection (any quantity the member has). */
  of: DiagramQuantity;
  /** The member's start and end node ids, printed at the ends so the reader knows which way x runs. */
  startNode?: string;
  endNode?: string;
  className?: string;
  /** SI (the default) or US customary labels. */
  units?: DisplayUnits;
}

/** Which side each quantity is drawn on, said in the caption (lib/engine/README.md has the conventions). */
const CONVENTION: Readonly<Record<DiagramQuantity, string>> = {
  M: "Drawn on the tension side: sagging (positive, tension on the local −y face) below the axis, hogging above.",
  V: "Positive shear (V = dM/dx) above the axis.",
  N: "Tension positive, above the axis.",
  deflection: "Displacement along the member's local y, drawn on that side (up for a member drawn left to right).",
  relativeDeflection:
    "Displacement from the chord through the displaced ends, along local y (up for a member drawn left to right).",
  axialDisplacement: "Displacement along the member's local x, positive above the axis.",
  stressTop: "Tension positive, above the axis.",
  stressBottom: "Tension positive, above the axis.",
};

/** A diagram of N, V, M or deflection along one member, with its extremes labelled. Server-rendered SVG. */
export function MemberDiagram({ diagram, of, startNode, endNode, className, units = "si" }: MemberDiagramProps) {
  const data = diagramData(diagram, of);
  const display = diagramDisplay(of, units);
  const under = "resultId" in diagram ? diagram.resultId : `the envelope of ${diagram.of.join(", ")}`;
  const title = `${display.name} ${display.symbol} along member ${diagram.memberId} under ${under}`;
  if (!data)
    return (
      <p className={`text-sm text-ink-500 ${className ?? ""}`} data-testid="member-diagram">
        {title}: not available for this member.
      </p>
    );
  const wide = layoutDiagram(data, { startNode, endNode, units });
  const narrow = layoutDiagram(data, { startNode, endNode, width: 300, height: 110, units });
  const extremes = wide.marks.map((m) => m.label.text).join("; ");
  const label = `${title}: ${extremes || `${display.symbol} = 0 along the member`}`;
  const ends = startNode && endNode ? ` x runs from node ${startNode} (left) to node ${endNode} (right).` : "";
  return (
    <figure className={`rounded-plate border border-ink-200 bg-paper-raised p-3 ${className ?? ""}`} data-testid="member-diagram">
      <DiagramSvg scene={wide} label={label} title={title} of={of} layout="wide" className="hidden max-w-2xl sm:block" />
      <DiagramSvg scene={narrow} label={label} title={title} of={of} layout="narrow" className="block sm:hidden" />
      <figcaption className="mt-2 text-sm text-ink-500">
        {title}, in {display.unit}. {CONVENTION[of]}
        {ends}
      </figcaption>
    </figure>
  );
}

interface DiagramSvgProps {
  scene: DiagramScene;
  label: string;
  title: string;
  of: DiagramQuantity;
  layout: "wide" | "narrow";
  className: string;
}

function DiagramSvg({ scene, label, title, of, layout, className }: DiagramSvgProps) {
  const { x, y, width, height } = scene.viewBox;
  return (
    <svg
      viewBox={`${x} ${y} ${width} ${height}`}
      role="img"
      aria-label={label}
      className={`mx-auto h-auto w-full font-sans ${className}`}
      data-testid="member-diagram-svg"
      data-quantity={of}
      data-layout={layout}
    >
      <title>{title}</title>
      {scene.curves.map((c, i) => (
        <g key={i} data-curve={i === 0 ? "max" : "min"}>
          <path d={c.area} className={i === 0 ? "fill-plate-100" : "fill-plate-50"} />
          <path d={c.line} fill="none" className="stroke-plate-700" strokeWidth={1.5} strokeLinejoin="round" />
        </g>
      ))}
      <line
        x1={scene.baseline.from.x}
        y1={scene.baseline.from.y}
        x2={scene.baseline.to.x}
        y2={scene.baseline.to.y}
        className="stroke-ink-900"
        strokeWidth={2}
        data-baseline=""
      />
      {scene.marks.map((m) => (
        <g key={m.which} data-extreme={m.which}>
          <circle cx={m.cx} cy={m.cy} r={m.r} className="fill-plate-800" />
          <text x={m.label.x} y={m.label.y} textAnchor={m.label.anchor} fontSize={FONT_SIZE} className="fill-ink-900">
            {m.label.text}
          </text>
        </g>
      ))}
      {scene.notes.map((t) => (
        <text key={t.text} x={t.x} y={t.y} textAnchor={t.anchor} fontSize={FONT_SIZE} className="fill-ink-500">
          {t.text}
        </text>
      ))}
    </svg>
  );
}
