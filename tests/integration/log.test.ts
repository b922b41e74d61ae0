// The verifiable log against the real database: every evidence row gets its leaf from a trigger, the sealer folds
// leaves into the tree under signed heads (a row that commits late is sealed in the next batch, not skipped, and
// twenty writers at once never wait on each other), the proofs served verify under RFC 9162's algorithms and fail
// when a leaf, a proof hash or a head is changed, the log's tables refuse UPDATE and DELETE for the app's role, and
// the integrity check (npm run verify-integrity, on a scratch database the test owns) names a record the database's
// owner changed behind the app's back, a forged head, a changed subtree and a row written with the trigger off.
import { createHash } from "node:crypto";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Actor } from "@/lib/domain/actor";
import { AppError } from "@/lib/domain/errors";
import { sealAll } from "@/lib/jobs/sealer";
import { logPublicKeyFromSettings } from "@/lib/jobs/log-keys";
import { fromHex, hashFromHex, leafHash, verifyConsistency, verifyInclusion } from "@/lib/integrity/merkle";
import { leafEntryBytes, treeHeadDigest, treeHeadText, verifyTreeHead } from "@/lib/integrity/tree-head";
import {
  readConsistencyProof,
  readInclusionProof,
  readLogStatus,
  runIntegrityCheck,
  type InclusionView,
} from "@/lib/use-cases/log";
import { runUseCase } from "@/lib/use-cases/run";
import { testEnv } from "../support/env";
import { createTestUser } from "./helpers/people";
import { scratchDatabase, withClient } from "./helpers/scratch-database";

const INSUFFICIENT_PRIVILEGE = "42501";

let auditor: Actor;
let engineer: Actor;

beforeAll(async () => {
  auditor = (await createTestUser({ role: "auditor" })).actor;
  engineer = (await createTestUser({ role: "engineer" })).actor;
});

/** Writes one audit event as the app's role on its own connection, committed; returns its id. */
async function writeEvent(client: pg.Client, label: string): Promise<string> {
  const { rows } = await client.query<{ id: string }>(
    `insert into audit_events (action, details) values ('access.refused', $1) returning id::text`,
    [JSON.stringify({ useCase: `log-test ${label}`, permission: "none" })],
  );
  return rows[0].id;
}

async function appClient(): Promise<pg.Client> {
  const client = new pg.Client({ connectionString: testEnv.databaseUrl });
  await client.connect();
  return client;
}

