// The verifiable log (RFC 9162 Merkle tree; hashing and proofs in lib/integrity). Every evidence row — a run, a
// sign-off step, a standard's or a library's version event, an attachment, an audit event — gets a leaf from a
// trigger in the same transaction as the row (drizzle/0013_verifiable_log.sql), so no code path can forget one and
// writers never wait on each other: a leaf is a plain insert. The sealer (lib/data/log.ts, run by the worker) gives
// leaves their index in batches, stores the tree's perfect subtrees and a signed tree head. Every table here but
// log_pending refuses UPDATE, DELETE and TRUNCATE.
import { sql } from "drizzle-orm";
import {
  bigint,
  bigserial,
  check,
  customType,
  index,
  jsonb,
  pgTable,
  primaryKey,
  smallint,
  text,
  timestamp,
  unique,
} from "drizzle-orm/pg-core";

const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => "bytea" });

/** What a leaf seals, one kind per evidence table. */
export const LOG_LEAF_KINDS = ["run", "sign-off", "version-event", "library-event", "attachment", "audit-event"] as const;
export type LogLeafKind = (typeof LOG_LEAF_KINDS)[number];

export const logLeaves = pgTable(
  "log_leaves",
  {
    /** Insert order only; the leaf's place in the tree is log_positions.leaf_index, given by the sealer. */
    id: bigserial("id", { mode: "number" }).primaryKey(),
    kind: text("kind", { enum: LOG_LEAF_KINDS }).notNull(),
    /** The sealed row's id, as text. */
    ref: text("ref").notNull(),
    /** The leaf's entry, canonical JSON {at, kind, ref, sha256}: exactly the bytes the leaf hash is taken over. */
    entry: text("entry").notNull(),
    /** SHA-256(0x00 || entry). */
    leafHash: bytea("leaf_hash").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique("log_leaves_kind_ref_unique").on(t.kind, t.ref),
    check("log_leaves_hash_check", sql`octet_length(${t.leafHash}) = 32`),
    check(
      "log_leaves_kind_check",
      sql`${t.kind} in ('run', 'sign-off', 'version-event', 'library-event', 'attachment', 'audit-event')`,
    ),
  ],
);

/** Leaves not yet in the tree. The sealer deletes what it seals; a row committed late is simply sealed next time. */
export const logPending = pgTable("log_pending", {
  leafId: bigint("leaf_id", { mode: "number" })
    .primaryKey()
    .references(() => logLeaves.id),
});

export const logPositions = pgTable(
  "log_positions",
  {
    leafIndex: bigint("leaf_index", { mode: "number" }).primaryKey(),
    leafId: bigint("leaf_id", { mode: "number" })
      .notNull()
      .references(() => logLeaves.id),
  },
  (t) => [unique("log_positions_leaf_unique").on(t.leafId), check("log_positions_index_check", sql`${t.leafIndex} >= 0`)],
);

/**
 * The hash of every perfect subtree: 2^level leaves from index·2^level (level 0: the leaf hashes). Any proof is
 * made of O(log² n) of these, so serving one reads a few rows instead of the whole log.
 */
export const logNodes = pgTable(
  "log_nodes",
  {
    level: smallint("level").notNull(),
    idx: bigint("idx", { mode: "number" }).notNull(),
    hash: bytea("hash").notNull(),
  },
  (t) => [
    primaryKey({ columns: [t.level, t.idx] }),
    check("log_nodes_hash_check", sql`octet_length(${t.hash}) = 32 and ${t.level} between 0 and 62 and ${t.idx} >= 0`),
  ],
);

export const logTreeHeads = pgTable(
  "log_tree_heads",
  {
    size: bigint("size", { mode: "number" }).primaryKey(),
    /** 64 lowercase hex digits. */
    rootHash: text("root_hash").notNull(),
    /** ISO 8601 UTC with milliseconds, exactly as signed. */
    sealedAt: text("sealed_at").notNull(),
    /** Ed25519 over the head's text (lib/integrity/tree-head.ts), base64. */
    signature: text("signature").notNull(),
    /** SHA-256 of the signing key's SPKI DER, hex. */
    keyFingerprint: text("key_fingerprint").notNull(),
    /** The tree's right edge after this head (lib/integrity/frontier.ts), so the next seal starts from it. */
    frontier: jsonb("frontier").$type<{ size: number; hashes: string[] }>().notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("log_tree_heads_created_idx").on(t.createdAt),
    check("log_tree_heads_root_check", sql`${t.rootHash} ~ '^[0-9a-f]{64}$' and ${t.size} > 0`),
  ],
);
export type LogTreeHeadRow = typeof logTreeHeads.$inferSelect;
