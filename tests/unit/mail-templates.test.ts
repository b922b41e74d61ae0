// The e-mails say who, what and until when in plain words, carry the link in text and HTML, and
// escape names in the HTML (a name is typed by an admin and could hold markup).
import { describe, expect, it } from "vitest";
import {
  renderInvitationMail,
  renderPasswordResetMail,
  renderWithdrawalNoticeMail,
  renderWitnessMail,
} from "@/lib/mail/templates";
import { treeHeadDigest, treeHeadText } from "@/lib/integrity/tree-head";

describe("invitation e-mail", () => {
  const mail = renderInvitationMail({
    to: "new.person@firm.example",
    name: "Robin <b>Example</b>",
    role: "auditor",
    invitedByName: "Alex Admin",
    firmName: "Example Structural",
    url: "http://127.0.0.1:3000/invite/abc_DEF-123",
    expiresAt: new Date("2030-01-08T12:00:00Z"),
  });

  it("says who invites whom, as what, and until when", () => {
    expect(mail.subject).toBe("You're invited to Example Structural on Gusset");
    expect(mail.text).toContain("Alex Admin has invited you to Example Structural on Gusset as QA auditor.");
    expect(mail.text).toContain("expires on 2030-01-08");
  });

  it("carries the link in both parts and escapes markup in the HTML", () => {
    expect(mail.text).toContain("http://127.0.0.1:3000/invite/abc_DEF-123");
    expect(mail.html).toContain('href="http://127.0.0.1:3000/invite/abc_DEF-123"');
    expect(mail.html).not.toContain("<b>Example</b>");
    expect(mail.html).toContain("Robin &#60;b&#62;Example&#60;/b&#62;");
  });
});

describe("password reset e-mail", () => {
  it("links to the reset page and says what resetting does", () => {
    const mail = renderPasswordResetMail({
      to: "a@firm.example",
      name: "Sam",
      url: "http://127.0.0.1:3000/reset-password?token=t1",
    });
    expect(mail.subject).toBe("Reset your Gusset password");
    expect(mail.text).toContain("http://127.0.0.1:3000/reset-password?token=t1");
    expect(mail.text).toMatch(/signs you out everywhere/);
    expect(mail.html).toContain("reset-password?token=t1");
  });
});

describe("the QA witness's e-mail of a tree head", () => {
  const head = {
    size: 1234,
    rootHash: "ab".repeat(32),
    sealedAt: "2026-12-03T02:38:58.539Z",
    signature: "c2lnbmF0dXJl",
  };
  const headText = treeHeadText(head);
  const mail = renderWitnessMail({
    to: "qa-witness@firm.example",
    firmName: "Example Structural",
    head,
    headText,
    digest: treeHeadDigest(head),
    keyFingerprint: "cd".repeat(32),
    url: "http://127.0.0.1:3000/audit/integrity",
  });

  it("carries the head, its digest and the key's fingerprint, enough to check the head later without Gusset", () => {
    expect(mail.to).toBe("qa-witness@firm.example");
    expect(mail.subject).toBe(`Gusset log head 1234 · ${treeHeadDigest(head).slice(0, 12)}`);
    expect(mail.text).toContain(`Tree head digest (SHA-256 of the head's text): ${treeHeadDigest(head)}`);
    expect(mail.text).toContain(`Root hash: ${"ab".repeat(32)}`);
    expect(mail.text).toContain("Sealed at: 2026-12-03T02:38:58.539Z");
    expect(mail.text).toContain("Signature (Ed25519, base64): c2lnbmF0dXJl");
    expect(mail.text).toContain(`Signing key fingerprint (SHA-256 of its SPKI DER): ${"cd".repeat(32)}`);
    // The four signed lines, with their newlines visible.
    expect(mail.text).toContain(JSON.stringify(`gusset-tree-head/1\n1234\n${"ab".repeat(32)}\n2026-12-03T02:38:58.539Z\n`));
    expect(mail.html).toContain('href="http://127.0.0.1:3000/audit/integrity"');
  });
});

describe("withdrawal notice", () => {
  const mail = renderWithdrawalNoticeMail({
    to: "sam@firm.example",
    name: "Sam",
    what: "Beam <b>v1</b>",
    reason: "The load factor is wrong.",
    withdrawnBy: "Lee Lead",
    successor: "version 2 of beam",
    reportUrl: "http://127.0.0.1:3000/withdrawals/w1",
    runs: [{ jobNumber: "MF-1", runId: "0123456789abcdef", url: "http://127.0.0.1:3000/runs/0123456789abcdef" }],
    jobs: [{ jobNumber: "MF-2", jobName: "Depot <i>east</i>", runs: 3 }],
  });

  it("lists the person's runs and jobs, with the report's link, in both parts", () => {
    expect(mail.subject).toBe("Withdrawn: Beam <b>v1</b> — your runs and jobs");
    expect(mail.text).toContain("Lee Lead has withdrawn Beam <b>v1</b>. Reason: The load factor is wrong.");
    expect(mail.text).toContain("The version that replaces it is version 2 of beam.");
    expect(mail.text).toContain("job MF-1, run 01234567: http://127.0.0.1:3000/runs/0123456789abcdef");
    expect(mail.text).toContain("MF-2 (Depot <i>east</i>): 3 runs");
    expect(mail.text).toContain("http://127.0.0.1:3000/withdrawals/w1");
    expect(mail.html).toContain('<a href="http://127.0.0.1:3000/runs/0123456789abcdef">01234567</a>');
    expect(mail.html).toContain('href="http://127.0.0.1:3000/withdrawals/w1"');
  });

  it("escapes markup in the HTML", () => {
    expect(mail.html).not.toContain("<b>v1</b>");
    expect(mail.html).not.toContain("<i>east</i>");
    expect(mail.html).toContain("Depot &#60;i&#62;east&#60;/i&#62;");
  });
});
