// An audit event in words (lib/domain/audit-sentence.ts), with the people in it stressed and their
// e-mails on hover, for the home card and the audit trail alike.
import { auditSentenceParts, type AuditSentenceEvent } from "@/lib/domain/audit-sentence";

export function AuditSentence({ event }: { event: AuditSentenceEvent }) {
  return (
    <span data-testid="audit-sentence">
      {auditSentenceParts(event).map((part, index) =>
        typeof part === "string" ? (
          part
        ) : (
          <span key={index} className="font-medium text-ink-900" title={part.email ?? undefined}>
            {part.person}
          </span>
        ),
      )}
    </span>
  );
}
