import type { Metadata } from "next";
import { requirePageActor } from "@/lib/auth/session";
import { ROLE_LABELS, ROLE_SUMMARIES, type Role } from "@/lib/domain/roles";
import { runUseCase } from "@/lib/use-cases/run";
import { readProfile } from "@/lib/use-cases/profile";
import { readHome, type HomeSummary } from "@/lib/use-cases/reads";
import { HomeCard } from "./_components/home-card";
import { RecentAuditEvents, RecentJobs } from "./_components/recent-lists";

export const metadata: Metadata = { title: "Home" };

export default async function HomePage() {
  const actor = await requirePageActor(undefined, { next: "/home" });
  const summary = await runUseCase(readHome, { actor, input: {} });
  const timeZone = (await runUseCase(readProfile, { actor, input: {} })).timeZone ?? undefined;
  const mailbox = summary.mailboxEnabled;
  const firstName = actor.name.split(" ")[0];

  return (
    <div data-testid="home" data-role={actor.role}>
      <header className="mb-8">
        <p className="text-sm font-medium text-plate-700" data-testid="home-role">
          {ROLE_LABELS[actor.role]}
        </p>
        <h1 className="mt-1 text-2xl font-semibold tracking-tight text-ink-950" data-testid="page-title">
          Hello, {firstName}
        </h1>
        <p className="mt-2 max-w-2xl text-[0.95rem] text-ink-500">{ROLE_SUMMARIES[actor.role]}</p>
      </header>
      <div className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3">
        <RoleCards role={actor.role} summary={summary} mailbox={mailbox} timeZone={timeZone} />
      </div>
    </div>
  );
}

// What each role sees first. Counts come only from the parts of the summary the server filled in for
// this role; a part missing from the summary is simply not drawn.
function RoleCards({
  role,
  summary,
  mailbox,
  timeZone,
}: {
  role: Role;
  summary: HomeSummary;
  mailbox: boolean;
  timeZone?: string;
}) {
  const { people, jobs, audit } = summary;
  const peopleCard = people ? (
    <HomeCard
      title="People"
      testId="home-people"
      figure={people.active}
      figureLabel={`active · ${people.deactivated} deactivated`}
      href="/admin/users"
      linkLabel={role === "admin" ? "Manage people" : "See people"}
    >
      {people.admins} {people.admins === 1 ? "admin" : "admins"} can invite people and set roles.
    </HomeCard>
  ) : null;
  const invitationsCard =
    people && role === "admin" ? (
      <HomeCard
        title="Pending invitations"
        testId="home-invitations"
        figure={people.pendingInvitations}
        figureLabel="waiting to be accepted"
        href="/admin/users"
        linkLabel="Invite someone"
      >
        Invitation links work once and expire after seven days.
        {mailbox ? " While Gusset runs as a demo, sent e-mails are in the demo mailbox." : null}
      </HomeCard>
    ) : null;
  const jobsCard = jobs ? (
    <HomeCard
      title="Jobs"
      testId="home-jobs"
      figure={jobs.count}
      figureLabel={jobs.count === 1 ? "job on record" : "jobs on record"}
      href="/jobs"
      linkLabel="All jobs"
    >
      <RecentJobs jobs={jobs.recent} />
    </HomeCard>
  ) : null;
  const auditCard = audit ? (
    <HomeCard title="Recent changes" testId="home-audit" href="/audit" linkLabel="Open the audit trail">
      <RecentAuditEvents events={audit.recent} timeZone={timeZone} />
    </HomeCard>
  ) : null;

  switch (role) {
    case "admin":
      return (
        <>
          {peopleCard}
          {invitationsCard}
          {auditCard}
        </>
      );
    case "lead":
      return (
        <>
          <HomeCard title="Standards: drafts and reviews" testId="home-library" coming href="/standards" linkLabel="Standards">
            Your drafts, drafts waiting for your review, and versions you published will be listed here.
          </HomeCard>
          {jobsCard}
          <HomeCard title="Recent runs" testId="home-runs" coming href="/runs" linkLabel="Runs">
            Runs of the versions you maintain, and any affected by a withdrawal, will be listed here.
          </HomeCard>
        </>
      );
    case "engineer":
      return (
        <>
          {jobsCard}
          <HomeCard title="Recent runs" testId="home-runs" coming href="/runs" linkLabel="Runs">
            Your runs and the calc sheets waiting for you to prepare or check will be listed here.
          </HomeCard>
          <HomeCard title="Standards" testId="home-library" coming href="/standards" linkLabel="Standards">
            Published versions of the firm&apos;s standard calcs, ready to run in a job.
          </HomeCard>
        </>
      );
    case "auditor":
      return (
        <>
          {auditCard}
          <HomeCard title="Integrity checks" testId="home-integrity" coming>
            Verifying the hash chain of runs, reproducing a run from its record, and tracing a number to its template version will
            be available here.
          </HomeCard>
          {jobsCard}
          {peopleCard}
        </>
      );
  }
}
