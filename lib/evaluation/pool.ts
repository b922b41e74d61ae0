import "server-only";
/**
 * Standards are compiled, evaluated and verified on the server in worker threads that run the evaluation
 * bundle (scripts/build-evaluation-bundle.mjs), never on the request's own thread: an expression or a
 * repetition that runs too long or fills the heap costs one worker, which is terminated and replaced, and the
 * caller gets a failure it can show. The server stays responsive and its memory bounded.
 *
 * Workers start when first needed and are reused; a task waits in a bounded queue while all are busy. The
 * bundle is found at run time through its manifest under the working directory (public/evaluation), never by
 * a path fixed when Next built the server, so the server runs whichever bundle the build step wrote beside it.
 */
import { createHash } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { Worker } from "node:worker_threads";
import {
  READY_MESSAGE,
  type EvaluationRequest,
  type EvaluationResponse,
  type EvaluationTask,
  type TaskResults,
  type TestHookRequest,
} from "./protocol";
import type { LibraryEntries } from "@/lib/standards/library-inputs";

export interface EvaluationPoolOptions {
  /** Worker threads at most; default os.availableParallelism(), at most 2. */
  readonly size?: number;
  /** A task's limit once its worker is ready; default 5000 ms. */
  readonly timeoutMs?: number;
  /** Each worker's old-generation heap; default 256 MB. */
  readonly maxOldGenerationSizeMb?: number;
  /**
   * Tasks that may wait while every worker is busy; default 32 (twenty people running at once wait, not fail). Beyond it a task is refused as "busy". A waiting
   * task's own timeout starts when a worker takes it, so the worst wait is about maxQueue ÷ size × timeoutMs.
   */
  readonly maxQueue?: number;
  /** The folder holding manifest.json and the bundle; default public/evaluation under process.cwd(). */
  readonly bundleDir?: string;
  /** A worker that has not loaded the bundle within this is treated as crashed; default 30000 ms. */
  readonly startupTimeoutMs?: number;
  /** Tests only: lets the workers answer the test-hook tasks (protocol.ts, TestHookRequest). */
  readonly testHooks?: boolean;
}

export type PoolFailureReason = "timeout" | "out-of-memory" | "crashed" | "busy";

export interface PoolFailure {
  readonly ok: false;
  readonly reason: PoolFailureReason;
  /** A sentence a person can act on. */
  readonly message: string;
}

export type PoolOutcome<T> = { readonly ok: true; readonly result: T } | PoolFailure;

/** The manifest the build writes beside the bundle. */
export interface EvaluationBundleManifest {
  readonly file: string;
  readonly sha256: string;
  readonly bytes: number;
  readonly gzipBytes: number;
  readonly builtFrom: Readonly<Record<string, string>>;
}

export interface EvaluationPoolStats {
  readonly workers: number;
  readonly busy: number;
  readonly queued: number;
  readonly workersStarted: number;
  /** Terminated after a timeout, out of memory, crashed or closed. */
  readonly workersEnded: number;
  /** From terminate() to the thread's exit, for the last worker ended. */
  readonly lastKillMs: number | null;
}

type Source = { readonly source: string; readonly libraries?: LibraryEntries };
type TaskRequest =
  | ({ readonly task: "compile" } & Source)
  | ({ readonly task: "evaluate"; readonly inputs?: Readonly<Record<string, string | number>> } & Source)
  | ({ readonly task: "verify" } & Source)
  | ({ readonly task: "run"; readonly inputs?: Readonly<Record<string, string | number>> } & Source);

export interface EvaluationPool {
  /** `libraries`: the entries a standard's section and material inputs may name, resolved by the caller. */
  compile(source: string, libraries?: LibraryEntries): Promise<PoolOutcome<TaskResults["compile"]>>;
  evaluate(
    source: string,
    inputs?: Readonly<Record<string, string | number>>,
    libraries?: LibraryEntries,
  ): Promise<PoolOutcome<TaskResults["evaluate"]>>;
  verify(source: string, libraries?: LibraryEntries): Promise<PoolOutcome<TaskResults["verify"]>>;
  /** As evaluate, plus the engine's result as canonical JSON: what a stored run keeps. */
  run(
    source: string,
    inputs?: Readonly<Record<string, string | number>>,
    libraries?: LibraryEntries,
  ): Promise<PoolOutcome<TaskResults["run"]>>;
  /** Tests only, and only with `testHooks`: a task that spins, fills the heap or ends the thread. */
  runTestHook(task: TestHookRequest["task"]): Promise<PoolOutcome<unknown>>;
  /** The bundle the workers run (read and checked against its sha256 on first use). */
  bundle(): EvaluationBundleManifest;
  /** The bundle's bytes, read again and checked against its sha256: what is kept to reproduce runs "as issued". */
  bundleBytes(): Promise<Uint8Array>;
  stats(): EvaluationPoolStats;
  /** Terminates every worker; waiting tasks fail as "crashed". */
  close(): Promise<void>;
}

