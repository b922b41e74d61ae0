import "server-only";
// The integrity check's reads (lib/use-cases/integrity-check.ts does the hashing). Three connections share one
// exported snapshot, so the database compares every record with its sealed leaf on two (a share of the leaves each)
// while the leaves stream to the checker on the third, and all see the same log however busy the sealer is meanwhile.
import type { PoolClient } from "pg";
import { pool } from "@/db";
import type { LogLeafKind } from "@/db/schema";
import { LEAF_SOURCES, sha256Of } from "./log-records";
import type { TreeHeadDto } from "./log";

export type RecordProblem = {
  kind: LogLeafKind;
  ref: string;
  leafId: number;
  leafIndex: number | null;
  /** missing: the sealed row is gone; altered: its record no longer hashes to the sealed sha256; time: its time changed. */
  problem: "missing" | "altered" | "time";
};

export type StoredLeaf = {
  leafIndex: number;
  kind: string;
  ref: string;
  entry: string;
  leafHash: Buffer;
  /** The tree's stored level-0 node (what proofs are served from): `leafHash` itself when equal to it, empty when missing. */
  node: Buffer;
};

export type StoredNodeRun = { level: number; first: number; count: number; hashes: Buffer; idx: number[] | null };

export type LogSnapshot = {
  /** Records whose row no longer matches its leaf, in log order, at most `limit` per kind. */
  findRecordProblems(limit: number): Promise<RecordProblem[]>;
  /** Evidence rows with no leaf at all (a trigger dropped or disabled by the database's owner). */
  findUnloggedRows(limit: number): Promise<{ kind: LogLeafKind; ref: string }[]>;
  countRecords(): Promise<Record<LogLeafKind, number>>;
  /** Sealed leaves in index order with their stored level-0 node, in keyset batches. */
  leaves(batch?: number): AsyncGenerator<StoredLeaf[]>;
  /**
   * The stored perfect subtrees above the leaves, by level then index, in runs of up to `run` consecutive indexes
   * with their hashes end to end (32 bytes each): a million subtrees come as a few hundred rows. A run with a gap
   * (a subtree missing) lists its indexes in `idx`; a run without one leaves `idx` null.
   */
  nodes(run?: number): AsyncGenerator<StoredNodeRun>;
  heads(): Promise<TreeHeadDto[]>;
  pending(): Promise<{ count: number; oldest: string | null }>;
};

/**
 * How many connections compare records with their leaves at once, each a share of the leaves (by leaf id): on a
 * million runs the hashing is most of the check, and PostgreSQL's own parallel workers are not planned for it
 * reliably (the hash function is costed as cheap). Two, for the two cores the app is sized for; the streaming of the
 * leaves to this process takes the rest.
 */
const RECORD_CHECKERS = 2;

/**
 * A leaf's sha256 and time, read from its entry by position: an entry is canonical JSON of exactly one form,
 * {"at":"<24 characters>","kind":…,"ref":…,"sha256":"<64 hex>"} (leafEntryBytes), so its fields sit at fixed places
 * (reading it as jsonb took a tenth of the check's database time). An entry of any other form is reported by the
 * checker itself (integrity-check.ts), so a misread field here can add a problem but never hide one.
 */
const ENTRY_SHA256 = "left(right(l.entry, 66), 64)";
const ENTRY_AT = "substr(l.entry, 8, 24)";

export async function withLogSnapshot<T>(work: (snapshot: LogSnapshot) => Promise<T>): Promise<T> {
  const main = await pool.connect();
  const sides: PoolClient[] = [];
  try {
    for (let i = 0; i < RECORD_CHECKERS; i++) sides.push(await pool.connect());
    await main.query("begin isolation level repeatable read read only");
    const { rows } = await main.query<{ id: string }>("select pg_export_snapshot() as id");
    for (const side of sides) {
      await side.query("begin isolation level repeatable read read only");
      await side.query(`set transaction snapshot '${rows[0].id.replace(/'/g, "")}'`);
      // The comparison of records with their leaves joins leaves to rows: with the default 4 MB the hash tables
      // spill to disk in batches.
      await side.query("set local work_mem = '128MB'");
      // Hash joins, never a probe of a table's index per leaf (with LIMIT the planner would otherwise prefer it).
      await side.query("set local enable_nestloop = off");
    }
    return await work(snapshotOn(main, sides));
  } finally {
    await main.query("rollback").catch(() => undefined);
    for (const side of sides) await side.query("rollback").catch(() => undefined);
    main.release();
    for (const side of sides) side.release();
  }
}

