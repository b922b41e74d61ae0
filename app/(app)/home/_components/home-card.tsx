import Link from "next/link";

// A panel on the home page: a heading, an optional figure, a body, and one way onward.
export function HomeCard({
  title,
  figure,
  figureLabel,
  href,
  linkLabel,
  children,
  testId,
  coming,
}: {
  title: string;
  figure?: number;
  figureLabel?: string;
  href?: string;
  linkLabel?: string;
  children?: React.ReactNode;
  testId: string;
  /** A section still to be built: drawn quieter, with a dashed edge. */
  coming?: boolean;
}) {
  return (
    <section
      data-testid={testId}
      className={`flex flex-col rounded-plate p-5 ${
        coming ? "border border-dashed border-ink-300 bg-paper-raised/50" : "bg-paper-raised shadow-sheet ring-1 ring-ink-200"
      }`}
    >
      <div className="flex items-baseline justify-between gap-3">
        <h2 className="text-sm font-semibold text-ink-900">{title}</h2>
        {coming ? <span className="text-[0.7rem] font-medium tracking-wide text-ink-500 uppercase">Coming</span> : null}
      </div>
      {figure !== undefined ? (
        <p className="mt-3 flex items-baseline gap-2">
          <span className="text-3xl font-semibold tracking-tight text-ink-950 tabular" data-testid={`${testId}-count`}>
            {figure}
          </span>
          {figureLabel ? <span className="text-sm text-ink-500">{figureLabel}</span> : null}
        </p>
      ) : null}
      {children ? <div className="mt-3 flex-1 text-sm leading-relaxed text-ink-500">{children}</div> : <div className="flex-1" />}
      {href && linkLabel ? (
        <Link href={href} className="mt-4 text-sm font-medium text-plate-700 hover:underline">
          {linkLabel} →
        </Link>
      ) : null}
    </section>
  );
}
