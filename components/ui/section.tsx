/** A titled part of a long page (a version, a run), labelled by its heading for assistive technology. */
export function Section({ title, id, children }: { title: string; id: string; children: React.ReactNode }) {
  return (
    <section aria-labelledby={id} className="mt-10">
      <h2 id={id} className="mb-3 text-lg font-semibold text-ink-900">
        {title}
      </h2>
      {children}
    </section>
  );
}
