import "server-only";
// What the standard page and a version's page both load: the version, its standard's history, and the
// reader's time zone.
import type { Actor } from "@/lib/domain/actor";
import { orNotFound } from "../../_components/or-not-found";
import { runUseCase } from "@/lib/use-cases/run";
import { readProfile } from "@/lib/use-cases/profile";
import { readStandard, readVersion } from "@/lib/use-cases/standards";
import { readVersionWithdrawal } from "@/lib/use-cases/withdrawals";

export async function loadVersionPage(actor: Actor, slug: string, number?: number) {
  return orNotFound(async () => {
    const standard = await runUseCase(readStandard, { actor, input: { slug } });
    if (standard.versions.length === 0) return { standard, version: null, timeZone: undefined, withdrawal: null };
    // The standard's page shows the version engineers run: the newest not withdrawn (else the newest).
    const chosen = number ?? (standard.versions.find((v) => v.status !== "withdrawn") ?? standard.versions[0]).number;
    const version = await runUseCase(readVersion, { actor, input: { slug, number: chosen } });
    const timeZone = (await runUseCase(readProfile, { actor, input: {} })).timeZone ?? undefined;
    // Its impact report once withdrawn; the successors a lead may name while it is not.
    const withdrawal = await runUseCase(readVersionWithdrawal, { actor, input: { versionId: version.id } });
    return { standard, version, timeZone, withdrawal };
  });
}

/** One version only (the diff page needs no standard, history or time zone). */
export async function loadVersion(actor: Actor, slug: string, number: number) {
  return orNotFound(() => runUseCase(readVersion, { actor, input: { slug, number } }));
}
