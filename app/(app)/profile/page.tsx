import type { Metadata } from "next";
import { requirePageActor } from "@/lib/auth/session";
import { ROLE_LABELS, ROLE_SUMMARIES } from "@/lib/domain/roles";
import { supportedTimeZones } from "@/lib/domain/schemas/profile";
import { runUseCase } from "@/lib/use-cases/run";
import { readProfile } from "@/lib/use-cases/profile";
import { PageHeader } from "@/components/ui/page-header";
import { ChangePasswordForm } from "./_components/change-password-form";
import { TimeZoneForm } from "./_components/time-zone-form";
import { DisplayUnitsForm } from "./_components/display-units-form";

export const metadata: Metadata = { title: "Profile" };

function Section({ title, lead, children, testId }: { title: string; lead?: string; children: React.ReactNode; testId: string }) {
  return (
    <section
      className="rounded-plate bg-paper-raised p-5 shadow-sheet ring-1 ring-ink-200 sm:p-6"
      aria-labelledby={`${testId}-heading`}
      data-testid={testId}
    >
      <h2 id={`${testId}-heading`} className="text-base font-semibold text-ink-950">
        {title}
      </h2>
      {lead ? <p className="mt-1 text-sm text-ink-700">{lead}</p> : null}
      <div className="mt-5">{children}</div>
    </section>
  );
}

// Every signed-in role has a profile. Name, e-mail and role are shown, not edited here: the role is an
// admin's decision, and the name and e-mail came with the invitation.
export default async function ProfilePage() {
  const actor = await requirePageActor(undefined, { next: "/profile" });
  const profile = await runUseCase(readProfile, { actor, input: {} });

  return (
    <>
      <PageHeader
        title="Profile"
        lead="Your account in Gusset: who you are here, your password and how times are shown to you."
      />
      <div className="grid max-w-3xl gap-6">
        <Section title="Your details" testId="profile-details">
          <dl className="grid gap-x-4 gap-y-1 text-sm sm:grid-cols-[8rem_minmax(0,1fr)] sm:gap-y-4">
            <dt className="text-ink-700">Name</dt>
            <dd className="mb-3 font-medium break-words text-ink-950 sm:mb-0" data-testid="profile-name">
              {profile.name}
            </dd>
            <dt className="text-ink-700">E-mail</dt>
            <dd className="mb-3 break-all text-ink-950 sm:mb-0" data-testid="profile-email">
              {profile.email}
            </dd>
            <dt className="text-ink-700">Role</dt>
            <dd>
              <span className="font-medium text-plate-800" data-testid="profile-role">
                {ROLE_LABELS[profile.role]}
              </span>
              <span className="block text-ink-700">{ROLE_SUMMARIES[profile.role]}</span>
              <span className="mt-1 block text-ink-700">
                Roles are set by an administrator of your firm; ask one if yours should change.
              </span>
            </dd>
          </dl>
        </Section>
        <Section
          title="Password"
          lead="Changing it signs you out of Gusset everywhere else — other browsers and devices — and keeps you signed in here."
          testId="profile-password"
        >
          <ChangePasswordForm />
        </Section>
        <Section
          title="Time zone"
          lead="Dates and times in Gusset are shown in this time zone. Stored records keep UTC, whatever you choose."
          testId="profile-time-zone"
        >
          <TimeZoneForm current={profile.timeZone} zones={supportedTimeZones()} />
        </Section>
        <Section
          title="Units"
          lead="Run results are shown in these units, converted from the SI values every run stores; calc sheets print in the standard's own units. The records themselves never change."
          testId="profile-units"
        >
          <DisplayUnitsForm current={profile.displayUnits} />
        </Section>
      </div>
    </>
  );
}