function snapshotOn(main: PoolClient, sides: PoolClient[]): LogSnapshot {
  const [side] = sides;
  return {
    async findRecordProblems(limit) {
      const problems: RecordProblem[] = [];
      // `s.id is null`, never `s is null`: a whole-row test builds the row and so fetches every record's TOAST a
      // second time. Rows are matched by their id as text, which is what a leaf's ref holds (a ref in any other
      // spelling matches nothing, and so is reported missing). Each connection takes the leaves whose id leaves its
      // remainder, and so hashes its share of the records; the leaves' positions are joined to the few rows found.
      for (const source of LEAF_SOURCES) {
        const shares = await Promise.all(
          sides.map((client, share) =>
            client.query<{ leaf_id: string; leaf_index: string | null; ref: string; problem: RecordProblem["problem"] }>(
              `select f.id as leaf_id, p.leaf_index, f.ref, f.problem
                 from (select l.id, l.ref,
                              case when s.id is null then 'missing'
                                   when ${ENTRY_SHA256} is distinct from ${sha256Of(source.record)} then 'altered'
                                   else 'time' end as problem
                         from log_leaves l
                         left join ${source.table} s on s.id::text = l.ref
                        where l.kind = $1 and l.id % $3 = $4
                          and (s.id is null
                               or ${ENTRY_SHA256} is distinct from ${sha256Of(source.record)}
                               or ${ENTRY_AT} is distinct from ${source.at})) f
                 left join log_positions p on p.leaf_id = f.id
                order by p.leaf_index nulls last, f.id
                limit $2`,
              [source.kind, limit, sides.length, share],
            ),
          ),
        );
        const rows = shares
          .flatMap((share) => share.rows)
          .map((row) => ({
            kind: source.kind,
            ref: row.ref,
            leafId: Number(row.leaf_id),
            leafIndex: row.leaf_index === null ? null : Number(row.leaf_index),
            problem: row.problem,
          }))
          .sort(
            (a, b) => (a.leafIndex ?? Number.MAX_SAFE_INTEGER) - (b.leafIndex ?? Number.MAX_SAFE_INTEGER) || a.leafId - b.leafId,
          );
        problems.push(...rows.slice(0, limit));
      }
      return problems;
    },
    async findUnloggedRows(limit) {
      const found: { kind: LogLeafKind; ref: string }[] = [];
      for (const source of LEAF_SOURCES) {
        const unlogged = `from ${source.table} s
            where not exists (select 1 from log_leaves l where l.kind = $1 and l.ref = s.id::text)`;
        // Counted first, as a hash anti-join over the whole table (under a second on a million runs); the rows are
        // listed in time order only when there are some (with ORDER BY … LIMIT the planner probes the index once per
        // row instead: 5 s).
        const { rows: count } = await side.query<{ n: number }>(`select count(*)::int as n ${unlogged}`, [source.kind]);
        if (count[0].n === 0) continue;
        const { rows } = await side.query<{ ref: string }>(
          `select s.id::text as ref ${unlogged} order by ${source.time} limit $2`,
          [source.kind, limit],
        );
        found.push(...rows.map((row) => ({ kind: source.kind, ref: row.ref })));
      }
      return found;
    },
    async countRecords() {
      const counts = {} as Record<LogLeafKind, number>;
      for (const source of LEAF_SOURCES) {
        const { rows } = await side.query<{ n: number }>(`select count(*)::int as n from ${source.table}`);
        counts[source.kind] = rows[0].n;
      }
      return counts;
    },
    async *leaves(batch = 50_000) {
      // One cursor over the whole ordered join (a keyset query per batch would plan and scan again each time), rows
      // as arrays. The database compares each level-0 node with the leaf's stored hash and sends it only when they
      // differ, so a second hash per leaf need not be sent and parsed.
      await main.query(`declare gusset_leaves no scroll cursor for
        select p.leaf_index, l.kind, l.ref, l.entry, l.leaf_hash,
               case when n.hash is distinct from l.leaf_hash then coalesce(n.hash, ''::bytea) end
          from log_positions p
          join log_leaves l on l.id = p.leaf_id
          left join log_nodes n on n.level = 0 and n.idx = p.leaf_index
         order by p.leaf_index`);
      try {
        for (;;) {
          const { rows } = await main.query<[string, string, string, string, Buffer, Buffer | null]>({
            text: `fetch ${Number(batch)} from gusset_leaves`,
            rowMode: "array",
          });
          if (rows.length === 0) return;
          yield rows.map(([leafIndex, kind, ref, entry, leafHash, node]) => ({
            leafIndex: Number(leafIndex),
            kind,
            ref,
            entry,
            leafHash,
            node: node ?? leafHash,
          }));
        }
      } finally {
        await main.query("close gusset_leaves");
      }
    },
    async *nodes(run = 4096) {
      // Grouped by level and block of `run` indexes, in the primary key's order: one row and one bytea per block
      // instead of one row per subtree (a third of the check's time in this process, read row by row).
      await main.query(`declare gusset_nodes no scroll cursor for
        select level, min(idx), count(*)::int, string_agg(hash, ''::bytea order by idx),
               case when max(idx) - min(idx) + 1 <> count(*) then array_agg(idx order by idx) end
          from log_nodes
         where level >= 1
         group by level, idx / ${Number(run)}
         order by level, min(idx)`);
      try {
        for (;;) {
          const { rows } = await main.query<[number, string, number, Buffer, string[] | null]>({
            text: "fetch 64 from gusset_nodes",
            rowMode: "array",
          });
          if (rows.length === 0) return;
          for (const [level, first, count, hashes, idx] of rows)
            yield { level, first: Number(first), count, hashes, idx: idx ? idx.map(Number) : null };
        }
      } finally {
        await main.query("close gusset_nodes");
      }
    },
    async heads() {
      const { rows } = await main.query<{
        size: string;
        root_hash: string;
        sealed_at: string;
        signature: string;
        key_fingerprint: string;
      }>("select size, root_hash, sealed_at, signature, key_fingerprint from log_tree_heads order by size");
      return rows.map((row) => ({
        size: Number(row.size),
        rootHash: row.root_hash,
        sealedAt: row.sealed_at,
        signature: row.signature,
        keyFingerprint: row.key_fingerprint,
      }));
    },
    async pending() {
      const { rows } = await main.query<{ count: number; oldest: Date | null }>(
        "select count(*)::int as count, min(l.created_at) as oldest from log_pending p join log_leaves l on l.id = p.leaf_id",
      );
      return { count: rows[0].count, oldest: rows[0].oldest ? new Date(rows[0].oldest).toISOString() : null };
    },
  };
}
