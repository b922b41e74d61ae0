// The background queues: their names, what a job carries, and how often a failed one is retried.
// Jobs live in PostgreSQL (pg-boss, schema `pgboss`, created by the migrations, never by the app), so
// any number of workers on any machines share them, and a job queued inside a transaction exists only
// if that transaction commits.
import type { OutgoingMail } from "@/lib/mail/send-mail";

export const JOB_SCHEMA = "pgboss";

export type JobPayloads = {
  /** One e-mail, rendered when its transaction ran; sent by a worker after commit. */
  "mail.send": OutgoingMail;
  /** One run of a batch re-run after a withdrawal, re-run on the successor (lib/use-cases/batch-reruns.ts). */
  "rerun.item": { batchId: string; originalRunId: string };
};
export type QueueName = keyof JobPayloads;

type QueuePolicy = { retryLimit: number; retryDelay: number; retryBackoff: boolean; expireInSeconds: number };

/**
 * A mail relay that is down for a while should not lose an invitation: five retries with exponential
 * back-off from 5 s cover a few minutes.
 */
export const QUEUES: Record<QueueName, QueuePolicy> = {
  "mail.send": { retryLimit: 5, retryDelay: 5, retryBackoff: true, expireInSeconds: 60 },
  // A worker killed mid-run leaves its jobs active until they expire; pg-boss's default of 15 minutes would stall
  // a batch that long. Each re-run is idempotent (unique batch and original run), so an early retry costs nothing.
  "rerun.item": { retryLimit: 10, retryDelay: 2, retryBackoff: false, expireInSeconds: 45 },
};

/**
 * How a worker takes each queue: jobs fetched at once, handlers running side by side, and how often it asks. A
 * re-run is short (evaluation in the pool) and a batch has hundreds, so it takes a few at a time, twice over.
 */
export const WORKER_POLICY: Record<QueueName, { batchSize: number; concurrency: number; pollingIntervalSeconds?: number }> = {
  // Four sends at once: a burst (a withdrawal's notices, the witness's copy of each tree head, invitations) must not
  // keep a password-reset e-mail waiting behind it. Each send is mostly waiting on the SMTP server.
  "mail.send": { batchSize: 1, concurrency: 4 },
  "rerun.item": { batchSize: 4, concurrency: 2, pollingIntervalSeconds: 0.5 },
};

/**
 * Finished jobs are archived after an hour and deleted a day later: a rendered invitation or reset
 * e-mail holds a link that lets someone set a password.
 */
export const JOB_RETENTION = { archiveCompletedAfterSeconds: 3600, deleteAfterSeconds: 24 * 3600 };

export const QUEUE_NAMES = Object.keys(QUEUES) as QueueName[];
