// Every kind of audit event, with the details it carries. A new kind needs its details type and its
// label here; a missing label is a compile error, and recordAuditEvent() accepts only these.
import type { Role } from "./roles";

type Nothing = Record<string, never>;

export type AuditDetails = {
  /** `projects` is how seeds before the jobs reshaping counted jobs; read either. */
  "system.seed": { firm: string; users: number; jobs?: number; projects?: number };
  "auth.sign-in": Nothing;
  /** reason: better-auth's error code (INVALID_EMAIL_OR_PASSWORD, ACCOUNT_DEACTIVATED, …) or RATE_LIMITED. */
  "auth.sign-in.failed": { reason: string; knownUser: boolean };
  "auth.password-reset.requested": { reason?: string; knownUser: boolean };
  "auth.password-reset": Nothing;
  "auth.password-reset.failed": { reason: string };
  "users.invite": { email: string; role: Role; replacedInvitations: string[] };
  "users.set-role": { email: string; from: Role; to: Role };
  "users.deactivate": { email: string; sessionsEnded: number };
  "users.reactivate": { email: string };
  "invitations.accept": { role: Role; invitedById: string | null };
  "invitations.revoke": { email: string; role: Role };
  /** A signed-in person asked for something their role does not allow; useCase names what. */
  "access.refused": { useCase: string; permission: string };
  /** An invitation link was used but not accepted; reason is the error code, message what the person saw. */
  "invitations.accept.failed": { reason: string; message: string };
  /** A person changed their own password on the profile page; their other sessions were ended. */
  "profile.change-password": { sessionsEnded: number };
  /** reason: "wrong-current-password" or "rate-limited". */
  "profile.change-password.failed": { reason: string };
  /** null: the browser's own time zone. */
  "profile.set-time-zone": { from: string | null; to: string | null };
  "profile.set-display-units": { from: "si" | "us"; to: "si" | "us" };
  // The standards' lifecycle. `slug` names the standard; `hash` is the content hash of the source concerned.
  "standards.create": { slug: string; title: string };
  "standards.draft.start": { slug: string; fromVersion: number };
  "standards.draft.save": { slug: string; hash: string | null; problems: number };
  "standards.draft.discard": { slug: string };
  /** A hand calculation attached to a standard, for its verification cases to cite by sha256. */
  "standards.attachment.add": { slug: string; sha256: string; fileName: string; bytes: number };
  "standards.draft.submit": { slug: string; round: number; changelog: string; hash: string };
  "standards.draft.return": { slug: string; round: number; comments: number; authorName: string };
  "standards.publish": {
    slug: string;
    number: number;
    hash: string;
    title: string;
    authorName: string;
    supersedes: number[];
    cases: number;
    /** The library version each `latest` reference was pinned to, with its content hash. */
    libraries?: { library: string; version: number; contentHash: string }[];
  };
  /** successor: the version named to replace it (with the mapping of inputs, on the withdrawal's impact report). */
  "standards.withdraw": { slug: string; number: number; reason: string; successor?: number | null; notified?: number };
  /** A standard imported from content/standards/ by the seed, as a published version. */
  "standards.import": { slug: string; number: number; hash: string };
  // The libraries' lifecycle. `slug` names the library; `hash` is the content hash of the document concerned
  // (null while a saved draft does not pass the check); `kind` is sections, materials or combinations.
  "libraries.create": { slug: string; kind: string; title: string };
  "libraries.draft.start": { slug: string; fromVersion: number };
  "libraries.draft.save": { slug: string; hash: string | null; entries: number | null; problems: number };
  "libraries.draft.discard": { slug: string };
  "libraries.draft.submit": { slug: string; round: number; changelog: string; hash: string; entries: number };
  "libraries.draft.return": { slug: string; round: number; comments: number; authorName: string };
  "libraries.publish": {
    slug: string;
    kind: string;
    number: number;
    hash: string;
    title: string;
    entries: number;
    authorName: string;
    supersedes: number[];
  };
  "libraries.withdraw": { slug: string; number: number; reason: string; replacement?: string | null; notified?: number };
  /** One entry of a version withdrawn (a wrong value); the rest of the version stays in use. */
  "libraries.entry.withdraw": {
    slug: string;
    number: number;
    entryKey: string;
    entryHash: string;
    reason: string;
    replacement?: string | null;
    notified?: number;
  };
  /** A starting library published by the seed (the demo catalogue, content/libraries/). */
  "libraries.import": { slug: string; kind: string; number: number; hash: string; entries: number };
  // Jobs and runs. `jobNumber` names the job; a run's subject is `run:<id>`.
  "jobs.create": { jobNumber: string; name: string };
  /** Only the fields that changed, each as [before, after]. */
  "jobs.update": { jobNumber: string; changes: Record<string, [string | null, string | null]> };
  "runs.create": {
    jobNumber: string;
    slug: string;
    number: number;
    outcome: "succeeded" | "failed";
    pass: boolean | null;
    sha256: string;
    purpose: "design" | "remediation";
  };
  /**
   * A stored run evaluated again: "as-issued" with the evaluation bundle that made it (kept in object storage by its
   * sha256), "current" with today's. identical: every output part of the record came out byte for byte the same;
   * differing: how many outputs (derived values, extracts, check utilisations) differ.
   */
  "runs.reproduce": {
    runId: string;
    mode: "as-issued" | "current";
    bundleSha256: string;
    identical: boolean;
    differing: number;
  };
  /** A reproduction that could not be made: the bundle is not kept, or its bytes no longer match their sha256. */
  "runs.reproduce.refused": { runId: string; mode: "as-issued" | "current"; bundleSha256: string; reason: string };
  /** A state of a run's calc sheet rendered to PDF and kept (its sha256, and the sheet state's). */
  "runs.sheet.render": { runId: string; sha256: string; pages: number; stateSha256: string };
  /**
   * The run log exported as CSV: the filters and order as the address named them (defaults left out), and the instant
   * the export reads up to (runs made later are not in it).
   */
  "runs.export": { filters: Record<string, string>; asOf: string };
  /** A file kept on a job, or on one of its runs (runId). */
  "jobs.attachment.add": { jobNumber: string; runId: string | null; sha256: string; fileName: string; bytes: number };
  // The calc package. `calc` is the calc's number (C-012); `letter` the revision.
  "calcs.create": { jobNumber: string; number: string; title: string };
  "calcs.revision.prepare": { jobNumber: string; calc: string; letter: string; runId: string; checkerName: string };
  "calcs.revision.check": { calc: string; letter: string; decision: "approve" | "return" };
  /** reason: why a failing run, or one on a version no longer current, was approved. */
  "calcs.revision.approve": { calc: string; letter: string; reason: string | null };
  /** The log's integrity check was run: what it covered and the first problem it found, if any. */
  "integrity.check": { ok: boolean; leaves: number; heads: number; problems: number; first: string | null; durationMs: number };
  // After a withdrawal (subject `withdrawal:<id>`).
  /** The signed outcome of an affected calc revision. */
  "withdrawals.outcome": {
    calc: string;
    letter: string;
    outcome: "no-action" | "rerun-checked" | "drawings-revised";
    reason: string | null;
    newRevision: string | null;
    reference: string | null;
  };
  /** The successor of a withdrawn version named (or named again) after the withdrawal, with its mapping. */
  "withdrawals.successor": { withdrawn: string; successor: number };
  /** A batch re-run of every affected run on the successor, queued. */
  "withdrawals.batch.start": { batchId: string; runs: number; successor: string };
};

