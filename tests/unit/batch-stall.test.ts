// When the impact report says a batch re-run has stopped moving: runs still to do and nothing finished for three
// minutes (four times a re-run job's 45 s expiry, after which pg-boss gives a killed worker's job to another).
import { describe, expect, it } from "vitest";
import { BATCH_STALL_AFTER_MS, batchStalledFor } from "@/lib/domain/batch-stall";

const started = "2026-12-03T08:00:00.000Z";
const at = (iso: string) => new Date(iso);

describe("batchStalledFor", () => {
  it("is null while re-runs keep finishing", () => {
    const batch = { done: 3, total: 10, startedAt: started, lastFinishedAt: "2026-12-03T08:05:00.000Z" };
    expect(batchStalledFor(batch, at("2026-12-03T08:07:59.999Z"))).toBeNull();
  });

  it("counts from the latest finished re-run once three minutes pass with runs still to do", () => {
    const batch = { done: 3, total: 10, startedAt: started, lastFinishedAt: "2026-12-03T08:05:00.000Z" };
    expect(BATCH_STALL_AFTER_MS).toBe(180_000);
    expect(batchStalledFor(batch, at("2026-12-03T08:08:00.000Z"))).toBe(180_000);
    expect(batchStalledFor(batch, at("2026-12-03T08:15:30.000Z"))).toBe(630_000);
  });

  it("counts from the start when nothing has finished yet", () => {
    const batch = { done: 0, total: 4, startedAt: started, lastFinishedAt: null };
    expect(batchStalledFor(batch, at("2026-12-03T08:02:00.000Z"))).toBeNull();
    expect(batchStalledFor(batch, at("2026-12-03T08:04:00.000Z"))).toBe(240_000);
  });

  it("is null for a finished batch however long ago it ended", () => {
    const batch = { done: 10, total: 10, startedAt: started, lastFinishedAt: "2026-12-03T08:05:00.000Z" };
    expect(batchStalledFor(batch, at("2026-12-04T08:00:00.000Z"))).toBeNull();
  });
});
