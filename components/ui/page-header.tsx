export function PageHeader({ title, lead, actions }: { title: string; lead?: React.ReactNode; actions?: React.ReactNode }) {
  return (
    <header className="mb-8 flex flex-wrap items-end justify-between gap-4 border-b border-ink-200 pb-5">
      <div className="max-w-2xl">
        <h1 className="text-2xl font-semibold tracking-tight text-ink-950" data-testid="page-title">
          {title}
        </h1>
        {lead ? <p className="mt-2 text-[0.95rem] leading-relaxed text-ink-500">{lead}</p> : null}
      </div>
      {actions ? <div className="flex gap-2">{actions}</div> : null}
    </header>
  );
}
