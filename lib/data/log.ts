import "server-only";
// The verifiable log's rows (db/schema/log.ts): what the sealer reads and writes, and what proofs are made from.
// Leaves are written by database triggers, never here. Hashing and signing happen in the callers (lib/jobs/sealer.ts,
// lib/use-cases/log.ts) with lib/integrity; this file only moves bytes.
import { and, asc, desc, eq, gt, sql } from "drizzle-orm";
import { logLeaves, logPending, logPositions, logTreeHeads, type LogLeafKind, type LogTreeHeadRow } from "@/db/schema";
import { currentDb } from "./transaction";

/** pg_try_advisory_xact_lock key: one sealer at a time, however many workers run. */
export const SEALER_LOCK = 9162_2291;

export type TreeHeadDto = {
  size: number;
  rootHash: string;
  sealedAt: string;
  signature: string;
  keyFingerprint: string;
};

const headColumns = {
  size: logTreeHeads.size,
  rootHash: logTreeHeads.rootHash,
  sealedAt: logTreeHeads.sealedAt,
  signature: logTreeHeads.signature,
  keyFingerprint: logTreeHeads.keyFingerprint,
};

/** A PostgreSQL array literal of numbers or hex strings (nothing here needs quoting). */
function arrayLiteral(values: readonly (number | string)[]): string {
  return `{${values.join(",")}}`;
}

/** In the current transaction: true when this caller is the one sealer; the lock ends with the transaction. */
export async function tryLockSealer(): Promise<boolean> {
  // A seal never waits long on anything: should a lock be held elsewhere, this round fails (and is logged) and the next
  // one, a few seconds on, tries again, instead of the sealer hanging with the tree unsealed.
  await currentDb().execute(sql`set local lock_timeout = '5s'`);
  await currentDb().execute(sql`set local statement_timeout = '120s'`);
  const result = await currentDb().execute<{ locked: boolean }>(sql`select pg_try_advisory_xact_lock(${SEALER_LOCK}) as locked`);
  return result.rows[0]?.locked === true;
}

/** The newest head with the frontier the next seal continues from. */
export async function getLatestHeadWithFrontier(): Promise<LogTreeHeadRow | null> {
  const [row] = await currentDb().select().from(logTreeHeads).orderBy(desc(logTreeHeads.size)).limit(1);
  return row ?? null;
}

/** Committed leaves waiting for the sealer, oldest insert first. */
export async function listPendingLeaves(limit: number): Promise<{ leafId: number; leafHash: Buffer }[]> {
  return currentDb()
    .select({ leafId: logPending.leafId, leafHash: logLeaves.leafHash })
    .from(logPending)
    .innerJoin(logLeaves, eq(logLeaves.id, logPending.leafId))
    .orderBy(asc(logPending.leafId))
    .limit(limit);
}

/** One seal: the leaves' places, the perfect subtrees they complete, the signed head; the leaves leave the queue. */
export async function insertSeal(seal: {
  positions: { leafIndex: number; leafId: number }[];
  nodes: { level: number; index: number; hash: Uint8Array }[];
  head: TreeHeadDto & { frontier: { size: number; hashes: string[] } };
}): Promise<void> {
  const tx = currentDb();
  const leafIds = seal.positions.map((p) => p.leafId);
  // unnest() over array parameters inserts a batch of thousands in one statement (a VALUES list would need a
  // parameter per cell). Each array goes as one literal parameter: drizzle would spread a JS array into a list.
  const ids = arrayLiteral(leafIds);
  await tx.execute(sql`insert into log_positions (leaf_index, leaf_id)
    select * from unnest(${arrayLiteral(seal.positions.map((p) => p.leafIndex))}::bigint[], ${ids}::bigint[])`);
  await tx.execute(sql`insert into log_nodes (level, idx, hash)
    select level, idx, decode(hash, 'hex') from unnest(${arrayLiteral(seal.nodes.map((n) => n.level))}::smallint[],
      ${arrayLiteral(seal.nodes.map((n) => n.index))}::bigint[],
      ${arrayLiteral(seal.nodes.map((n) => Buffer.from(n.hash).toString("hex")))}::text[]) as t(level, idx, hash)`);
  await tx.insert(logTreeHeads).values(seal.head);
  await tx.execute(sql`delete from log_pending where leaf_id = any(${ids}::bigint[])`);
}

