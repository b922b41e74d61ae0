import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageActor } from "@/lib/auth/session";
import { runUseCase } from "@/lib/use-cases/run";
import { readDemoMailbox } from "@/lib/use-cases/reads";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { formatDateTime } from "@/components/format-date";
import { LinkedText } from "./_components/linked-text";

export const metadata: Metadata = { title: "Demo mailbox" };

// Present only while `npm start` runs its fake SMTP server; with real mail this page does not exist.
export default async function MailboxPage() {
  const actor = await requirePageActor("mailbox.read", { next: "/admin/mailbox" });
  const messages = await runUseCase(readDemoMailbox, { actor, input: {} });
  if (messages === null) notFound();

  return (
    <>
      <PageHeader
        title="Demo mailbox"
        lead="E-mails Gusset has sent while running as a demo. They never left this machine. To try an invitation or reset link as the person it was sent to, open it in a private window, so that you stay signed in here; opened in this window, an invitation asks before it signs you out. Only the newest invitation to an address works: inviting it again cancels the earlier link."
      />
      {messages.length === 0 ? (
        <EmptyState title="No e-mails yet">Invite someone from the People page and the invitation appears here.</EmptyState>
      ) : (
        <ol className="space-y-3" data-testid="mailbox">
          {messages.map((message, index) => (
            <li key={message.id} data-testid="mail-item" data-to={message.to.join(",")}>
              <details open={index === 0} className="group rounded-plate bg-paper-raised shadow-sheet ring-1 ring-ink-200">
                <summary className="flex cursor-pointer list-none flex-wrap items-baseline justify-between gap-x-4 gap-y-1 px-4 py-3">
                  <span className="font-medium text-ink-900" data-testid="mail-subject">
                    {message.subject || "(no subject)"}
                  </span>
                  <span className="text-xs text-ink-500 tabular">
                    to {message.to.join(", ") || "—"} · {message.date ? formatDateTime(message.date) : "date unknown"}
                  </span>
                </summary>
                <div className="border-t border-ink-100 px-4 py-4">
                  <LinkedText text={message.text || "(this e-mail has no plain-text part)"} />
                </div>
              </details>
            </li>
          ))}
        </ol>
      )}
    </>
  );
}
