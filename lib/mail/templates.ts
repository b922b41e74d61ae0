// The e-mails Gusset sends. Plain wording, the link on its own line, no tracking, nothing to install.
import { ROLE_LABELS, type Role } from "@/lib/domain/roles";
import type { OutgoingMail } from "./send-mail";

function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function layout(paragraphs: string[], link: { url: string; label: string }, list: string[] = []): string {
  const items = list.length > 0 ? `<ul style="margin:0 0 16px">${list.map((item) => `<li>${item}</li>`).join("")}</ul>` : "";
  const body = paragraphs.map((p) => `<p style="margin:0 0 16px">${escapeHtml(p)}</p>`).join("") + items;
  return `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#1f2933;max-width:560px;margin:24px auto;line-height:1.5">
<p style="font-weight:700;font-size:18px;margin:0 0 24px">Gusset</p>${body}
<p style="margin:24px 0"><a href="${escapeHtml(link.url)}" style="background:#1f5a5f;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">${escapeHtml(link.label)}</a></p>
<p style="margin:0 0 16px;font-size:13px;color:#52606d">Or paste this link into your browser:<br>${escapeHtml(link.url)}</p>
<p style="font-size:13px;color:#52606d">Gusset — your firm's library of calculation standards.</p></body></html>`;
}

export function renderInvitationMail(args: {
  to: string;
  name: string;
  role: Role;
  invitedByName: string;
  firmName: string;
  url: string;
  expiresAt: Date;
}): OutgoingMail {
  const expires = args.expiresAt.toISOString().slice(0, 10);
  const paragraphs = [
    `Hello ${args.name},`,
    `${args.invitedByName} has invited you to ${args.firmName} on Gusset as ${ROLE_LABELS[args.role]}.`,
    `Open the link below to choose your password and sign in. The link works once and expires on ${expires}.`,
    `If you did not expect this invitation, you can ignore this e-mail.`,
  ];
  return {
    to: args.to,
    subject: `You're invited to ${args.firmName} on Gusset`,
    text: `${paragraphs.join("\n\n")}\n\n${args.url}\n\n— Gusset`,
    html: layout(paragraphs, { url: args.url, label: "Accept the invitation" }),
  };
}

export function renderPasswordResetMail(args: { to: string; name: string; url: string }): OutgoingMail {
  const paragraphs = [
    `Hello ${args.name},`,
    `Someone asked to reset the password of your Gusset account. Open the link below to choose a new one. The link works once and expires in one hour.`,
    `Resetting signs you out everywhere. If you did not ask for this, ignore this e-mail: your password stays as it is.`,
  ];
  return {
    to: args.to,
    subject: "Reset your Gusset password",
    text: `${paragraphs.join("\n\n")}\n\n${args.url}\n\n— Gusset`,
    html: layout(paragraphs, { url: args.url, label: "Choose a new password" }),
  };
}

/**
 * The QA witness's copy of each new tree head. Kept outside Gusset (a mailbox the database's owner does not
 * control), these let anyone show later that the log was not rewritten or cut short: every later head must
 * extend every head mailed here.
 */
export function renderWitnessMail(args: {
  to: string;
  firmName: string;
  head: { size: number; rootHash: string; sealedAt: string; signature: string };
  headText: string;
  digest: string;
  keyFingerprint: string;
  url: string;
}): OutgoingMail {
  const paragraphs = [
    `Gusset has sealed ${args.firmName}'s log at ${args.head.size} records.`,
    `Tree head digest (SHA-256 of the head's text): ${args.digest}`,
    `Root hash: ${args.head.rootHash}`,
    `Sealed at: ${args.head.sealedAt}`,
    `Signature (Ed25519, base64): ${args.head.signature}`,
    `Signing key fingerprint (SHA-256 of its SPKI DER): ${args.keyFingerprint}`,
    `Keep this e-mail. The head's text, which the signature is over, is these four lines: ${JSON.stringify(args.headText)}`,
  ];
  return {
    to: args.to,
    subject: `Gusset log head ${args.head.size} · ${args.digest.slice(0, 12)}`,
    text: `${paragraphs.join("\n\n")}\n\n${args.url}\n\n— Gusset`,
    html: layout(paragraphs, { url: args.url, label: "Open the integrity page" }),
  };
}

export type WithdrawalNotice = {
  to: string;
  name: string;
  /** What was withdrawn, in words ("Simply supported steel beam v2"). */
  what: string;
  reason: string;
  withdrawnBy: string;
  successor: string | null;
  reportUrl: string;
  /** The person's own runs on it (as the one who ran them). */
  runs: { jobNumber: string; runId: string; url: string }[];
  /** The jobs the person is responsible engineer of, with how many of their runs used it. */
  jobs: { jobNumber: string; jobName: string; runs: number }[];
};

/** One e-mail per person after a withdrawal: their own runs on what was withdrawn, and the jobs they answer for. */
export function renderWithdrawalNoticeMail(notice: WithdrawalNotice): OutgoingMail {
  const lines: string[] = [];
  if (notice.runs.length > 0) {
    lines.push(`Your runs that used it (${notice.runs.length}):`);
    for (const run of notice.runs) lines.push(`  - job ${run.jobNumber}, run ${run.runId.slice(0, 8)}: ${run.url}`);
  }
  if (notice.jobs.length > 0) {
    lines.push(`Jobs you are responsible engineer of that used it (${notice.jobs.length}):`);
    for (const job of notice.jobs)
      lines.push(`  - ${job.jobNumber} (${job.jobName}): ${job.runs} ${job.runs === 1 ? "run" : "runs"}`);
  }
  const paragraphs = [
    `Hello ${notice.name},`,
    `${notice.withdrawnBy} has withdrawn ${notice.what}. Reason: ${notice.reason}`,
    notice.successor
      ? `The version that replaces it is ${notice.successor}. Results that used the withdrawn one should not be relied on until they are re-run on it and checked again.`
      : `Results that used it should not be relied on until they are reviewed.`,
    ...lines,
    `The impact report lists every affected run, calc revision and job, and what is still open.`,
  ];
  // The HTML lists the same runs and jobs, each run a link; every value is escaped.
  const html = layout(
    paragraphs.filter((p) => !p.startsWith("  - ")),
    { url: notice.reportUrl, label: "Open the impact report" },
    [
      ...notice.runs.map(
        (r) => `job ${escapeHtml(r.jobNumber)}, run <a href="${escapeHtml(r.url)}">${escapeHtml(r.runId.slice(0, 8))}</a>`,
      ),
      ...notice.jobs.map(
        (j) =>
          `responsible engineer of ${escapeHtml(j.jobNumber)} (${escapeHtml(j.jobName)}): ${j.runs} ${j.runs === 1 ? "run" : "runs"}`,
      ),
    ],
  );
  return {
    to: notice.to,
    subject: `Withdrawn: ${notice.what} — your runs and jobs`,
    text: `${paragraphs.join("\n\n")}\n\n${notice.reportUrl}\n\n— Gusset`,
    html,
  };
}
