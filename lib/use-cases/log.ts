import "server-only";
// The verifiable log as people and tools read it: tree heads (and their export), a record's inclusion proof, the
// consistency proof between two heads, and the integrity check. Every proof is checked here before it is served
// (a stored subtree that was tampered with fails loudly instead of reaching a calc sheet); the client must still
// check it against a head it trusts — the README says how, with standard tools.
import { LOG_LEAF_KINDS, type LogLeafKind } from "@/db/schema";
import {
  getFirstHeadCovering,
  getHead,
  getLatestHead,
  getLeaf,
  getNodes,
  getPendingSummary,
  listHeads,
  listRecentHeads,
} from "@/lib/data/log";
import type { LeafDto, TreeHeadDto } from "@/lib/data/log";
import { AppError } from "@/lib/domain/errors";
import { runRefSchema } from "@/lib/domain/schemas/jobs";
import { z } from "@/lib/domain/zod";
import { logPublicKeyFromSettings } from "@/lib/jobs/log-keys";
import {
  consistencyProofRanges,
  hashFromHex,
  inclusionProofRanges,
  toHex,
  verifyConsistency,
  verifyInclusion,
} from "@/lib/integrity/merkle";
import { nodesForRanges, subtreeFromStore } from "@/lib/integrity/stored-tree";
import { treeHeadDigest, treeHeadText } from "@/lib/integrity/tree-head";
import { checkLogIntegrity, type IntegrityReport } from "./integrity-check";
import { defineUseCase } from "./use-case";

export type SignedHead = TreeHeadDto & { text: string; digest: string };

export type InclusionView =
  | { sealed: false; leaf: LeafDto | null; problem?: string }
  | { sealed: true; leaf: LeafDto & { leafIndex: number }; head: SignedHead; proof: string[] };

export type LogStatus = {
  publicKeyPem: string;
  fingerprint: string;
  latestHead: SignedHead | null;
  recentHeads: SignedHead[];
  pending: { count: number; oldest: string | null };
};

const signed = (head: TreeHeadDto): SignedHead => ({ ...head, text: treeHeadText(head), digest: treeHeadDigest(head) });

const size = z.coerce
  .number({ error: "Give a tree size as a whole number." })
  .int("Give a tree size as a whole number.")
  .min(1, "A tree size is at least 1.")
  .max(Number.MAX_SAFE_INTEGER, "That tree size is too large.");

/** Reads a tree of `treeSize` leaves' perfect subtrees for the given proof ranges and folds them. */
async function hashesForRanges(ranges: { start: number; end: number }[]): Promise<Uint8Array[]> {
  const nodes = await getNodes(nodesForRanges(ranges));
  const lookup = (level: number, index: number) => nodes.get(`${level}/${index}`);
  try {
    return ranges.map(({ start, end }) => subtreeFromStore(start, end, lookup));
  } catch (error) {
    console.error("[gusset] the log's stored tree is incomplete:", error);
    throw new AppError("internal", "The log's stored tree is incomplete; run the integrity check.");
  }
}

/** The inclusion proof of `leaf` in the tree of `head`, checked before it is returned. */
export async function proveInclusion(leaf: LeafDto & { leafIndex: number }, head: TreeHeadDto): Promise<string[]> {
  const proof = await hashesForRanges(inclusionProofRanges(leaf.leafIndex, head.size));
  if (!verifyInclusion(leaf.leafIndex, head.size, hashFromHex(leaf.leafHash), proof, hashFromHex(head.rootHash))) {
    console.error(`[gusset] the inclusion proof of leaf ${leaf.leafIndex} in head ${head.size} does not verify`);
    throw new AppError("internal", "The log's stored tree does not prove this record; run the integrity check.");
  }
  return proof.map(toHex);
}

/** A record's leaf and, once sealed, its proof against the given head (or the first head that holds it). */
export async function readSeal(kind: LogLeafKind, ref: string, treeSize?: number): Promise<InclusionView> {
  const leaf = await getLeaf(kind, ref);
  if (!leaf || leaf.leafIndex === null) return { sealed: false, leaf };
  const sealedLeaf = { ...leaf, leafIndex: leaf.leafIndex };
  const head = treeSize === undefined ? await getFirstHeadCovering(leaf.leafIndex) : await getHead(treeSize);
  if (treeSize !== undefined && !head) throw new AppError("not-found", `No tree head has size ${treeSize}.`);
  if (!head) return { sealed: false, leaf };
  if (head.size <= leaf.leafIndex) {
    throw new AppError(
      "invalid-input",
      `The tree head of size ${head.size} does not hold this record yet (it is leaf ${leaf.leafIndex}); ask for a later head.`,
    );
  }
  return { sealed: true, leaf: sealedLeaf, head: signed(head), proof: await proveInclusion(sealedLeaf, head) };
}