export type AuditAction = keyof AuditDetails;

export const AUDIT_ACTION_LABELS: Record<AuditAction, string> = {
  "system.seed": "Created the demo firm",
  "auth.sign-in": "Signed in",
  "auth.sign-in.failed": "Failed sign-in",
  "auth.password-reset.requested": "Asked for a password reset",
  "auth.password-reset": "Reset password",
  "auth.password-reset.failed": "Failed password reset",
  "users.invite": "Invited a person",
  "users.set-role": "Changed a role",
  "users.deactivate": "Deactivated an account",
  "users.reactivate": "Reactivated an account",
  "invitations.accept": "Accepted an invitation",
  "invitations.revoke": "Cancelled an invitation",
  "access.refused": "Was refused an action",
  "invitations.accept.failed": "Failed to accept an invitation",
  "profile.change-password": "Changed their password",
  "profile.change-password.failed": "Failed to change their password",
  "profile.set-time-zone": "Set their time zone",
  "profile.set-display-units": "Chose the units results are shown in",
  "standards.create": "Started a new standard",
  "standards.draft.start": "Started a draft from a version",
  "standards.draft.save": "Saved a draft",
  "standards.draft.discard": "Discarded a draft",
  "standards.attachment.add": "Attached a hand calculation",
  "standards.draft.submit": "Submitted a draft for review",
  "standards.draft.return": "Returned a draft with comments",
  "standards.publish": "Approved and published a version",
  "standards.withdraw": "Withdrew a version",
  "standards.import": "Imported a starting standard",
  "libraries.create": "Started a new library",
  "libraries.draft.start": "Started a library draft from a version",
  "libraries.draft.save": "Saved a library draft",
  "libraries.draft.discard": "Discarded a library draft",
  "libraries.draft.submit": "Submitted a library draft for review",
  "libraries.draft.return": "Returned a library draft with comments",
  "libraries.publish": "Approved and published a library version",
  "libraries.withdraw": "Withdrew a library version",
  "libraries.entry.withdraw": "Withdrew a library entry",
  "libraries.import": "Imported a starting library",
  "jobs.create": "Created a job",
  "jobs.update": "Changed a job",
  "runs.create": "Ran a standard",
  "runs.reproduce": "Reproduced a run",
  "runs.reproduce.refused": "Could not reproduce a run",
  "runs.sheet.render": "Kept a calc sheet PDF",
  "runs.export": "Exported the run log",
  "jobs.attachment.add": "Attached a file to a job",
  "calcs.create": "Numbered a calc",
  "calcs.revision.prepare": "Issued a calc revision for checking",
  "calcs.revision.check": "Checked a calc revision",
  "calcs.revision.approve": "Approved a calc revision",
  "integrity.check": "Ran the integrity check",
  "withdrawals.outcome": "Recorded the outcome of a withdrawal for a calc",
  "withdrawals.successor": "Named the successor of a withdrawn version",
  "withdrawals.batch.start": "Started a batch re-run after a withdrawal",
};

export function isAuditAction(value: string): value is AuditAction {
  return Object.hasOwn(AUDIT_ACTION_LABELS, value);
}

/**
 * Sign-ins and failed sign-ins: most of the trail by count, so lists hide them unless asked for (or unless
 * one of them is the action filtered on). A sign-out, once recorded, belongs here too.
 */
export const SIGN_IN_ACTIONS: readonly AuditAction[] = ["auth.sign-in", "auth.sign-in.failed"];

/** The label for a stored action; an action written by an older version keeps its key as its label. */
export function auditActionLabel(action: string): string {
  return isAuditAction(action) ? AUDIT_ACTION_LABELS[action] : action;
}

type EventOf<A extends AuditAction> = {
  action: A;
  /** Omitted where the kind carries nothing. */
  details: AuditDetails[A];
  subject?: string | null;
  actorId?: string | null;
  actorEmail?: string | null;
  ipAddress?: string | null;
};

/** One audit event to write: the action decides the shape of its details. */
export type AuditEventInput = { [A in AuditAction]: EventOf<A> }[AuditAction];
