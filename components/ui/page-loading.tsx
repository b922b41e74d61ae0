// What a section shows the moment it is clicked, while the server renders the page: the page header's
// shape (title, lead) and a sheet below it, quietly pulsing, and for a screen reader "Loading …". Each
// signed-in section's loading.tsx renders it; Next shows it during navigation until the page arrives.
export function PageLoading({ section, sheet = "table" }: { section: string; sheet?: "table" | "cards" }) {
  return (
    <div aria-busy="true" data-testid="page-loading" data-section={section}>
      <p role="status" className="sr-only">
        Loading {section}…
      </p>
      <div aria-hidden className="animate-pulse motion-reduce:animate-none">
        <div className="mb-8 border-b border-ink-200 pb-5">
          <div className="h-7 w-48 rounded-plate bg-ink-200" />
          <div className="mt-3 h-4 w-full max-w-xl rounded-plate bg-ink-100" />
          <div className="mt-2 h-4 w-2/3 max-w-md rounded-plate bg-ink-100" />
        </div>
        {sheet === "cards" ? (
          <div className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3">
            {[0, 1, 2].map((card) => (
              <div key={card} className="h-40 rounded-plate bg-paper-raised shadow-sheet ring-1 ring-ink-200" />
            ))}
          </div>
        ) : (
          <div className="rounded-plate bg-paper-raised shadow-sheet ring-1 ring-ink-200">
            <div className="h-10 border-b border-ink-200 bg-paper-sunk" />
            {[0, 1, 2, 3].map((row) => (
              <div key={row} className="flex gap-6 border-b border-ink-100 px-4 py-4 last:border-b-0">
                <div className="h-4 w-1/4 rounded-plate bg-ink-100" />
                <div className="h-4 w-1/3 rounded-plate bg-ink-100" />
              </div>
            ))}
          </div>
        )}
      </div>
    </div>
  );
}
