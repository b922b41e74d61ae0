// One audit event as one sentence that says who acted on whom: "Ines Okafor-Lind changed Sam Reed's role
// from Engineer to Standards lead". Shared by the home cards and the audit trail, so both read the same.
// Details come from a jsonb column that older versions wrote too, so every field is read defensively;
// raw ids are never part of a sentence.
import { auditActionLabel } from "./audit-actions";
import { ROLE_LABELS, isRole } from "./roles";

/** What the sentence needs of an event: the stored fields plus the names the query resolved. */
export type AuditSentenceEvent = {
  action: string;
  actorName: string | null;
  actorEmail: string | null;
  /** The stored reference ("user:…", "invitation:…"); only its kind is used. */
  subject: string | null;
  /** The subject's name and e-mail, from the user or invitation the reference points at; null when none is found. */
  subjectName: string | null;
  subjectEmail: string | null;
  details: Record<string, unknown>;
};

/** A person named in a sentence, with the e-mail a page may show beside or under the name. */
export type AuditPerson = { person: string; email: string | null };
export type AuditSentencePart = string | AuditPerson;

function text(value: unknown): string | null {
  return typeof value === "string" && value.length > 0 ? value : null;
}

function count(value: unknown): number | null {
  return typeof value === "number" && Number.isFinite(value) ? value : null;
}

function roleLabel(value: unknown): string | null {
  return isRole(value) ? ROLE_LABELS[value] : text(value);
}

/** A library in a sentence: "the library firm-sections", or "a library" when the event does not say. */
function libraryName(details: Record<string, unknown>): string {
  const slug = text(details.slug);
  return slug ? `the library ${slug}` : "a library";
}

function plural(n: number, one: string, many: string): string {
  return `${n} ${n === 1 ? one : many}`;
}

/** Who acted: their name (with e-mail), the e-mail typed, Gusset itself for the seed, else "Someone". */
export function auditActorOf(event: AuditSentenceEvent): AuditPerson | string {
  if (event.actorName) return { person: event.actorName, email: event.actorEmail };
  if (event.actorEmail) return { person: event.actorEmail, email: null };
  return event.action === "system.seed" ? "Gusset" : "Someone";
}

/** The person or invitation acted on; says plainly when the record it points at is gone. */
export function auditSubjectOf(event: AuditSentenceEvent): AuditPerson | string {
  const recordedEmail = text(event.details.email);
  if (event.subject?.startsWith("invitation:")) {
    const email = event.subjectEmail ?? recordedEmail;
    return email ? { person: email, email: null } : "an unknown invitation";
  }
  if (event.subjectName) return { person: event.subjectName, email: event.subjectEmail };
  if (event.subject === null && recordedEmail) return { person: recordedEmail, email: null };
  return recordedEmail ? `a deleted account (${recordedEmail})` : "an unknown account";
}

/** The account a sign-in or reset was attempted for: the known person, else the e-mail as typed. */
function attemptedAccountOf(event: AuditSentenceEvent): AuditPerson | string {
  if (event.subjectName) return { person: event.subjectName, email: event.subjectEmail };
  if (event.actorName) return { person: event.actorName, email: event.actorEmail };
  return event.actorEmail ? { person: event.actorEmail, email: null } : "an unknown account";
}

const SIGN_IN_REASONS: Record<string, string> = {
  INVALID_EMAIL_OR_PASSWORD: "wrong password",
  ACCOUNT_DEACTIVATED: "the account is deactivated",
  RATE_LIMITED: "too many attempts",
  EMAIL_RATE_LIMITED: "too many requests for this e-mail",
  INVALID_ORIGIN: "sent from a page that is not Gusset's",
  INVALID_TOKEN: "the link was invalid, used or expired",
};

function reasonWords(details: Record<string, unknown>): string | null {
  const reason = text(details.reason);
  if (!reason) return null;
  return SIGN_IN_REASONS[reason] ?? `refused (${reason})`;
}

const JOB_FIELD_WORDS: Readonly<Record<string, string>> = {
  jobNumber: "job number",
  name: "name",
  client: "client",
  site: "site",
  responsibleEngineerId: "responsible engineer",
  status: "status",
};

/** "as issued" (with the bundle that made the run) or "with today's bundle". */
function reproductionMode(mode: unknown): string {
  return mode === "current" ? "with today's bundle" : "as issued";
}

