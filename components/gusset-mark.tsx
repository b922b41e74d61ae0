import { MARK, outlinePath } from "./connection-geometry";

// Gusset's mark: a gusset plate seen in elevation — a square corner where a column and a beam meet, the
// third side cut square to an incoming brace, and three bolts on the brace's centre line, inside both the
// plate and the brace (set out in components/connection-geometry.ts). Drawn on a 32-unit grid so it stays
// crisp at 16, 24 and 32 px. Same drawing as app/icon.svg.
type GussetMarkProps = {
  className?: string;
  /** Accessible name; omit when a visible "Gusset" word sits beside the mark. */
  title?: string;
};

const BOLT = "var(--gusset-mark-bolt, #f6f5f1)";

export function GussetMark({ className, title }: GussetMarkProps) {
  const [endA, farA, farB, endB] = MARK.brace;
  const cut = MARK.axis.origin;
  const inward = MARK.axis.inward;
  // Where the brace's edges cross the plate's cut edge: half the brace's width either side of the axis.
  const half = Math.hypot(endA.x - endB.x, endA.y - endB.y) / 2;
  const edge = (sign: number) => ({ x: cut.x - inward.y * half * sign, y: cut.y + inward.x * half * sign });
  return (
    <svg
      viewBox="0 0 32 32"
      className={className}
      role={title ? "img" : undefined}
      aria-hidden={title ? undefined : true}
      aria-label={title}
      data-testid="gusset-mark"
    >
      {/* the brace, lighter, coming in at 45° and lapping onto the plate */}
      <path d={outlinePath([endA, farA, farB, endB])} fill="currentColor" fillOpacity="0.45" />
      {/* the plate: column face on the left, beam face at the bottom, cut square to the brace */}
      <path d={outlinePath(MARK.plate)} fill="currentColor" />
      {/* the brace's edges where it lies on the plate */}
      <path
        d={`M${endA.x} ${endA.y} L${edge(-1).x} ${edge(-1).y} M${endB.x} ${endB.y} L${edge(1).x} ${edge(1).y} M${endA.x} ${endA.y} L${endB.x} ${endB.y}`}
        fill="none"
        stroke={BOLT}
        strokeOpacity="0.55"
        strokeWidth="0.75"
      />
      <g fill={BOLT}>
        {MARK.bolts.map((bolt) => (
          <circle key={`${bolt.x},${bolt.y}`} cx={bolt.x} cy={bolt.y} r={MARK.boltRadius} />
        ))}
      </g>
      {/* weld line along the column and beam faces */}
      <path d="M4 4 V28 H28" fill="none" stroke="var(--gusset-mark-edge, #141a23)" strokeWidth="2.5" />
    </svg>
  );
}
