import Link from "next/link";
import { GussetMark } from "@/components/gusset-mark";
import { buttonClasses } from "@/components/ui/button";

// The frame for 403 and 404 pages: they render outside the signed-in shell (root layout only).
export function StatusPage({
  code,
  title,
  children,
  testId,
}: {
  code: string;
  title: string;
  children: React.ReactNode;
  testId: string;
}) {
  return (
    <main className="grid min-h-dvh place-items-center px-6" data-testid={testId}>
      <div className="w-full max-w-lg">
        <div className="flex items-center gap-2.5 text-plate-700">
          <GussetMark className="h-7 w-7" />
          <span className="text-lg font-semibold tracking-tight text-ink-950">Gusset</span>
        </div>
        <p className="mt-10 font-mono text-sm text-ink-400 tabular">{code}</p>
        <h1 className="mt-1 text-2xl font-semibold tracking-tight text-ink-950">{title}</h1>
        <div className="mt-3 space-y-3 text-[0.95rem] leading-relaxed text-ink-700">{children}</div>
        <div className="mt-8 flex gap-3">
          <Link href="/home" className={buttonClasses("primary")}>
            Go to your home page
          </Link>
        </div>
      </div>
    </main>
  );
}