/** The sentence as parts: plain text and the people in it (so a page can style names and show e-mails). */
export function auditSentenceParts(event: AuditSentenceEvent): AuditSentencePart[] {
  const actor = auditActorOf(event);
  const d = event.details;
  switch (event.action) {
    case "system.seed": {
      const firm = text(d.firm);
      const users = count(d.users);
      const jobs = count(d.jobs ?? d.projects);
      const sizes =
        users !== null && jobs !== null ? ` with ${plural(users, "person", "people")} and ${plural(jobs, "job", "jobs")}` : "";
      return [actor, ` set up the demo firm${firm ? ` ${firm}` : ""}${sizes}`];
    }
    case "auth.sign-in":
      return [actor, " signed in"];
    case "auth.sign-in.failed": {
      const why = d.knownUser === false ? "no account has this e-mail" : reasonWords(d);
      return ["Failed sign-in as ", attemptedAccountOf(event), why ? `: ${why}` : ""];
    }
    case "auth.password-reset.requested": {
      const why = d.knownUser === false ? "no account has this e-mail" : reasonWords(d);
      return ["Password reset asked for ", attemptedAccountOf(event), why ? `: ${why}` : ""];
    }
    case "auth.password-reset":
      return [actor, " reset their password"];
    case "auth.password-reset.failed": {
      const why = reasonWords(d);
      return [`A password reset was refused${why ? `: ${why}` : ""}`];
    }
    case "users.invite": {
      const role = roleLabel(d.role);
      const replaced = Array.isArray(d.replacedInvitations) ? d.replacedInvitations.length : 0;
      const cancelled =
        replaced === 0
          ? ""
          : replaced === 1
            ? ", cancelling the earlier invitation"
            : `, cancelling ${replaced} earlier invitations`;
      return [actor, " invited ", auditSubjectOf(event), `${role ? ` as ${role}` : ""}${cancelled}`];
    }
    case "users.set-role": {
      const from = roleLabel(d.from);
      const to = roleLabel(d.to);
      const change = from && to ? ` from ${from} to ${to}` : to ? ` to ${to}` : "";
      return [actor, " changed ", auditSubjectOf(event), `'s role${change}`];
    }
    case "users.deactivate": {
      const ended = count(d.sessionsEnded) ?? 0;
      return [
        actor,
        " deactivated ",
        auditSubjectOf(event),
        ended > 0 ? `, ending ${plural(ended, "open session", "open sessions")}` : "",
      ];
    }
    case "users.reactivate":
      return [actor, " reactivated ", auditSubjectOf(event)];
    case "invitations.accept": {
      const role = roleLabel(d.role);
      return [actor, ` accepted the invitation${role ? ` and joined as ${role}` : ""}`];
    }
    case "invitations.revoke": {
      const role = roleLabel(d.role);
      return [actor, " cancelled the invitation to ", auditSubjectOf(event), role ? ` as ${role}` : ""];
    }
    case "access.refused": {
      const useCase = text(d.useCase);
      const permission = text(d.permission);
      return [actor, ` was refused ${useCase ?? "an action"}${permission ? ` (it needs ${permission})` : ""}`];
    }
    case "invitations.accept.failed": {
      const message = text(d.message);
      return [`An invitation link could not be used${message ? `: ${message}` : ""}`];
    }
    case "standards.create":
      return [actor, ` started a new standard, ${text(d.title) ?? text(d.slug) ?? "untitled"}`];
    case "standards.draft.start":
      return [actor, ` started a draft of ${text(d.slug) ?? "a standard"} from version ${count(d.fromVersion) ?? "?"}`];
    case "standards.draft.save": {
      const problems = count(d.problems) ?? 0;
      return [
        actor,
        ` saved a draft of ${text(d.slug) ?? "a standard"}${problems > 0 ? ` (${plural(problems, "problem", "problems")} left)` : ""}`,
      ];
    }
    case "standards.draft.discard":
      return [actor, ` discarded a draft of ${text(d.slug) ?? "a standard"}`];
    case "standards.attachment.add":
      return [actor, ` attached the hand calculation ${text(d.fileName) ?? "a file"} to ${text(d.slug) ?? "a standard"}`];
    case "standards.draft.submit":
      return [actor, ` submitted ${text(d.slug) ?? "a standard"} for review: “${text(d.changelog) ?? ""}”`];
    case "standards.draft.return": {
      const comments = count(d.comments) ?? 0;
      const author = text(d.authorName);
      return [
        actor,
        ` returned ${author ? `${author}'s ` : "a "}draft of ${text(d.slug) ?? "a standard"}${comments > 0 ? ` with ${plural(comments, "comment", "comments")}` : ""}`,
      ];
    }
    case "standards.publish": {
      const author = text(d.authorName);
      const superseded =
        Array.isArray(d.supersedes) && d.supersedes.length > 0 ? `, superseding version ${d.supersedes.join(", ")}` : "";
      return [
        actor,
        ` approved and published ${text(d.title) ?? text(d.slug) ?? "a standard"} version ${count(d.number) ?? "?"}${author ? ` by ${author}` : ""}${superseded}`,
      ];
    }
    case "standards.withdraw":
      return [
        actor,
        ` withdrew ${text(d.slug) ?? "a standard"} version ${count(d.number) ?? "?"}: ${text(d.reason) ?? "no reason given"}`,
      ];
    case "standards.import":
      return [actor, ` imported ${text(d.slug) ?? "a standard"} version ${count(d.number) ?? "?"} from the starting library`];
    case "libraries.create":
      return [actor, ` started a new library, ${text(d.title) ?? text(d.slug) ?? "untitled"}`];
    case "libraries.draft.start":
      return [actor, ` started a draft of ${libraryName(d)} from version ${count(d.fromVersion) ?? "?"}`];
    case "libraries.draft.save": {
      const problems = count(d.problems) ?? 0;
      return [
        actor,
        ` saved a draft of ${libraryName(d)}${problems > 0 ? ` (${plural(problems, "problem", "problems")} left)` : ""}`,
      ];
    }
    case "libraries.draft.discard":
      return [actor, ` discarded a draft of ${libraryName(d)}`];
    case "libraries.draft.submit":
      return [actor, ` submitted ${libraryName(d)} for review: “${text(d.changelog) ?? ""}”`];
    case "libraries.draft.return": {
      const comments = count(d.comments) ?? 0;
      const author = text(d.authorName);
      return [
        actor,
        ` returned ${author ? `${author}'s ` : "a "}draft of ${libraryName(d)}${comments > 0 ? ` with ${plural(comments, "comment", "comments")}` : ""}`,
      ];
    }
    case "libraries.publish": {
      const author = text(d.authorName);
      const entries = count(d.entries);
      const superseded =
        Array.isArray(d.supersedes) && d.supersedes.length > 0 ? `, superseding version ${d.supersedes.join(", ")}` : "";
      return [
        actor,
        ` approved and published ${text(d.title) ? `the library ${text(d.title)}` : libraryName(d)} version ${count(d.number) ?? "?"}${entries !== null ? ` (${plural(entries, "entry", "entries")})` : ""}${author ? ` by ${author}` : ""}${superseded}`,
      ];
    }
    case "libraries.withdraw":
      return [actor, ` withdrew ${libraryName(d)} version ${count(d.number) ?? "?"}: ${text(d.reason) ?? "no reason given"}`];
    case "libraries.entry.withdraw":
      return [
        actor,
        ` withdrew ${text(d.entryKey) ?? "an entry"} from ${libraryName(d)} version ${count(d.number) ?? "?"}: ${text(d.reason) ?? "no reason given"}`,
      ];
    case "libraries.import":
      return [actor, ` imported ${libraryName(d)} version ${count(d.number) ?? "?"} from the starting library`];
    case "jobs.create":
      return [actor, ` created job ${text(d.jobNumber) ?? "?"}${text(d.name) ? `, ${text(d.name)}` : ""}`];
    case "jobs.update": {
      const changes = d.changes && typeof d.changes === "object" ? Object.keys(d.changes) : [];
      const what = changes.length > 0 ? `: ${changes.map((key) => JOB_FIELD_WORDS[key] ?? key).join(", ")}` : "";
      return [actor, ` changed job ${text(d.jobNumber) ?? "?"}${what}`];
    }
    case "runs.create": {
      const result =
        d.outcome === "failed" ? "it failed in the engine" : d.pass === true ? "every check passes" : "a check fails";
      return [
        actor,
        ` ran ${text(d.slug) ?? "a standard"} version ${count(d.number) ?? "?"} in job ${text(d.jobNumber) ?? "?"}${d.purpose === "remediation" ? " (a remediation re-run)" : ""}: ${result}`,
      ];
    }
    case "runs.reproduce": {
      const differing = count(d.differing) ?? 0;
      const result =
        d.identical === true
          ? "identical"
          : differing > 0
            ? `${plural(differing, "output differs", "outputs differ")}`
            : "the outputs are equal but not byte for byte";
      return [actor, ` reproduced run ${text(d.runId)?.slice(0, 8) ?? "?"} ${reproductionMode(d.mode)}: ${result}`];
    }
    case "runs.reproduce.refused":
      return [
        actor,
        ` could not reproduce run ${text(d.runId)?.slice(0, 8) ?? "?"} ${reproductionMode(d.mode)}: ${text(d.reason) ?? "no reason given"}`,
      ];
    case "runs.sheet.render":
      return [
        actor,
        ` kept the calc sheet of run ${text(d.runId) ?? "?"} as a PDF of ${count(d.pages) ?? "?"} page${d.pages === 1 ? "" : "s"} (sha256 ${text(d.sha256)?.slice(0, 12) ?? "?"}…)`,
      ];
    case "runs.export": {
      const filters = d.filters && typeof d.filters === "object" ? Object.entries(d.filters as Record<string, unknown>) : [];
      const named = filters.map(([key, value]) => `${key} ${text(value) ?? "?"}`).join(", ");
      return [actor, ` exported the run log as CSV${named ? ` (${named})` : ", every run"}`];
    }
    case "jobs.attachment.add":
      return [
        actor,
        ` attached ${text(d.fileName) ?? "a file"} to ${text(d.runId) ? `run ${text(d.runId)} in ` : ""}job ${text(d.jobNumber) ?? "?"}`,
      ];
    case "calcs.create":
      return [actor, ` numbered calc ${text(d.number) ?? "?"} in job ${text(d.jobNumber) ?? "?"}: ${text(d.title) ?? ""}`];
    case "calcs.revision.prepare":
      return [
        actor,
        ` issued ${text(d.calc) ?? "a calc"} rev ${text(d.letter) ?? "?"} for checking${text(d.checkerName) ? ` by ${text(d.checkerName)}` : ""}`,
      ];
    case "calcs.revision.check":
      return [
        actor,
        d.decision === "return"
          ? ` returned ${text(d.calc) ?? "a calc"} rev ${text(d.letter) ?? "?"} with comments`
          : ` checked ${text(d.calc) ?? "a calc"} rev ${text(d.letter) ?? "?"}`,
      ];
    case "calcs.revision.approve":
      return [
        actor,
        ` approved ${text(d.calc) ?? "a calc"} rev ${text(d.letter) ?? "?"}${text(d.reason) ? `, because ${text(d.reason)}` : ""}`,
      ];
    case "withdrawals.outcome": {
      const what =
        d.outcome === "no-action"
          ? `no action needed (${text(d.reason) ?? "no reason given"})`
          : d.outcome === "rerun-checked"
            ? `re-run and re-checked as rev ${text(d.newRevision) ?? "?"}`
            : `drawings revised (${text(d.reference) ?? "no reference"})`;
      return [actor, ` recorded for ${text(d.calc) ?? "a calc"} rev ${text(d.letter) ?? "?"} after a withdrawal: ${what}`];
    }
    case "withdrawals.successor":
      return [
        actor,
        ` named version ${count(d.successor) ?? "?"} as the successor of ${text(d.withdrawn) ?? "a withdrawn version"}`,
      ];
    case "withdrawals.batch.start":
      return [
        actor,
        ` started re-running ${plural(count(d.runs) ?? 0, "run", "runs")} on ${text(d.successor) ?? "the successor"}`,
      ];
    default:
      // A kind this version has no sentence for (a newer or retired one): who, and its label.
      return [actor, `: ${auditActionLabel(event.action)}`];
  }
}

/** The sentence as plain text. */
export function auditSentence(event: AuditSentenceEvent): string {
  return auditSentenceParts(event)
    .map((part) => (typeof part === "string" ? part : part.person))
    .join("");
}
