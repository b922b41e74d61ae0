// What a section will hold, said plainly, while it is still empty or still to be built.
export function EmptyState({
  title,
  children,
  items,
  testId = "empty-state",
}: {
  title: string;
  children?: React.ReactNode;
  /** What will appear here, one line each. */
  items?: string[];
  testId?: string;
}) {
  return (
    <section data-testid={testId} className="rounded-plate border border-dashed border-ink-300 bg-paper-raised/60 px-6 py-8">
      <div className="flex items-start gap-4">
        <svg viewBox="0 0 24 24" aria-hidden className="mt-0.5 h-6 w-6 shrink-0 text-ink-400">
          {/* a blank sheet with a ruled margin: nothing recorded yet */}
          <path d="M5 2.5h10l4 4v15H5z" fill="none" stroke="currentColor" strokeWidth="1.5" />
          <path d="M8 10h8M8 13.5h8M8 17h5" stroke="currentColor" strokeWidth="1.5" />
        </svg>
        <div className="max-w-2xl">
          <h2 className="text-base font-semibold text-ink-900">{title}</h2>
          {children ? <div className="mt-1 text-sm leading-relaxed text-ink-500">{children}</div> : null}
          {items?.length ? (
            <ul className="mt-3 space-y-1 text-sm text-ink-700">
              {items.map((item) => (
                <li key={item} className="flex gap-2">
                  <span aria-hidden className="text-plate-700">
                    —
                  </span>
                  {item}
                </li>
              ))}
            </ul>
          ) : null}
        </div>
      </div>
    </section>
  );
}