/** Seals until the record's leaf is in a head (the worker's sealer may hold the lock for a moment). */
async function sealedProof(ref: string, actor: Actor = auditor): Promise<Extract<InclusionView, { sealed: true }>> {
  const deadline = Date.now() + 15_000;
  for (;;) {
    await sealAll();
    const view = await runUseCase(readInclusionProof, { actor, input: { kind: "audit-event", ref } });
    if (view.sealed) return view;
    if (Date.now() > deadline) throw new Error(`audit event ${ref} was not sealed within 15 s`);
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}

describe("leaves", () => {
  it("are written by the database for each evidence row, with the canonical entry and RFC 9162 leaf hash", async () => {
    const client = await appClient();
    try {
      const id = await writeEvent(client, "leaf");
      const { rows } = await client.query<{ entry: string; leaf_hash: Buffer; record: string; at: string }>(
        `select l.entry, l.leaf_hash,
                jsonb_build_object('id', e.id, 'actor_id', e.actor_id, 'actor_email', e.actor_email, 'action', e.action,
                  'subject', e.subject, 'details', e.details, 'ip_address', e.ip_address,
                  'occurred_at', to_char(e.occurred_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"'))::text as record,
                to_char(e.occurred_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') as at
           from log_leaves l join audit_events e on e.id::text = l.ref
          where l.kind = 'audit-event' and l.ref = $1`,
        [id],
      );
      expect(rows).toHaveLength(1);
      const [{ entry, leaf_hash, record, at }] = rows;
      const sha256 = createHash("sha256").update(record, "utf8").digest("hex");
      // The entry the trigger wrote is byte for byte the one lib/integrity builds (RFC 8785: keys sorted, no spaces).
      expect(entry).toBe(new TextDecoder().decode(leafEntryBytes({ kind: "audit-event", ref: id, sha256, at })));
      // RFC 9162 §2.1.1: the leaf hash is SHA-256(0x00 || entry).
      const expected = createHash("sha256")
        .update(Buffer.from([0]))
        .update(entry, "utf8")
        .digest();
      expect(leaf_hash.toString("hex")).toBe(expected.toString("hex"));
    } finally {
      await client.end();
    }
  });

  it("are never serialised: twenty writers hold their transactions open at once and all commit", async () => {
    const writers = await Promise.all(Array.from({ length: 20 }, () => appClient()));
    try {
      let arrived = 0;
      let release!: () => void;
      const everyoneIn = new Promise<void>((resolve) => (release = resolve));
      const timeout = new Promise<never>((_, reject) =>
        setTimeout(() => reject(new Error(`only ${arrived} of 20 writers got their leaf in: the log serialised them`)), 10_000),
      );
      const ids = await Promise.race([
        Promise.all(
          writers.map(async (client, i) => {
            await client.query("begin");
            const id = await writeEvent(client, `writer ${i}`);
            // Every writer has written its row and its leaf before any commits: a lock held until commit would stop here.
            if (++arrived === 20) release();
            await everyoneIn;
            await client.query("commit");
            return id;
          }),
        ),
        timeout,
      ]);
      expect(new Set(ids).size).toBe(20);
      for (const id of ids) expect((await sealedProof(id)).sealed).toBe(true);
    } finally {
      await Promise.all(
        writers.map((client) =>
          client
            .query("rollback")
            .catch(() => undefined)
            .then(() => client.end()),
        ),
      );
    }
  });

  it("are sealed in a later batch when their transaction commits after a newer leaf was sealed", async () => {
    const [late, early] = [await appClient(), await appClient()];
    try {
      await late.query("begin");
      const lateId = await writeEvent(late, "late"); // the lower leaf id, not yet committed
      const earlyId = await writeEvent(early, "early"); // committed at once
      const earlyProof = await sealedProof(earlyId);
      const unseen = await runUseCase(readInclusionProof, { actor: auditor, input: { kind: "audit-event", ref: lateId } }).catch(
        (error: unknown) => error,
      );
      expect(unseen).toBeInstanceOf(AppError); // not visible to the sealer (or anyone) before it commits
      await late.query("commit");
      const lateProof = await sealedProof(lateId);
      expect(lateProof.leaf.leafId).toBeLessThan(earlyProof.leaf.leafId);
      expect(lateProof.leaf.leafIndex).toBeGreaterThan(earlyProof.leaf.leafIndex);
    } finally {
      await late.query("rollback").catch(() => undefined);
      await Promise.all([late.end(), early.end()]);
    }
  });
});

describe("proofs", () => {
  it("an inclusion proof verifies against its signed head, and fails when the leaf, a proof hash, the index or the root is changed", async () => {
    const client = await appClient();
    let ref: string;
    try {
      ref = await writeEvent(client, "inclusion");
      await writeEvent(client, "inclusion, a neighbour"); // so the tree has more than one leaf around it
    } finally {
      await client.end();
    }
    const view = await sealedProof(ref, engineer); // anyone in the firm may check a proof
    const { leaf, head, proof } = view;
    const hashes = proof.map((hex) => hashFromHex(hex));
    const root = hashFromHex(head.rootHash);
    const ownLeafHash = leafHash(new TextEncoder().encode(leaf.entry));
    expect(Buffer.from(ownLeafHash).toString("hex")).toBe(leaf.leafHash);
    expect(verifyInclusion(leaf.leafIndex, head.size, ownLeafHash, hashes, root)).toBe(true);

    const { pem } = logPublicKeyFromSettings();
    expect(verifyTreeHead(head, head.signature, pem)).toBe(true);
    expect(head.text).toBe(treeHeadText(head));
    expect(head.digest).toBe(treeHeadDigest(head));

    const flipped = (bytes: Uint8Array) => bytes.map((byte, i) => (i === 0 ? byte ^ 1 : byte));
    const otherEntry = leafHash(new TextEncoder().encode(leaf.entry.replace(ref, `${ref}0`)));
    expect(verifyInclusion(leaf.leafIndex, head.size, otherEntry, hashes, root)).toBe(false);
    if (hashes.length > 0) {
      expect(verifyInclusion(leaf.leafIndex, head.size, ownLeafHash, [flipped(hashes[0]), ...hashes.slice(1)], root)).toBe(false);
    }
    expect(verifyInclusion(leaf.leafIndex, head.size, ownLeafHash, hashes, flipped(root))).toBe(false);
    if (head.size > 1) {
      const otherIndex = leaf.leafIndex === 0 ? 1 : leaf.leafIndex - 1;
      expect(verifyInclusion(otherIndex, head.size, ownLeafHash, hashes, root)).toBe(false);
    }
  });

  it("a head with a changed signature, size, root or time is refused by the log's public key", async () => {
    const status = await runUseCase(readLogStatus, { actor: auditor, input: {} });
    const head = status.latestHead!;
    const { pem } = status.publicKeyPem ? { pem: status.publicKeyPem } : logPublicKeyFromSettings();
    expect(verifyTreeHead(head, head.signature, pem)).toBe(true);
    const signature = Buffer.from(head.signature, "base64");
    signature[10] ^= 1;
    expect(verifyTreeHead(head, signature.toString("base64"), pem)).toBe(false);
    expect(verifyTreeHead({ ...head, size: head.size + 1 }, head.signature, pem)).toBe(false);
    expect(verifyTreeHead({ ...head, rootHash: "0".repeat(64) }, head.signature, pem)).toBe(false);
    expect(verifyTreeHead({ ...head, sealedAt: "2020-01-01T00:00:00.000Z" }, head.signature, pem)).toBe(false);
  });

  it("a consistency proof shows a later head extends an earlier one, and fails when either root or a hash is changed", async () => {
    const client = await appClient();
    let first: string;
    let second: string;
    try {
      first = await writeEvent(client, "consistency 1");
      const older = (await sealedProof(first)).head;
      second = await writeEvent(client, "consistency 2");
      await writeEvent(client, "consistency 3");
      const newer = (await sealedProof(second)).head;
      expect(newer.size).toBeGreaterThan(older.size);
      const { proof, from, to } = await runUseCase(readConsistencyProof, {
        actor: auditor,
        input: { from: String(older.size), to: String(newer.size) },
      });
      const hashes = proof.map((hex) => hashFromHex(hex));
      const [oldRoot, newRoot] = [hashFromHex(from.rootHash), hashFromHex(to.rootHash)];
      expect(verifyConsistency(from.size, to.size, oldRoot, newRoot, hashes)).toBe(true);
      expect(verifyConsistency(from.size, to.size, fromHex("00".repeat(32)), newRoot, hashes)).toBe(false);
      expect(verifyConsistency(from.size, to.size, oldRoot, fromHex("00".repeat(32)), hashes)).toBe(false);
      const changed = hashes.map((hash, i) =>
        i === hashes.length - 1 ? hash.map((byte, j) => (j === 0 ? byte ^ 1 : byte)) : hash,
      );
      expect(verifyConsistency(from.size, to.size, oldRoot, newRoot, changed)).toBe(false);
    } finally {
      await client.end();
    }
  });

  it("refuses a proof request it cannot answer, with a message", async () => {
    const ask = (input: Record<string, unknown>) =>
      runUseCase(readInclusionProof, { actor: auditor, input }).then(
        () => null,
        (error: AppError) => [error.code, error.message],
      );
    expect(await ask({ kind: "audit-event", ref: "999999999999" })).toEqual([
      "not-found",
      "The log holds no audit-event with id 999999999999.",
    ]);
    expect((await ask({ kind: "spreadsheet", ref: "1" }))?.[0]).toBe("invalid-input");
    expect(await ask({ kind: "audit-event", ref: "1", size: "0" })).toEqual(expect.arrayContaining(["invalid-input"]));
    const consistency = await runUseCase(readConsistencyProof, { actor: auditor, input: { from: "5", to: "3" } }).catch(
      (error: AppError) => error.code,
    );
    expect(consistency).toBe("invalid-input");
  });
});

describe("the log's tables", () => {
  it("refuse UPDATE and DELETE for the app's role; only the sealer's queue of waiting leaves may be deleted from", async () => {
    const client = await appClient();
    const attempt = async (sql: string) => {
      await client.query("begin");
      try {
        await client.query(sql);
        return "allowed";
      } catch (error) {
        return (error as pg.DatabaseError).code;
      } finally {
        await client.query("rollback");
      }
    };
    try {
      const columns = { log_leaves: "kind", log_positions: "leaf_index", log_nodes: "level", log_tree_heads: "root_hash" };
      for (const [table, column] of Object.entries(columns)) {
        expect(await attempt(`update ${table} set ${column} = ${column}`), table).toBe(INSUFFICIENT_PRIVILEGE);
        expect(await attempt(`delete from ${table}`), table).toBe(INSUFFICIENT_PRIVILEGE);
        expect(await attempt(`truncate ${table}`), table).toBe(INSUFFICIENT_PRIVILEGE);
      }
      expect(await attempt("delete from log_pending where false")).toBe("allowed");
    } finally {
      await client.end();
    }
  });
});

describe("the integrity check", () => {
  it("finds nothing wrong with the test database's log, and is audited", async () => {
    await sealAll();
    const report = await runUseCase(runIntegrityCheck, { actor: auditor, input: {} });
    expect(report.problems).toEqual([]);
    expect(report.ok).toBe(true);
    expect(report.leaves).toBeGreaterThan(0);
    expect(report.heads).toBeGreaterThan(0);
    expect(report.latestHead!.size).toBeLessThanOrEqual(report.leaves);
  });

  it("is refused to an engineer", async () => {
    const refused = await runUseCase(runIntegrityCheck, { actor: engineer, input: {} }).catch((error: AppError) => error.code);
    expect(refused).toBe("forbidden");
  });

  describe("on a database whose owner changed records behind the app's back", () => {
    const scratch = scratchDatabase("integrity");
    const ids: string[] = [];
    const asApp = <T>(work: (client: pg.Client) => Promise<T>) => withClient(scratch.url, work);
    const asOwner = <T>(work: (client: pg.Client) => Promise<T>) => withClient(scratch.ownerUrl, work);
    const script = (file: string) => scratch.runScript(file, ["--conditions=react-server"]);
    const verify = () => {
      const result = script("scripts/verify-integrity.ts");
      return { code: result.status, out: `${result.stdout}${result.stderr}` };
    };

    beforeAll(async () => {
      await scratch.create();
      const migrated = scratch.runScript("scripts/migrate.ts");
      expect(migrated.status, migrated.stderr).toBe(0);
      await asApp(async (client) => {
        for (let i = 0; i < 6; i++) ids.push(await writeEvent(client as pg.Client, `scratch ${i}`));
      });
      const sealed = script("tests/support/seal-log.ts");
      expect(sealed.status, sealed.stderr).toBe(0);
    }, 120_000);

    afterAll(() => scratch.drop());

    it("passes while nothing has been touched", () => {
      const { code, out } = verify();
      expect(out).toContain("OK: every record matches its leaf");
      expect(code).toBe(0);
    });

    it("names the records the owner changed, the first in the log first", async () => {
      // Two neighbouring leaves: the check shares the leaves out among its connections by leaf id, so these two are
      // compared on different ones, and still come back in log order.
      await asOwner(async (client) => {
        await client.query("alter table audit_events disable trigger audit_events_no_update_delete");
        await client.query(`update audit_events set details = '{"useCase": "rewritten", "permission": "none"}' where id = $1`, [
          ids[3],
        ]);
        await client.query(`update audit_events set details = '{"useCase": "rewritten", "permission": "none"}' where id = $1`, [
          ids[2],
        ]);
        await client.query("alter table audit_events enable trigger audit_events_no_update_delete");
      });
      const { code, out } = verify();
      expect(code).toBe(1);
      const problems = out.split("\n").filter((line) => line.startsWith("  - "));
      expect(problems[0]).toContain(`audit-event ${ids[2]}: the row no longer hashes to the sha256 its leaf sealed`);
      expect(problems[1]).toContain(`audit-event ${ids[3]}: the row no longer hashes to the sha256 its leaf sealed`);
    });

    it("names a stored subtree that was changed, a forged head and a row written with the log's trigger off", async () => {
      await asOwner(async (client) => {
        await client.query("alter table log_nodes disable trigger log_nodes_no_update_delete");
        await client.query("update log_nodes set hash = decode(repeat('ab', 32), 'hex') where level = 1 and idx = 0");
        // A gap among the stored subtrees: the ones either side of it are still compared one by one.
        await client.query("delete from log_nodes where level = 1 and idx = 1");
        // A leaf's own stored node (level 0), which the check compares with the leaf's hash in the database.
        await client.query("update log_nodes set hash = decode(repeat('ba', 32), 'hex') where level = 0 and idx = 3");
        await client.query("alter table log_nodes enable trigger log_nodes_no_update_delete");
        const { rows } = await client.query<{ size: string }>("select max(size) as size from log_tree_heads");
        await client.query(
          `insert into log_tree_heads (size, root_hash, sealed_at, signature, key_fingerprint, frontier)
           values ($1, repeat('cd', 32), '2026-01-01T00:00:00.000Z', $2, repeat('ef', 32), '{"size": 0, "hashes": []}')`,
          [Number(rows[0].size) + 1, Buffer.alloc(64, 7).toString("base64")],
        );
        await client.query("alter table audit_events disable trigger audit_events_log");
        await client.query(`insert into audit_events (action, details) values ('access.refused', '{}')`);
        await client.query("alter table audit_events enable trigger audit_events_log");
      });
      const { code, out } = verify();
      expect(code).toBe(1);
      expect(out).toContain(
        "the stored subtree at level 1, index 0 (served in proofs) differs from the one rebuilt from the leaves",
      );
      expect(out).toContain("[leaf 3] the tree's stored leaf node differs from the leaf's hash");
      expect(out).toContain("1 of the tree's stored subtrees are missing");
      expect(out).not.toContain("level 1, index 2");
      expect(out).toMatch(/the tree head of size \d+ names key efefefefefefefef…, not the log's key/);
      expect(out).toMatch(/the tree head of size \d+ is larger than the \d+ sealed leaves/);
      expect(out).toMatch(/audit-event \d+ has no leaf in the log/);
    });
  });
});
