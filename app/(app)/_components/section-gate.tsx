import { notFound } from "next/navigation";
import { requirePageActor } from "@/lib/auth/session";
import type { Action } from "@/lib/domain/permissions";
import { runUseCase } from "@/lib/use-cases/run";
import { readShell } from "@/lib/use-cases/reads";

/**
 * A section's layout that makes its page's access check once more, above the section's loading.tsx.
 * Next wraps a page in a Suspense boundary when its folder has a loading.tsx, and streams the loading
 * skeleton before the page has run: a redirect to sign-in, a 403 or a 404 thrown by the page itself
 * would then arrive after a 200 status had been sent. Thrown here, outside the boundary, they keep their
 * status. The page still makes its own check (this one is not the only lock).
 */
export function sectionGate(action: Action | undefined, options: { mailbox?: true } = {}) {
  return async function SectionGate({ children }: { children: React.ReactNode }) {
    const actor = await requirePageActor(action);
    if (options.mailbox && !(await runUseCase(readShell, { actor, input: {} })).mailboxEnabled) notFound();
    return children;
  };
}
