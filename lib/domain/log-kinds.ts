// What each kind of leaf in the verifiable log seals, in people's words (db/schema/log.ts LOG_LEAF_KINDS).
export const LOG_LEAF_KIND_LABELS = {
  run: "Run",
  "sign-off": "Sign-off step",
  "version-event": "Standard version event",
  "library-event": "Library version event",
  attachment: "Attachment",
  "audit-event": "Audit event",
} as const;
