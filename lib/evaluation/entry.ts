/**
 * The evaluation bundle's entry (scripts/build-evaluation-bundle.mjs): one file that runs as a Node worker
 * thread (pool.ts) and as a browser module Worker. It imports no Node builtin statically, so the same bytes
 * load in a browser; in Node it reaches the worker port through a dynamic import left external by the build.
 */
import { READY_MESSAGE, type EvaluationRequest, type EvaluationResponse } from "./protocol";
import { runTask } from "./tasks";
import { libraryEntriesSchema } from "@/lib/standards/library-inputs";

const TASKS: ReadonlySet<string> = new Set<EvaluationRequest["task"]>(["compile", "evaluate", "verify", "run"]);

type NodeProcess = { versions?: { node?: string }; exit(code: number): never };

/** Test-only (see TestHookRequest): ends the thread under a task, as a crash would. */
function runTestHook(task: string): never {
  if (task === "test-exit") (globalThis as { process?: NodeProcess }).process?.exit(3);
  throw new Error(`unknown test task ${JSON.stringify(task)}`);
}

function isInputs(value: unknown): value is Record<string, string | number> {
  if (typeof value !== "object" || value === null || Array.isArray(value)) return false;
  return Object.values(value).every((v) => typeof v === "string" || typeof v === "number");
}

/** The answer to one message; null when it carries no id to answer to. */
function handle(data: unknown, testHooks: boolean): EvaluationResponse | null {
  if (typeof data !== "object" || data === null) return null;
  const { id, task, source, inputs, libraries } = data as Record<string, unknown>;
  if (typeof id !== "number") return null;
  try {
    if (testHooks && typeof task === "string" && task.startsWith("test-")) runTestHook(task);
    if (typeof task !== "string" || !TASKS.has(task)) return { id, ok: false, error: `unknown task ${JSON.stringify(task)}` };
    if (typeof source !== "string") return { id, ok: false, error: "the message has no source text" };
    if (inputs !== undefined && !isInputs(inputs)) return { id, ok: false, error: "inputs must map names to texts or numbers" };
    const entries = libraries === undefined ? undefined : libraryEntriesSchema.safeParse(libraries);
    if (entries && !entries.success) return { id, ok: false, error: "libraries must hold library entries in their checked form" };
    return { id, ok: true, result: runTask({ id, task, source, inputs, libraries: entries?.data } as EvaluationRequest) };
  } catch (error) {
    return { id, ok: false, error: error instanceof Error ? error.message : String(error) };
  }
}

const nodeProcess = (globalThis as { process?: NodeProcess }).process;
if (nodeProcess?.versions?.node) {
  const { parentPort, workerData } = await import("node:worker_threads");
  // Imported outside a worker (a script reading the file), there is nobody to answer.
  if (parentPort) {
    // The thread's name as the operating system shows it (top -H, /proc/<pid>/task/<tid>/comm), so what the evaluation
    // costs can be told from the server's other threads (npm run bench:runs). Linux only; elsewhere it stays unnamed.
    await import("node:fs").then((fs) => fs.writeFileSync("/proc/thread-self/comm", "gusset-eval")).catch(() => undefined);
    const testHooks = (workerData as { testHooks?: unknown } | null)?.testHooks === true;
    parentPort.on("message", (data: unknown) => {
      const response = handle(data, testHooks);
      if (response) parentPort.postMessage(response);
    });
    parentPort.postMessage(READY_MESSAGE);
  }
} else {
  const scope = globalThis as unknown as {
    onmessage: ((event: { data: unknown }) => void) | null;
    postMessage(message: unknown): void;
  };
  scope.onmessage = (event) => {
    const response = handle(event.data, false);
    if (response) scope.postMessage(response);
  };
  scope.postMessage(READY_MESSAGE);
}
