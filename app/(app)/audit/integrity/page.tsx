import type { Metadata } from "next";
import { requirePageActor } from "@/lib/auth/session";
import { runUseCase } from "@/lib/use-cases/run";
import { readInclusionProof, readLogStatus, type InclusionView } from "@/lib/use-cases/log";
import { LOG_LEAF_KIND_LABELS } from "@/lib/domain/log-kinds";
import { AppError } from "@/lib/domain/errors";
import { PageHeader } from "@/components/ui/page-header";
import { Section } from "@/components/ui/section";
import { TableFrame } from "@/components/ui/table";
import { Notice } from "@/components/ui/notice";
import { buttonClasses } from "@/components/ui/button";
import { SealPanel } from "@/components/integrity/seal-panel";
import { SelectField, TextField } from "@/components/ui/field";
import { IntegrityCheckForm } from "./_components/integrity-check-form";

export const metadata: Metadata = { title: "Integrity" };

const first = (value: string | string[] | undefined) => (Array.isArray(value) ? value[0] : value) ?? "";

export default async function IntegrityPage({ searchParams }: PageProps<"/audit/integrity">) {
  const actor = await requirePageActor("integrity.verify", { next: "/audit/integrity" });
  const status = await runUseCase(readLogStatus, { actor, input: {} });
  const raw = await searchParams;
  const [kind, ref] = [first(raw.kind), first(raw.ref).trim()];
  let lookup: { view: InclusionView } | { error: string } | null = null;
  if (ref) {
    try {
      lookup = { view: await runUseCase(readInclusionProof, { actor, input: { kind: kind || "run", ref } }) };
    } catch (error) {
      if (!(error instanceof AppError)) throw error;
      lookup = { error: error.message };
    }
  }
  const head = status.latestHead;

  return (
    <>
      <PageHeader
        title="Integrity"
        lead="Every run, sign-off, version event, attachment and audit event is a leaf of an append-only Merkle tree (RFC 9162). Every few seconds new leaves are sealed under a tree head signed with the log's key, and each head's digest is e-mailed to the QA witness. The check below rebuilds the tree from the stored records and names the first one that no longer matches."
        actions={
          <a className={buttonClasses("secondary", "sm")} href="/api/log/heads" download data-testid="export-heads">
            Export every tree head
          </a>
        }
      />

      <section aria-labelledby="latest-head" className="rounded-plate bg-paper-raised p-5 shadow-sheet ring-1 ring-ink-200">
        <h2 id="latest-head" className="text-sm font-semibold tracking-wide text-ink-500 uppercase">
          Latest tree head
        </h2>
        {head ? (
          <dl className="mt-2 grid gap-x-6 gap-y-1 text-sm sm:grid-cols-[9rem_1fr]" data-testid="latest-head">
            <dt className="text-ink-500">Records sealed</dt>
            <dd className="font-semibold text-ink-950">{head.size.toLocaleString("en")}</dd>
            <dt className="text-ink-500">Sealed at</dt>
            <dd>{head.sealedAt}</dd>
            <dt className="text-ink-500">Root hash</dt>
            <dd className="font-mono text-[0.8rem] break-all">{head.rootHash}</dd>
            <dt className="text-ink-500">Digest</dt>
            <dd className="font-mono text-[0.8rem] break-all">{head.digest}</dd>
          </dl>
        ) : (
          <p className="mt-2 text-sm text-ink-700">Nothing has been sealed yet.</p>
        )}
        <p className="mt-3 text-sm text-ink-700" data-testid="pending-leaves">
          {status.pending.count === 0
            ? "No record waits for the sealer."
            : `${status.pending.count} new record(s) wait for the sealer (the oldest since ${status.pending.oldest}).`}
        </p>
      </section>

      <Section title="Check the whole log" id="check">
        <p className="mb-3 max-w-2xl text-sm text-ink-700">
          Recomputes every record&apos;s hash, rebuilds the tree, compares it with every stored subtree and signed head, and
          checks each head against the one before. The same check runs from a terminal: <code>npm run verify-integrity</code>.
        </p>
        <IntegrityCheckForm />
      </Section>

      <Section title="Check one record" id="record">
        <form method="get" className="flex flex-wrap items-end gap-3" data-testid="record-lookup">
          <div className="w-56">
            <SelectField id="lookup-kind" name="kind" label="Kind of record" defaultValue={kind || "run"}>
              {Object.entries(LOG_LEAF_KIND_LABELS).map(([value, label]) => (
                <option key={value} value={value}>
                  {label}
                </option>
              ))}
            </SelectField>
          </div>
          <div className="min-w-0 flex-1">
            <TextField id="lookup-ref" name="ref" label="Its id (a run's id, an event's number)" defaultValue={ref} required />
          </div>
          <button type="submit" className={buttonClasses("secondary")}>
            Show its seal
          </button>
        </form>
        <div className="mt-4">
          {lookup && "error" in lookup ? (
            <Notice tone="fault" testId="record-lookup-error">
              {lookup.error}
            </Notice>
          ) : lookup ? (
            <SealPanel view={lookup.view} publicKeyPem={status.publicKeyPem} fingerprint={status.fingerprint} />
          ) : null}
        </div>
      </Section>

      <Section title="The log's public key" id="key">
        <p className="mb-2 text-sm text-ink-700">
          Fingerprint (SHA-256 of the key&apos;s DER):{" "}
          <code className="break-all" data-testid="key-fingerprint">
            {status.fingerprint}
          </code>
          . Keep a copy apart from this server: a head is only as good as the key it is checked with.
        </p>
        <pre className="overflow-x-auto rounded-plate bg-paper-sunk p-3 text-xs" data-testid="public-key">
          {status.publicKeyPem}
        </pre>
      </Section>

      <Section title="Recent tree heads" id="heads">
        {status.recentHeads.length === 0 ? (
          <p className="text-sm text-ink-700">None yet.</p>
        ) : (
          <TableFrame headings={["Size", "Sealed at", "Digest"]} testId="recent-heads" label="Recent tree heads">
            {status.recentHeads.map((row) => (
              <tr key={row.size} className="border-t border-ink-100">
                <td className="px-4 py-2 font-medium">{row.size.toLocaleString("en")}</td>
                <td className="px-4 py-2 whitespace-nowrap">{row.sealedAt}</td>
                <td className="px-4 py-2 font-mono text-xs">{row.digest}</td>
              </tr>
            ))}
          </TableFrame>
        )}
      </Section>
    </>
  );
}
