// The background worker (`npm start` and `npm test` start one; a deployment runs as many as it likes):
// sends queued e-mail with retries, and re-runs the runs of a batch after a withdrawal. Stops on SIGTERM/SIGINT, or when the set-up script that started it
// (--parent-pid) goes away. Run with tsx --conditions=react-server (it loads server-only modules).
import { startWorker } from "@/lib/jobs/worker";
import { processRerunJob } from "@/lib/use-cases/batch-reruns";

const url = process.env.DATABASE_URL;
if (!url) {
  console.error("worker: DATABASE_URL is not set (npm start and npm test set it)");
  process.exit(1);
}

const worker = await startWorker({ connectionString: url, handlers: { "rerun.item": processRerunJob } });

let stopping = false;
async function stop(): Promise<void> {
  if (stopping) return;
  stopping = true;
  const force = setTimeout(() => process.exit(0), 12_000);
  force.unref();
  await worker.stop().catch((error: unknown) => console.error("worker: stopping failed:", error));
  process.exit(0);
}
process.on("SIGINT", () => void stop());
process.on("SIGTERM", () => void stop());

const parentIndex = process.argv.indexOf("--parent-pid");
const parentPid = parentIndex > 0 ? Number(process.argv[parentIndex + 1]) : 0;
if (parentPid > 0) {
  setInterval(() => {
    try {
      process.kill(parentPid, 0);
    } catch {
      void stop(); // the set-up script is gone
    }
  }, 1000).unref();
}
