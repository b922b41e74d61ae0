// A standard with two published versions for withdrawal tests: v1 is the starter (a simply supported beam, its one
// verification case M = wL²/8 from AWC Design Aid No. 6 (2005), Fig. 1), v2 renames the load `w` to `q` and adds an
// input `w_add` (a further uniform load, 0 kN/m by default, so the same case holds). Jobs and runs made with the
// real use cases.
import type { Actor } from "@/lib/domain/actor";
import { runUseCase } from "@/lib/use-cases/run";
import { approveAndPublish, createStandard, saveDraft, startDraft, submitDraft } from "@/lib/use-cases/standards";
import { createJob } from "@/lib/use-cases/jobs";
import { createRun } from "@/lib/use-cases/runs";
import { getDraft } from "@/lib/data/standards";
import { createTestUser } from "./people";

let counter = 0;
export const uniqueLabel = (label: string) => `${label}-${Date.now().toString(36)}-${(counter++).toString(36)}`;

/** v2's source from v1's (the starter): `w` renamed `q`, and a new input `w_add` loading the beam too. */
export function secondVersionSource(first: string): string {
  const replaced = first
    .replace("  w:   { label: Uniform load,", "  q:   { label: Uniform load,")
    .replace("default: 6 m, min: 0.5 m, max: 30 m }", "default: 6 m, min: 0.5 m, max: 20 m }")
    .replace(
      "  E:   { label: Young's modulus,",
      "  w_add: { label: Added uniform load, quantity: force-per-length, unit: kN/m, default: 0 kN/m }\n  E:   { label: Young's modulus,",
    )
    .replace(
      "        - { member: beam, direction: global-y, w: -w }",
      "        - { member: beam, direction: global-y, w: -q }\n        - { member: beam, direction: global-y, w: -w_add }",
    )
    .replace("inputs: { w: 10 kN/m, L: 6 m }", "inputs: { q: 10 kN/m, L: 6 m, w_add: 0 kN/m }")
    .replace('<Input name="w" />', '<Input name="q" />');
  if (replaced === first || !replaced.includes("w_add: 0 kN/m") || !replaced.includes("max: 20 m"))
    throw new Error("the starter changed: update secondVersionSource");
  return replaced;
}

async function publish(author: Actor, reviewer: Actor, draftId: string, changelog: string) {
  const { reviewId } = await runUseCase(submitDraft, { actor: author, input: { draftId, changelog } });
  return runUseCase(approveAndPublish, { actor: reviewer, input: { reviewId } });
}

/** Two leads publish v1 and v2 of a new standard; returns its slug and both versions' ids. */
export async function standardWithTwoVersions(label = "withdrawal") {
  const [{ actor: author }, { actor: reviewer }] = await Promise.all([
    createTestUser({ role: "lead", label: `${label}-author` }),
    createTestUser({ role: "lead", label: `${label}-reviewer` }),
  ]);
  const slug = uniqueLabel(label);
  const title = `Withdrawal beam ${slug}`;
  const { draftId } = await runUseCase(createStandard, { actor: author, input: { slug, title } });
  const v1 = await publish(author, reviewer, draftId, "First version.");
  const { draftId: next } = await runUseCase(startDraft, { actor: author, input: { versionId: v1.versionId } });
  const source = secondVersionSource((await getDraft(next))!.source);
  await runUseCase(saveDraft, { actor: author, input: { draftId: next, source } });
  const v2 = await publish(author, reviewer, next, "The load is q; an added load w_add.");
  return { author, reviewer, slug, title, v1: v1.versionId, v2: v2.versionId };
}

/** A job with its responsible engineer, made by `by`. */
export async function jobFor(by: Actor, responsible: Actor) {
  const jobNumber = uniqueLabel("WD").toUpperCase().slice(0, 30);
  const { jobId } = await runUseCase(createJob, {
    actor: by,
    input: { jobNumber, name: `Withdrawal job ${jobNumber}`, responsibleEngineerId: responsible.id },
  });
  return { jobId, jobNumber };
}

export async function runIn(actor: Actor, jobId: string, versionId: string, inputs: Record<string, string> = {}) {
  return runUseCase(createRun, { actor, input: { jobId, versionId, inputs, unitSystem: "si" } });
}
