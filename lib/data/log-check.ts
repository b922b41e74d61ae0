import "server-only";
// The integrity check's reads (lib/use-cases/integrity-check.ts does the hashing). Two connections share one
// exported snapshot, so the database compares every record with its sealed leaf on one while the leaves stream to
// the checker on the other, and both see the same log however busy the sealer is meanwhile.
import type { PoolClient } from "pg";
import { pool } from "@/db";
import type { LogLeafKind } from "@/db/schema";
import { LEAF_SOURCES, refAsId, sha256Of } from "./log-records";
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

export type LogSnapshot = {
  /** Records whose row no longer matches its leaf, in log order, at most `limit` per kind. */
  findRecordProblems(limit: number): Promise<RecordProblem[]>;
  /** Evidence rows with no leaf at all (a trigger dropped or disabled by the database's owner). */
  findUnloggedRows(limit: number): Promise<{ kind: LogLeafKind; ref: string }[]>;
  countRecords(): Promise<Record<LogLeafKind, number>>;
  /** Sealed leaves in index order with their stored level-0 node, in keyset batches. */
  leaves(batch?: number): AsyncGenerator<StoredLeaf[]>;
  /** The stored perfect subtrees above the leaves, by level then index. */
  nodes(batch?: number): AsyncGenerator<{ level: number; idx: number; hash: Buffer }[]>;
  heads(): Promise<TreeHeadDto[]>;
  pending(): Promise<{ count: number; oldest: string | null }>;
};

export async function withLogSnapshot<T>(work: (snapshot: LogSnapshot) => Promise<T>): Promise<T> {
  const main = await pool.connect();
  const side = await pool.connect();
  try {
    await main.query("begin isolation level repeatable read read only");
    const { rows } = await main.query<{ id: string }>("select pg_export_snapshot() as id");
    await side.query("begin isolation level repeatable read read only");
    await side.query(`set transaction snapshot '${rows[0].id.replace(/'/g, "")}'`);
    // The comparison of every record with its leaf joins a million leaves to a million rows: with the default 4 MB
    // the hash tables spill to disk in batches.
    await side.query("set local work_mem = '128MB'");
    return await work(snapshotOn(main, side));
  } finally {
    await main.query("rollback").catch(() => undefined);
    await side.query("rollback").catch(() => undefined);
    main.release();
    side.release();
  }
}

function snapshotOn(main: PoolClient, side: PoolClient): LogSnapshot {
  return {
    async findRecordProblems(limit) {
      const problems: RecordProblem[] = [];
      // `s.id is null`, never `s is null`: a whole-row test builds the row and so fetches every record's TOAST a
      // second time (on a million runs, 95 s instead of 34 s). The leaves' positions are joined to the few rows found
      // only, not to every leaf.
      for (const source of LEAF_SOURCES) {
        const { rows } = await side.query<{
          leaf_id: string;
          leaf_index: string | null;
          ref: string;
          problem: RecordProblem["problem"];
        }>(
          `with found as materialized (
             select l.id, l.ref,
                    case when s.id is null then 'missing'
                         when (l.entry::jsonb ->> 'sha256') is distinct from ${sha256Of(source.record)} then 'altered'
                         else 'time' end as problem
               from log_leaves l
               left join ${source.table} s on s.id = ${refAsId(source, "l.ref")}
              where l.kind = $1
                and (s.id is null
                     or (l.entry::jsonb ->> 'sha256') is distinct from ${sha256Of(source.record)}
                     or (l.entry::jsonb ->> 'at') is distinct from ${source.at}))
           select f.id as leaf_id, p.leaf_index, f.ref, f.problem
             from found f left join log_positions p on p.leaf_id = f.id
            order by p.leaf_index nulls last, f.id
            limit $2`,
          [source.kind, limit],
        );
        for (const row of rows) {
          problems.push({
            kind: source.kind,
            ref: row.ref,
            leafId: Number(row.leaf_id),
            leafIndex: row.leaf_index === null ? null : Number(row.leaf_index),
            problem: row.problem,
          });
        }
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
    async *nodes(batch = 100_000) {
      let after = { level: 0, idx: Number.MAX_SAFE_INTEGER };
      for (;;) {
        const { rows } = await main.query<{ level: number; idx: string; hash: Buffer }>(
          `select level, idx, hash from log_nodes
            where level >= 1 and (level, idx) > ($1::smallint, $2::bigint)
            order by level, idx limit $3`,
          [after.level, after.idx, batch],
        );
        if (rows.length === 0) return;
        yield rows.map((row) => ({ level: row.level, idx: Number(row.idx), hash: row.hash }));
        const last = rows[rows.length - 1];
        after = { level: last.level, idx: Number(last.idx) };
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
