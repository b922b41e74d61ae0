import Link from "next/link";
import { GussetMark } from "@/components/gusset-mark";
import { buttonClasses } from "@/components/ui/button";

// The frame for the 403, 404 and 503 pages. A 403 from a signed-in page renders inside the shell (which has
// the brand already), a 404 for an unknown address renders alone: the `in-[.app-shell-main]` variants
// drop the brand and the full height when an ancestor is the shell's main area.
export function StatusPage({
  code,
  title,
  children,
  testId,
  action,
}: {
  code: string;
  title: string;
  children: React.ReactNode;
  testId: string;
  /** The one button; by default back to the home page. */
  action?: React.ReactNode;
}) {
  return (
    <section className="grid min-h-dvh place-items-center px-6 in-[.app-shell-main]:min-h-[60dvh]" data-testid={testId}>
      <div className="w-full max-w-lg">
        <div className="mb-10 flex items-center gap-2.5 text-plate-700 in-[.app-shell-main]:hidden">
          <GussetMark className="h-7 w-7" />
          <span className="text-lg font-semibold tracking-tight text-ink-950">Gusset</span>
        </div>
        <p className="font-mono text-sm text-ink-400 tabular">{code}</p>
        <h1 className="mt-1 text-2xl font-semibold tracking-tight text-ink-950">{title}</h1>
        <div className="mt-3 space-y-3 text-[0.95rem] leading-relaxed text-ink-700">{children}</div>
        <div className="mt-8 flex gap-3">
          {action ?? (
            <Link href="/home" className={buttonClasses("primary")}>
              Go to your home page
            </Link>
          )}
        </div>
      </div>
    </section>
  );
}
