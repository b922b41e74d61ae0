// The calc sheet's "Check it in this browser" (components/integrity/browser-verify.ts) is a second implementation of
// RFC 9162's inclusion check and the head's Ed25519 signature, on Web Crypto: it must agree with lib/integrity (checked
// against the RFC's vectors in merkle.test.ts) on a proof that holds, and refuse one whose entry, proof, root or
// signature was changed.
import { describe, expect, it } from "vitest";
import { checkSeal, type SealToCheck } from "@/components/integrity/browser-verify";
import { inclusionProof, leafHash, rootHashFromLeafHashes, toHex } from "@/lib/integrity/merkle";
import { generateLogKeyPair, signTreeHead, treeHeadText } from "@/lib/integrity/tree-head";

const entries = Array.from({ length: 11 }, (_, i) =>
  JSON.stringify({ at: "2026-12-03T02:38:57.009Z", kind: "audit-event", ref: String(i), sha256: "0".repeat(63) + (i % 10) }),
);
const leaves = entries.map((entry) => leafHash(new TextEncoder().encode(entry)));
const keys = generateLogKeyPair();

function sealOf(index: number, size: number): SealToCheck {
  const head = { size, rootHash: toHex(rootHashFromLeafHashes(leaves.slice(0, size))), sealedAt: "2026-12-03T02:38:58.539Z" };
  return {
    entry: entries[index],
    leafHash: toHex(leaves[index]),
    leafIndex: index,
    treeSize: size,
    proof: inclusionProof(index, size, leaves).map(toHex),
    rootHash: head.rootHash,
    headText: treeHeadText(head),
    signature: signTreeHead(head, keys.privateKeyPem),
    publicKeyPem: keys.publicKeyPem,
  };
}

describe("checking a seal in the browser", () => {
  it("agrees with the server's implementation for every leaf of trees of 1 to 11 leaves", async () => {
    for (let size = 1; size <= 11; size++) {
      for (let index = 0; index < size; index++) {
        expect(await checkSeal(sealOf(index, size)), `${index} of ${size}`).toEqual({
          leafHash: true,
          inclusion: true,
          signature: true,
        });
      }
    }
  });

  it("refuses a changed entry, proof hash, index, root or signature, and names which part failed", async () => {
    const seal = sealOf(6, 11);
    const flip = (hex: string) => (hex[0] === "0" ? "1" : "0") + hex.slice(1);
    expect(await checkSeal({ ...seal, entry: seal.entry.replace('"ref":"6"', '"ref":"7"') })).toEqual({
      leafHash: false,
      inclusion: false,
      signature: true,
    });
    expect((await checkSeal({ ...seal, proof: [flip(seal.proof[0]), ...seal.proof.slice(1)] })).inclusion).toBe(false);
    expect((await checkSeal({ ...seal, leafIndex: 5 })).inclusion).toBe(false);
    expect((await checkSeal({ ...seal, rootHash: flip(seal.rootHash) })).inclusion).toBe(false);
    const other = generateLogKeyPair();
    expect((await checkSeal({ ...seal, publicKeyPem: other.publicKeyPem })).signature).toBe(false);
    expect((await checkSeal({ ...seal, headText: seal.headText.replace("\n11\n", "\n12\n") })).signature).toBe(false);
  });
});
