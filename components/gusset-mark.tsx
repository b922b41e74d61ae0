// Gusset's mark: a gusset plate seen in elevation — a square corner where a column and a beam
// meet, the third side cut square to an incoming brace, and three bolts on the brace line.
// Drawn on a 32-unit grid so it stays crisp at 16, 24 and 32 px. Same drawing as app/icon.svg.
type GussetMarkProps = {
  className?: string;
  /** Accessible name; omit when a visible "Gusset" word sits beside the mark. */
  title?: string;
};

export function GussetMark({ className, title }: GussetMarkProps) {
  return (
    <svg
      viewBox="0 0 32 32"
      className={className}
      role={title ? "img" : undefined}
      aria-hidden={title ? undefined : true}
      aria-label={title}
      data-testid="gusset-mark"
    >
      {/* the plate: column face on the left, beam face at the bottom, chamfer towards the brace */}
      <path d="M4 4 H14 L28 18 V28 H4 Z" fill="currentColor" />
      {/* bolts along the brace axis, a hair off the chamfer so the plate reads as one piece */}
      <g fill="var(--gusset-mark-bolt, #f6f5f1)">
        <circle cx="11" cy="11.5" r="2" />
        <circle cx="16" cy="16.5" r="2" />
        <circle cx="21" cy="21.5" r="2" />
      </g>
      {/* weld line along the column and beam faces */}
      <path d="M4 4 V28 H28" fill="none" stroke="var(--gusset-mark-edge, #141a23)" strokeWidth="2.5" />
    </svg>
  );
}