export type RunSeal = { view: InclusionView; publicKeyPem: string; fingerprint: string };

/** A run's seal as its page and calc sheet show it (the first head that holds it, with the log's key). */
export async function runSealOf(id: string): Promise<RunSeal> {
  const { pem, fingerprint } = logPublicKeyFromSettings();
  // A proof that does not verify is shown as such on the run's page and sheet, never as a page that fails to open.
  const view = await readSeal("run", id).catch(async (error: unknown): Promise<InclusionView> => {
    if (!(error instanceof AppError) || error.code !== "internal") throw error;
    return { sealed: false, leaf: await getLeaf("run", id), problem: error.message };
  });
  return { view, publicKeyPem: pem, fingerprint };
}

/** A run's seal, for its page and calc sheet: whoever may read the run may see (and check) it. */
export const readRunSeal = defineUseCase({
  name: "runs.seal",
  permission: "runs.read",
  input: runRefSchema,
  run: async ({ id }): Promise<RunSeal> => runSealOf(id),
  audit: null,
});

export const readLogStatus = defineUseCase({
  name: "log.status",
  permission: "log.read",
  input: z.object({}),
  run: async (): Promise<LogStatus> => {
    const { pem, fingerprint } = logPublicKeyFromSettings();
    const latest = await getLatestHead();
    return {
      publicKeyPem: pem,
      fingerprint,
      latestHead: latest ? signed(latest) : null,
      recentHeads: (await listRecentHeads(10)).map(signed),
      pending: await getPendingSummary(),
    };
  },
  audit: null,
});

export const readInclusionProof = defineUseCase({
  name: "log.inclusion",
  permission: "log.read",
  input: z.object({
    kind: z.enum(LOG_LEAF_KINDS, { error: `Say which kind of record: ${LOG_LEAF_KINDS.join(", ")}.` }),
    ref: z.string().trim().min(1, "Say which record (its id).").max(100, "That id is too long."),
    size: size.optional(),
  }),
  run: async ({ kind, ref, size: treeSize }): Promise<InclusionView> => {
    const view = await readSeal(kind, ref, treeSize);
    if (!view.leaf) throw new AppError("not-found", `The log holds no ${kind} with id ${ref}.`);
    return view;
  },
  audit: null,
});

export const readConsistencyProof = defineUseCase({
  name: "log.consistency",
  permission: "log.read",
  input: z
    .object({ from: size, to: size })
    .refine(({ from, to }) => from <= to, { message: "The first head must not be larger than the second.", path: ["from"] }),
  run: async ({ from, to }): Promise<{ from: SignedHead; to: SignedHead; proof: string[] }> => {
    const [older, newer] = await Promise.all([getHead(from), getHead(to)]);
    if (!older) throw new AppError("not-found", `No tree head has size ${from}.`);
    if (!newer) throw new AppError("not-found", `No tree head has size ${to}.`);
    const proof = await hashesForRanges(consistencyProofRanges(from, to));
    if (!verifyConsistency(from, to, hashFromHex(older.rootHash), hashFromHex(newer.rootHash), proof)) {
      console.error(`[gusset] the consistency proof from head ${from} to head ${to} does not verify`);
      throw new AppError("internal", "The log's stored tree does not prove these heads consistent; run the integrity check.");
    }
    return { from: signed(older), to: signed(newer), proof: proof.map(toHex) };
  },
  audit: null,
});

/** One page of tree heads, smallest first after `after`: the export streams these. */
export const readTreeHeadsPage = defineUseCase({
  name: "log.heads",
  permission: "log.read",
  input: z.object({
    after: z.coerce.number().int().min(0, "Start after a size of 0 or more.").default(0),
    limit: z.coerce.number().int().min(1).max(5000, "At most 5,000 heads a page.").default(1000),
  }),
  run: async ({ after, limit }): Promise<SignedHead[]> => (await listHeads({ afterSize: after, limit })).map(signed),
  audit: null,
});

export const runIntegrityCheck = defineUseCase({
  name: "integrity.check",
  permission: "integrity.verify",
  input: z.object({}),
  // Minutes of reading for a big log: done before the runner's transaction opens, on its own snapshot.
  prepare: async (): Promise<IntegrityReport> => {
    const { pem, fingerprint } = logPublicKeyFromSettings();
    return checkLogIntegrity({ publicKeyPem: pem, fingerprint });
  },
  run: async (_input, { prepared }) => prepared,
  audit: ({ result }) => ({
    action: "integrity.check",
    subject: result.latestHead ? `log:${result.latestHead.size}` : "log:empty",
    details: {
      ok: result.ok,
      leaves: result.leaves,
      heads: result.heads,
      problems: result.problems.length,
      first: result.problems[0]?.message ?? null,
      durationMs: result.durationMs,
    },
  }),
});
