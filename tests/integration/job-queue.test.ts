// The job queue: a job queued inside a transaction reaches the worker only when that transaction commits,
// and never when it rolls back. The worker is the one `npm test` starts (scripts/worker.ts); the mail goes
// to the fake SMTP. "Not yet" is proven without sleeping: while the first transaction is still open, a
// second mail is queued and committed on its own, and once that one has arrived the first has not.
import PgBoss from "pg-boss";
import { describe, expect, it } from "vitest";
import { pool } from "@/db";
import { runInTransaction } from "@/lib/data/transaction";
import { enqueueJob } from "@/lib/jobs/enqueue";
import { JOB_SCHEMA, QUEUES } from "@/lib/jobs/queues";
import { listMessages, waitForMessage } from "../support/mailbox";
import { uniqueEmail } from "./helpers/people";

function probeMail(to: string, subject: string) {
  return { to, subject, text: `${subject}\n`, html: `<p>${subject}</p>` };
}

describe("jobs queued in a transaction", () => {
  it("are sent only after the transaction commits", async () => {
    const inside = uniqueEmail("queued-inside");
    const beside = uniqueEmail("queued-beside");
    let sawInsideBeforeCommit: boolean | null = null;
    await runInTransaction(async () => {
      await enqueueJob("mail.send", probeMail(inside, "Queued inside an open transaction"));
      // Committed at once on a pool connection of its own, outside the open transaction.
      await enqueueOutside(probeMail(beside, "Queued beside it"));
      await waitForMessage({ to: beside });
      sawInsideBeforeCommit = (await listMessages()).some((m) => m.to.includes(inside));
    });
    expect(sawInsideBeforeCommit).toBe(false);
    const sent = await waitForMessage({ to: inside });
    expect(sent.subject).toBe("Queued inside an open transaction");
  });

  it("are never sent when the transaction rolls back", async () => {
    const rolledBack = uniqueEmail("rolled-back");
    const after = uniqueEmail("after-rollback");
    await expect(
      runInTransaction(async () => {
        await enqueueJob("mail.send", probeMail(rolledBack, "Rolled back"));
        throw new Error("the change failed after queuing its mail");
      }),
    ).rejects.toThrow("the change failed after queuing its mail");
    // A later job on the same queue is sent; by then the rolled-back one would have been too.
    await enqueueJob("mail.send", probeMail(after, "Sent after the rollback"));
    await waitForMessage({ to: after });
    expect((await listMessages()).filter((m) => m.to.includes(rolledBack))).toEqual([]);
  });
});

/** Queues on the pool, bypassing the open transaction that enqueueJob would join. */
async function enqueueOutside(mail: ReturnType<typeof probeMail>): Promise<void> {
  const sender = new PgBoss({ db: { executeSql: (text, values) => pool.query(text, values) }, schema: JOB_SCHEMA });
  expect(await sender.send("mail.send", mail, QUEUES["mail.send"])).toMatch(/^[0-9a-f-]{36}$/);
}
