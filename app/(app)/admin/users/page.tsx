import type { Metadata } from "next";
import { requirePageActor } from "@/lib/auth/session";
import { can } from "@/lib/domain/permissions";
import { runUseCase } from "@/lib/use-cases/run";
import { listPeople } from "@/lib/use-cases/people";
import { PageHeader } from "@/components/ui/page-header";
import { TableFrame } from "@/components/ui/table";
import { InviteForm } from "./_components/invite-form";
import { PendingInvitations } from "./_components/pending-invitations";
import { UnsavedRolesGuard, UserRow } from "./_components/user-row";

export const metadata: Metadata = { title: "People" };

export default async function PeoplePage() {
  const actor = await requirePageActor("users.read", { next: "/admin/users" });
  const { people, invitations } = await runUseCase(listPeople, { actor, input: {} });
  // Controls are offered to roles that hold the permission; the actions check it again on the server.
  const controls = { setRole: can(actor.role, "users.set-role"), deactivate: can(actor.role, "users.deactivate") };
  const mayInvite = can(actor.role, "users.invite");

  return (
    <>
      <PageHeader
        title="People"
        lead={
          mayInvite
            ? "Everyone who can sign in to Gusset at this firm. Invite people by e-mail, set what their role allows, and deactivate accounts of people who have left."
            : "Everyone who can sign in to Gusset at this firm, with their roles. Only admins change these."
        }
      />
      {mayInvite ? (
        <section
          aria-labelledby="invite-heading"
          className="mb-8 rounded-plate bg-paper-raised p-5 shadow-sheet ring-1 ring-ink-200"
        >
          <h2 id="invite-heading" className="text-base font-semibold text-ink-900">
            Invite someone
          </h2>
          <p className="mb-4 text-sm text-ink-500">They get an e-mail with a link to choose a password and sign in.</p>
          <InviteForm />
        </section>
      ) : null}
      <section aria-labelledby="people-heading">
        <h2 id="people-heading" className="mb-3 text-base font-semibold text-ink-900">
          {people.length} {people.length === 1 ? "person" : "people"}
        </h2>
        {controls.setRole ? <UnsavedRolesGuard /> : null}
        <TableFrame
          testId="users-table"
          label="People"
          headings={["Name", "E-mail", "Role", "Status", { label: "Actions", hidden: true }]}
        >
          {people.map((person) => (
            <UserRow key={person.id} person={person} controls={controls} isSelf={person.id === actor.id} />
          ))}
        </TableFrame>
      </section>
      <section aria-labelledby="invitations-heading" className="mt-10">
        <h2 id="invitations-heading" className="mb-3 text-base font-semibold text-ink-900">
          Pending invitations
        </h2>
        <PendingInvitations invitations={invitations} canCancel={mayInvite} />
      </section>
    </>
  );
}
