// Checking a record's seal where it is shown, with the browser's own Web Crypto and nothing from the server but the
// numbers on the page: the entry's leaf hash (SHA-256 of 0x00 || entry), the inclusion proof folded to the root by
// RFC 9162 §2.1.3.2, and the tree head's Ed25519 signature under the log's public key. Written apart from
// lib/integrity (which the server runs on node:crypto) on purpose: a second implementation, so a fault in one
// does not vouch for itself.

export type SealToCheck = {
  entry: string;
  leafHash: string;
  leafIndex: number;
  treeSize: number;
  proof: readonly string[];
  rootHash: string;
  headText: string;
  signature: string;
  publicKeyPem: string;
};

export type SealCheckResult = { leafHash: boolean; inclusion: boolean; signature: boolean };

const hexOf = (bytes: ArrayBuffer | Uint8Array) =>
  Array.from(bytes instanceof Uint8Array ? bytes : new Uint8Array(bytes), (b) => b.toString(16).padStart(2, "0")).join("");

function bytesOf(hex: string): Uint8Array {
  if (!/^(?:[0-9a-f]{2})*$/i.test(hex)) throw new Error("not hexadecimal");
  const out = new Uint8Array(hex.length / 2);
  for (let i = 0; i < out.length; i++) out[i] = Number.parseInt(hex.slice(2 * i, 2 * i + 2), 16);
  return out;
}

async function sha256(...parts: Uint8Array[]): Promise<Uint8Array> {
  const joined = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let at = 0;
  for (const part of parts) {
    joined.set(part, at);
    at += part.length;
  }
  return new Uint8Array(await crypto.subtle.digest("SHA-256", joined));
}

const ONE = new Uint8Array([1]);

/** RFC 9162 §2.1.3.2, step by step. */
async function inclusionHolds(seal: SealToCheck, leaf: Uint8Array): Promise<boolean> {
  if (seal.leafIndex >= seal.treeSize) return false;
  let fn = seal.leafIndex;
  let sn = seal.treeSize - 1;
  let r = leaf;
  for (const hex of seal.proof) {
    const p = bytesOf(hex);
    if (p.length !== 32 || sn === 0) return false;
    if (fn % 2 === 1 || fn === sn) {
      r = await sha256(ONE, p, r);
      while (fn % 2 === 0 && fn !== 0) {
        fn = Math.floor(fn / 2);
        sn = Math.floor(sn / 2);
      }
    } else {
      r = await sha256(ONE, r, p);
    }
    fn = Math.floor(fn / 2);
    sn = Math.floor(sn / 2);
  }
  return sn === 0 && hexOf(r) === seal.rootHash;
}

function derOfPem(pem: string): Uint8Array<ArrayBuffer> {
  const body = pem.replace(/-----(BEGIN|END) PUBLIC KEY-----/g, "").replace(/\s+/g, "");
  return Uint8Array.from(atob(body), (c) => c.charCodeAt(0));
}

async function signatureHolds(seal: SealToCheck): Promise<boolean> {
  const key = await crypto.subtle.importKey("spki", derOfPem(seal.publicKeyPem), { name: "Ed25519" }, false, ["verify"]);
  const signature = Uint8Array.from(atob(seal.signature), (c) => c.charCodeAt(0));
  return crypto.subtle.verify({ name: "Ed25519" }, key, signature, new TextEncoder().encode(seal.headText));
}

export async function checkSeal(seal: SealToCheck): Promise<SealCheckResult> {
  const leaf = await sha256(new Uint8Array([0]), new TextEncoder().encode(seal.entry));
  return {
    leafHash: hexOf(leaf) === seal.leafHash,
    inclusion: await inclusionHolds(seal, leaf),
    signature: await signatureHolds(seal).catch(() => false),
  };
}
