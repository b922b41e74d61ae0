import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { runUseCase } from "@/lib/use-cases/run";
import { readWithdrawals } from "@/lib/use-cases/withdrawals";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { TableFrame } from "@/components/ui/table";
import { LocalTime } from "@/components/local-time";

export const metadata: Metadata = { title: "Withdrawals" };

const SUBJECT_WORDS = {
  "standard-version": "Standard version",
  "library-version": "Library version",
  "library-entry": "Library entry",
} as const;

/**
 * Every withdrawal, newest first, each leading to its impact report: the runs, calcs, jobs and people it touched and
 * what is still open. Read by whoever reads runs, as the reports themselves are.
 */
export default async function WithdrawalsPage() {
  const actor = await requirePageActor("runs.read", { next: "/withdrawals" });
  const withdrawals = await runUseCase(readWithdrawals, { actor, input: {} });
  return (
    <>
      <PageHeader
        title="Withdrawals"
        lead="Standard versions and library entries taken out of use, newest first. Each impact report lists every run, calc revision, job and person that used what was withdrawn, and which issued calcs are still open."
      />
      {withdrawals.length === 0 ? (
        <EmptyState title="Nothing has been withdrawn">
          When a standards lead withdraws a published version or a library entry, it is listed here with its impact report.
        </EmptyState>
      ) : (
        <TableFrame headings={["Withdrawn", "What", "When", "By", "Reason"]} testId="withdrawals" label="Withdrawals">
          {withdrawals.map((withdrawal) => (
            <tr key={withdrawal.id} className="align-top" data-testid="withdrawal-row">
              <td className="px-4 py-2.5">
                <Link href={`/withdrawals/${withdrawal.id}`} className="font-medium text-plate-700 hover:underline">
                  {withdrawal.label}
                </Link>
              </td>
              <td className="px-4 py-2.5 whitespace-nowrap text-ink-700">{SUBJECT_WORDS[withdrawal.subject]}</td>
              <td className="px-4 py-2.5 whitespace-nowrap text-ink-700">
                <LocalTime iso={withdrawal.occurredAt} />
              </td>
              <td className="px-4 py-2.5 whitespace-nowrap text-ink-700">{withdrawal.actorName ?? "—"}</td>
              <td className="min-w-64 px-4 py-2.5 text-ink-700">{withdrawal.reason}</td>
            </tr>
          ))}
        </TableFrame>
      )}
    </>
  );
}
