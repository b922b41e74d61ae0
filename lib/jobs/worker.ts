// The background worker: takes jobs from the PostgreSQL queue and does the slow work (sending e-mail)
// outside any request and any transaction. Started by `npm start` and `npm test` (scripts/worker.ts);
// several can run on several machines, pg-boss hands each job to one of them.
import PgBoss from "pg-boss";
import { sendMail } from "@/lib/mail/send-mail";
import { serverEnv } from "@/lib/server-env";
import { sealAll } from "./sealer";
import { JOB_RETENTION, JOB_SCHEMA, QUEUE_NAMES, WORKER_POLICY, type JobPayloads, type QueueName } from "./queues";

type Handlers = { [Q in QueueName]: (data: JobPayloads[Q]) => Promise<unknown> };

/** Handlers that need layers above this one (a re-run runs a use case) are handed in by scripts/worker.ts. */
export type ExternalHandlers = Omit<Handlers, "mail.send">;

const OWN_HANDLERS = {
  "mail.send": (mail: JobPayloads["mail.send"]) => sendMail(mail),
};

export type RunningWorker = { stop(): Promise<void> };

/** Connects, checks the queue schema exists (the app never creates it) and starts every handler. */
export async function startWorker({
  connectionString,
  handlers,
  pollingIntervalSeconds = 1,
  sealIntervalMs,
  log = console,
}: {
  connectionString: string;
  handlers: ExternalHandlers;
  pollingIntervalSeconds?: number;
  /** How often the log is sealed; GUSSET_SEAL_INTERVAL_MS by default. */
  sealIntervalMs?: number;
  log?: Pick<Console, "info" | "error">;
}): Promise<RunningWorker> {
  const all: Handlers = { ...OWN_HANDLERS, ...handlers };
  // Maintenance (which fails, and so retries, jobs whose worker died) every 10 s rather than pg-boss's 2 minutes,
  // so a short expiry (lib/jobs/queues.ts) is acted on soon after it passes.
  const boss = new PgBoss({
    connectionString,
    schema: JOB_SCHEMA,
    migrate: false,
    schedule: false,
    max: 6,
    maintenanceIntervalSeconds: 10,
    ...JOB_RETENTION,
  });
  boss.on("error", (error) => log.error("[gusset-worker] queue error:", error));
  await boss.start();
  for (const name of QUEUE_NAMES) {
    const policy = WORKER_POLICY[name];
    const handle = all[name] as (data: JobPayloads[typeof name]) => Promise<unknown>;
    for (let i = 0; i < policy.concurrency; i++)
      await boss.work<JobPayloads[typeof name]>(
        name,
        { pollingIntervalSeconds: policy.pollingIntervalSeconds ?? pollingIntervalSeconds, batchSize: policy.batchSize },
        async (jobs) => {
          // One at a time: a throw hands every job of this fetch back for retry, and each is safe to do twice.
          for (const job of jobs) {
            try {
              await handle(job.data);
            } catch (error) {
              log.error(`[gusset-worker] ${name} job ${job.id} failed (it will be retried):`, error);
              throw error; // pg-boss marks it for retry
            }
          }
        },
      );
  }
  log.info(`[gusset-worker] working on ${QUEUE_NAMES.join(", ")}`);
  const sealer = startSealer(sealIntervalMs ?? serverEnv().GUSSET_SEAL_INTERVAL_MS, log);
  return {
    stop: async () => {
      await sealer.stop();
      await boss.stop({ graceful: true, timeout: 10_000 });
    },
  };
}

/**
 * Seals the log every `intervalMs` (lib/jobs/sealer.ts), one round at a time. Several workers may each run one:
 * an advisory lock lets one seal while the others' rounds find the lock taken and wait for the next tick.
 */
function startSealer(intervalMs: number, log: Pick<Console, "info" | "error">): { stop(): Promise<void> } {
  let round: Promise<void> = Promise.resolve();
  let stopped = false;
  const tick = () => {
    round = sealAll()
      .then((heads) => {
        const last = heads.at(-1);
        if (last) log.info(`[gusset-worker] sealed the log at ${last.size} leaves (${heads.length} head(s))`);
      })
      .catch((error: unknown) => log.error("[gusset-worker] sealing failed (it will be tried again):", error))
      .finally(() => {
        if (!stopped) timer = setTimeout(tick, intervalMs);
      });
  };
  let timer = setTimeout(tick, 0);
  return {
    stop: async () => {
      stopped = true;
      clearTimeout(timer);
      await round;
    },
  };
}
