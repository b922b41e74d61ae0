// A record's seal in the verifiable log, as a person checks it: its leaf entry and hash, its place in the tree, the
// signed tree head that holds it, and the inclusion proof between them — everything needed to check it by hand (the
// README says how) or, on screen, in this browser. On a calc sheet it prints without the button.
import type { InclusionView } from "@/lib/use-cases/log";
import { SealCheck } from "./seal-check";

function Row({ label, children, testId }: { label: string; children: React.ReactNode; testId?: string }) {
  return (
    <div className="grid gap-1 py-1.5 sm:grid-cols-[11rem_1fr] sm:gap-3">
      <dt className="text-ink-500">{label}</dt>
      <dd className="min-w-0 font-mono text-[0.8rem] break-all text-ink-900" data-testid={testId}>
        {children}
      </dd>
    </div>
  );
}

export function SealPanel({
  view,
  publicKeyPem,
  fingerprint,
  printable = false,
}: {
  view: InclusionView;
  publicKeyPem: string;
  fingerprint: string;
  printable?: boolean;
}) {
  if (!view.sealed && view.problem) {
    return (
      <p className="text-sm font-medium text-fault-700" data-testid="seal-problem">
        {view.problem}
      </p>
    );
  }
  if (!view.sealed) {
    return (
      <p className="text-sm text-ink-700" data-testid="seal-pending">
        {view.leaf
          ? "This record is in the log and waits for the sealer, which folds new records into the tree every few seconds. Reload to see its proof."
          : "This record has no leaf in the log. Ask an auditor to run the integrity check."}
      </p>
    );
  }
  const { leaf, head, proof } = view;
  return (
    <div data-testid="seal-panel">
      <dl className="divide-y divide-ink-100 text-sm">
        <Row label="Leaf entry" testId="seal-entry">
          {leaf.entry}
        </Row>
        <Row label="Leaf hash" testId="seal-leaf-hash">
          {leaf.leafHash}
        </Row>
        <Row label="Leaf index" testId="seal-leaf-index">
          {leaf.leafIndex}
        </Row>
        <Row label="Tree head" testId="seal-head">
          size {head.size} · root {head.rootHash} · sealed {head.sealedAt}
        </Row>
        <Row label="Head digest" testId="seal-head-digest">
          {head.digest}
        </Row>
        <Row label="Head signature" testId="seal-signature">
          {head.signature}
        </Row>
        <Row label="Log key" testId="seal-key">
          sha256:{fingerprint}
        </Row>
        <Row label={`Inclusion proof (${proof.length})`} testId="seal-proof">
          {proof.length === 0
            ? "none needed: the tree is this one leaf"
            : proof.map((hash, i) => (
                <span key={i} className="block">
                  {hash}
                </span>
              ))}
        </Row>
      </dl>
      {printable ? (
        <p className="mt-2 text-xs text-ink-500">
          To check: SHA-256 of 0x00 followed by the entry is the leaf hash; folding the proof into it by RFC 9162 §2.1.3.2 gives
          the head&apos;s root; the head&apos;s four lines (&quot;gusset-tree-head/1&quot;, size, root, sealed at) carry an
          Ed25519 signature by the log key above. The README of Gusset gives the commands.
        </p>
      ) : (
        <SealCheck
          seal={{
            entry: leaf.entry,
            leafHash: leaf.leafHash,
            leafIndex: leaf.leafIndex,
            treeSize: head.size,
            proof,
            rootHash: head.rootHash,
            headText: head.text,
            signature: head.signature,
            publicKeyPem,
          }}
        />
      )}
    </div>
  );
}
