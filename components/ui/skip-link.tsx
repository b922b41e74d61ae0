/** "Skip to content": the first thing the keyboard reaches, shown only while it has focus; targets id="main". */
export function SkipLink() {
  return (
    <a
      href="#main"
      data-testid="skip-link"
      className="sr-only z-50 rounded-plate bg-plate-700 px-4 py-2 text-sm font-medium text-white focus:not-sr-only focus:fixed focus:top-3 focus:left-3"
    >
      Skip to content
    </a>
  );
}
