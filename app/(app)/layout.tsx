import Link from "next/link";
import { getActor } from "@/lib/auth/session";
import { can } from "@/lib/domain/permissions";
import { ROLE_LABELS } from "@/lib/domain/roles";
import { runUseCase } from "@/lib/use-cases/run";
import { readShell } from "@/lib/use-cases/reads";
import { GussetMark } from "@/components/gusset-mark";
import { SkipLink } from "@/components/ui/skip-link";
import { NAV_ITEMS } from "./_components/nav-items";
import { SessionWatcher } from "./_components/session-watcher";
import { SideNav } from "./_components/side-nav";
import { UserMenu } from "./_components/user-menu";

// The signed-in shell. It is not the access check: a layout does not re-run on client navigation,
// and it cannot know the address asked for. Each page calls requirePageActor(action, { next }) first,
// which sends an anonymous visitor to sign in and back to that page afterwards; until then this
// layout draws no shell (and no names) for someone it does not know.
export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const actor = await getActor();
  if (!actor) return children;
  const { firmName, mailboxEnabled } = await runUseCase(readShell, { actor, input: {} });

  const items = NAV_ITEMS.filter((item) => item.permission === null || can(actor.role, item.permission))
    .filter((item) => item.href !== "/admin/mailbox" || mailboxEnabled)
    .map(({ href, label, icon, group }) => ({ href, label, icon, group }));

  return (
    <div className="min-h-dvh md:grid md:grid-cols-[15rem_1fr]">
      <SessionWatcher userId={actor.id} role={actor.role} name={actor.name} />
      {/* The first thing a keyboard reaches on every page: past the navigation, straight to the page. */}
      <SkipLink />
      <aside className="relative border-b border-ink-200 bg-paper-raised md:sticky md:top-0 md:h-dvh md:border-r md:border-b-0">
        <div className="flex h-full items-center gap-3 px-3 py-2.5 md:flex-col md:items-stretch md:gap-6 md:py-4">
          <Link href="/home" className="flex shrink-0 items-center gap-2.5 px-2 text-plate-700" data-testid="brand">
            <GussetMark className="h-7 w-7" />
            <span className="text-lg font-semibold tracking-tight text-ink-950">Gusset</span>
          </Link>
          <div className="ml-auto min-w-0 md:ml-0">
            <SideNav items={items} />
          </div>
          <p className="mt-auto hidden px-3 text-xs leading-relaxed text-ink-500 md:block">
            Standard calcs, checked and traceable.
          </p>
        </div>
      </aside>
      <div className="flex min-w-0 flex-col">
        <header className="flex h-14 items-center justify-between gap-4 border-b border-ink-200 bg-paper/90 px-4 backdrop-blur sm:px-6">
          <p className="truncate text-sm font-medium text-ink-700" data-testid="firm-name">
            {firmName}
          </p>
          <UserMenu name={actor.name} email={actor.email} roleLabel={ROLE_LABELS[actor.role]} />
        </header>
        <main
          id="main"
          tabIndex={-1}
          className="app-shell-main mx-auto w-full max-w-6xl flex-1 px-4 py-6 focus:outline-none sm:px-6 sm:py-8"
          data-testid="app-main"
          data-role={actor.role}
        >
          {children}
        </main>
      </div>
    </div>
  );
}