export const DEFAULT_EVALUATION_DIR = path.join("public", "evaluation");

export class EvaluationBundleMissingError extends Error {
  constructor(detail: string) {
    super(
      `The evaluation bundle is not available (${detail}). Build it with \`npm run build:evaluation\` ` +
        "(npm start and npm test build it), and start the server from the checkout's folder.",
    );
    this.name = "EvaluationBundleMissingError";
  }
}

/** Reads the manifest and checks that the bundle's bytes are the ones it names. */
export function readEvaluationBundle(bundleDir: string): { manifest: EvaluationBundleManifest; file: string } {
  const manifestPath = path.join(bundleDir, "manifest.json");
  let manifest: EvaluationBundleManifest;
  try {
    manifest = JSON.parse(fs.readFileSync(manifestPath, "utf8")) as EvaluationBundleManifest;
  } catch {
    throw new EvaluationBundleMissingError(`no readable ${manifestPath}`);
  }
  if (typeof manifest.file !== "string" || !/^evaluation-[0-9a-f]{16}\.js$/.test(manifest.file))
    throw new EvaluationBundleMissingError(`${manifestPath} names no bundle`);
  const file = path.join(bundleDir, manifest.file);
  let bytes: Buffer;
  try {
    bytes = fs.readFileSync(file);
  } catch {
    throw new EvaluationBundleMissingError(`${file} is missing`);
  }
  if (createHash("sha256").update(bytes).digest("hex") !== manifest.sha256)
    throw new EvaluationBundleMissingError(`${file} does not match the sha256 in its manifest`);
  return { manifest, file };
}

interface Job {
  readonly message: EvaluationRequest | TestHookRequest;
  readonly resolve: (outcome: PoolOutcome<unknown>) => void;
}

interface Slot {
  readonly worker: Worker;
  ready: boolean;
  retired: boolean;
  job: Job | null;
  timer: NodeJS.Timeout | null;
}

function seconds(ms: number): string {
  return `${Number((ms / 1000).toPrecision(3))} s`;
}