export async function getLatestHead(): Promise<TreeHeadDto | null> {
  const [row] = await currentDb().select(headColumns).from(logTreeHeads).orderBy(desc(logTreeHeads.size)).limit(1);
  return row ?? null;
}

export async function getHead(size: number): Promise<TreeHeadDto | null> {
  const [row] = await currentDb().select(headColumns).from(logTreeHeads).where(eq(logTreeHeads.size, size));
  return row ?? null;
}

/** Heads from the smallest size up (keyset on size): the export, and the integrity check. */
export async function listHeads({ afterSize = 0, limit = 1000 }: { afterSize?: number; limit?: number }): Promise<TreeHeadDto[]> {
  return currentDb()
    .select(headColumns)
    .from(logTreeHeads)
    .where(gt(logTreeHeads.size, afterSize))
    .orderBy(asc(logTreeHeads.size))
    .limit(limit);
}

export async function countHeads(): Promise<number> {
  const [row] = await currentDb()
    .select({ n: sql<number>`count(*)::int` })
    .from(logTreeHeads);
  return row.n;
}

export type LeafDto = {
  leafId: number;
  kind: LogLeafKind;
  ref: string;
  entry: string;
  leafHash: string;
  /** Null until the sealer has given the leaf its place. */
  leafIndex: number | null;
};

/** The leaf sealing one row, with its place in the tree once sealed. */
export async function getLeaf(kind: LogLeafKind, ref: string): Promise<LeafDto | null> {
  const [row] = await currentDb()
    .select({
      leafId: logLeaves.id,
      kind: logLeaves.kind,
      ref: logLeaves.ref,
      entry: logLeaves.entry,
      leafHash: logLeaves.leafHash,
      leafIndex: logPositions.leafIndex,
    })
    .from(logLeaves)
    .leftJoin(logPositions, eq(logPositions.leafId, logLeaves.id))
    .where(and(eq(logLeaves.kind, kind), eq(logLeaves.ref, ref)));
  return row ? { ...row, leafHash: row.leafHash.toString("hex"), leafIndex: row.leafIndex ?? null } : null;
}

/** The first head whose tree holds the leaf at `leafIndex`: the one a calc sheet prints, stable for good. */
export async function getFirstHeadCovering(leafIndex: number): Promise<TreeHeadDto | null> {
  const [row] = await currentDb()
    .select(headColumns)
    .from(logTreeHeads)
    .where(gt(logTreeHeads.size, leafIndex))
    .orderBy(asc(logTreeHeads.size))
    .limit(1);
  return row ?? null;
}

/** The stored perfect subtrees asked for, keyed "level/index". */
export async function getNodes(keys: readonly { level: number; index: number }[]): Promise<Map<string, Uint8Array>> {
  if (keys.length === 0) return new Map();
  const result = await currentDb().execute<{ level: number; idx: string; hash: Buffer }>(sql`
    select n.level, n.idx, n.hash from log_nodes n
      join unnest(${arrayLiteral(keys.map((k) => k.level))}::smallint[], ${arrayLiteral(keys.map((k) => k.index))}::bigint[])
        as want(level, idx)
        on n.level = want.level and n.idx = want.idx`);
  return new Map(result.rows.map((row) => [`${row.level}/${Number(row.idx)}`, new Uint8Array(row.hash)]));
}

/** Leaves waiting for the sealer, and the oldest one's age: what the integrity page reports as "not yet sealed". */
export async function getPendingSummary(): Promise<{ count: number; oldest: string | null }> {
  const result = await currentDb().execute<{ count: number; oldest: Date | null }>(sql`
    select count(*)::int as count, min(l.created_at) as oldest from log_pending p join log_leaves l on l.id = p.leaf_id`);
  const row = result.rows[0];
  return { count: row?.count ?? 0, oldest: row?.oldest ? new Date(row.oldest).toISOString() : null };
}

/** The newest heads first, for the integrity page. */
export async function listRecentHeads(limit = 20): Promise<TreeHeadDto[]> {
  return currentDb().select(headColumns).from(logTreeHeads).orderBy(desc(logTreeHeads.size)).limit(limit);
}
