"use client";
// "Check it here": verifies a record's seal in this browser (browser-verify.ts) and says what held.
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { checkSeal, type SealCheckResult, type SealToCheck } from "./browser-verify";

export function SealCheck({ seal }: { seal: SealToCheck }) {
  const [result, setResult] = useState<SealCheckResult | "checking" | "failed" | null>(null);
  const run = async () => {
    setResult("checking");
    try {
      setResult(await checkSeal(seal));
    } catch {
      setResult("failed");
    }
  };
  const verified = typeof result === "object" && result !== null && result.leafHash && result.inclusion && result.signature;
  return (
    <div className="mt-3 flex flex-wrap items-center gap-3" data-testid="seal-check">
      <Button type="button" variant="secondary" size="sm" onClick={run} pending={result === "checking"} pendingLabel="Checking…">
        Check it in this browser
      </Button>
      <p role="status" className="text-sm" data-testid="seal-check-result">
        {result === null || result === "checking" ? null : result === "failed" ? (
          <span className="text-fault-700">This browser could not run the check (it needs Web Crypto with Ed25519).</span>
        ) : verified ? (
          <span className="font-medium text-pass-700">
            Verified here: the entry hashes to the leaf, the proof leads to the head&apos;s root, and the head carries the log
            key&apos;s signature.
          </span>
        ) : (
          <span className="font-medium text-fault-700">
            Not verified:{" "}
            {[
              !result.leafHash && "the entry does not hash to the leaf",
              !result.inclusion && "the proof does not lead to the head's root",
              !result.signature && "the head's signature is not the log key's",
            ]
              .filter(Boolean)
              .join("; ")}
            .
          </span>
        )}
      </p>
    </div>
  );
}