export function createEvaluationPool(options: EvaluationPoolOptions = {}): EvaluationPool {
  const size = Math.max(1, options.size ?? Math.min(os.availableParallelism(), 2));
  const timeoutMs = options.timeoutMs ?? 5_000;
  const memoryMb = options.maxOldGenerationSizeMb ?? 256;
  const maxQueue = options.maxQueue ?? 32;
  const startupTimeoutMs = options.startupTimeoutMs ?? 30_000;
  // Read at run time from the server's folder; the ignore keeps Next's file tracing from copying the whole checkout.
  const bundleDir = path.resolve(/* turbopackIgnore: true */ process.cwd(), options.bundleDir ?? DEFAULT_EVALUATION_DIR);

  let loaded: { manifest: EvaluationBundleManifest; file: string } | null = null;
  const slots: Slot[] = [];
  const queue: Job[] = [];
  let nextId = 0;
  let closed = false;
  let workersStarted = 0;
  let workersEnded = 0;
  let lastKillMs: number | null = null;

  const bundle = () => (loaded ??= readEvaluationBundle(bundleDir));

  const failures = {
    timeout: (): PoolFailure => ({
      ok: false,
      reason: "timeout",
      message:
        `This standard took longer than ${seconds(timeoutMs)} to evaluate, so it was stopped. Reduce its repetition ` +
        "(fewer bays, storeys or members) or simplify its expressions, then try again.",
    }),
    outOfMemory: (): PoolFailure => ({
      ok: false,
      reason: "out-of-memory",
      message:
        `This standard needed more than ${memoryMb} MB of memory to evaluate, so it was stopped. Reduce its repetition ` +
        "(fewer bays, storeys or members), then try again.",
    }),
    crashed: (detail: string): PoolFailure => ({
      ok: false,
      reason: "crashed",
      message: `The evaluation stopped unexpectedly (${detail}). Try again; if it happens again, report it with the standard's version.`,
    }),
  };

  function arm(slot: Slot, ms: number, failure: PoolFailure) {
    if (slot.timer) clearTimeout(slot.timer);
    slot.timer = setTimeout(() => retire(slot, failure), ms);
  }

  /** Ends a worker for good: its task (if any) gets `failure`, and a replacement starts if tasks wait. */
  function retire(slot: Slot, failure: PoolFailure) {
    if (slot.retired) return;
    slot.retired = true;
    if (slot.timer) clearTimeout(slot.timer);
    slots.splice(slots.indexOf(slot), 1);
    const job = slot.job;
    slot.job = null;
    const started = performance.now();
    workersEnded++;
    void slot.worker.terminate().then(() => (lastKillMs = performance.now() - started));
    job?.resolve(failure);
    pump();
  }

  function spawn(): Slot {
    const { file } = bundle();
    const worker = new Worker(file, {
      name: "gusset-evaluation",
      workerData: { testHooks: options.testHooks === true },
      resourceLimits: { maxOldGenerationSizeMb: memoryMb },
    });
    workersStarted++;
    const slot: Slot = { worker, ready: false, retired: false, job: null, timer: null };
    slots.push(slot);
    arm(slot, startupTimeoutMs, failures.crashed(`the evaluation worker did not start within ${seconds(startupTimeoutMs)}`));
    worker.on("message", (data: EvaluationResponse | typeof READY_MESSAGE) => {
      if (slot.retired) return;
      if (data === READY_MESSAGE) {
        slot.ready = true;
        if (slot.timer) clearTimeout(slot.timer);
        slot.timer = null;
        if (slot.job) arm(slot, timeoutMs, failures.timeout());
        else idle(slot);
        return;
      }
      const job = slot.job;
      if (!job || data.id !== job.message.id) return;
      if (slot.timer) clearTimeout(slot.timer);
      slot.timer = null;
      slot.job = null;
      job.resolve(data.ok ? { ok: true, result: data.result } : failures.crashed(data.error));
      idle(slot);
    });
    worker.on("error", (error: Error & { code?: string }) =>
      retire(slot, error.code === "ERR_WORKER_OUT_OF_MEMORY" ? failures.outOfMemory() : failures.crashed(error.message)),
    );
    worker.on("exit", (code) => retire(slot, failures.crashed(`the evaluation worker exited with code ${code}`)));
    return slot;
  }

  function assign(slot: Slot, job: Job) {
    slot.job = job;
    slot.worker.ref(); // a waiting caller keeps the process alive
    slot.worker.postMessage(job.message);
    if (slot.ready) arm(slot, timeoutMs, failures.timeout());
  }

  /** A worker without a task takes the next waiting one, or stops holding the process open. */
  function idle(slot: Slot) {
    const job = queue.shift();
    if (job) assign(slot, job);
    else slot.worker.unref();
  }

  /** After a worker ended: start a replacement for waiting tasks. */
  function pump() {
    while (!closed && queue.length > 0 && slots.length < size) assign(spawn(), queue.shift()!);
  }

  async function run(message: Omit<EvaluationRequest, "id"> | Omit<TestHookRequest, "id">): Promise<PoolOutcome<unknown>> {
    if (closed) return failures.crashed("the evaluation pool was closed");
    bundle(); // a missing bundle is the deployment's fault, not the standard's: the caller gets it as an error
    return new Promise((resolve) => {
      const job: Job = { message: { ...message, id: ++nextId } as EvaluationRequest | TestHookRequest, resolve };
      const free = slots.find((s) => s.job === null);
      if (free) assign(free, job);
      else if (slots.length < size) assign(spawn(), job);
      else if (queue.length < maxQueue) queue.push(job);
      else
        resolve({
          ok: false,
          reason: "busy",
          message: "The server is evaluating too many standards at once. Try again in a few seconds.",
        });
    });
  }

  const typed = <T extends EvaluationTask>(request: TaskRequest & { task: T }) =>
    run(request) as Promise<PoolOutcome<TaskResults[T]>>;

  return {
    compile: (source, libraries) => typed({ task: "compile", source, ...(libraries ? { libraries } : {}) }),
    evaluate: (source, inputs, libraries) =>
      typed({ task: "evaluate", source, ...(inputs ? { inputs } : {}), ...(libraries ? { libraries } : {}) }),
    verify: (source, libraries) => typed({ task: "verify", source, ...(libraries ? { libraries } : {}) }),
    run: (source, inputs, libraries) =>
      typed({ task: "run", source, ...(inputs ? { inputs } : {}), ...(libraries ? { libraries } : {}) }),
    runTestHook: (task) => {
      if (options.testHooks !== true) throw new Error("runTestHook needs a pool created with testHooks (tests only)");
      return run({ task });
    },
    bundle: () => bundle().manifest,
    bundleBytes: async () => {
      const { manifest, file } = bundle();
      const bytes = await fs.promises.readFile(file);
      if (createHash("sha256").update(bytes).digest("hex") !== manifest.sha256)
        throw new EvaluationBundleMissingError(`${file} no longer matches the sha256 in its manifest`);
      return bytes;
    },
    stats: () => ({
      workers: slots.length,
      busy: slots.filter((s) => s.job !== null).length,
      queued: queue.length,
      workersStarted,
      workersEnded,
      lastKillMs,
    }),
    close: async () => {
      closed = true;
      for (const job of queue.splice(0)) job.resolve(failures.crashed("the evaluation pool was closed"));
      await Promise.all(
        [...slots].map((slot) => {
          retire(slot, failures.crashed("the evaluation pool was closed"));
          return slot.worker.terminate();
        }),
      );
    },
  };
}

const SHARED = Symbol.for("gusset.evaluationPool");

/** The server's one pool, with the default settings; kept on globalThis so a reloaded module in development reuses it. */
export function evaluationPool(): EvaluationPool {
  const holder = globalThis as { [SHARED]?: EvaluationPool };
  return (holder[SHARED] ??= createEvaluationPool());
}
