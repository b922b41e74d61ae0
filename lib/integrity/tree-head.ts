/**
 * The log's signed tree heads and its leaves' entries.
 *
 * A leaf's entry is the canonical JSON (RFC 8785) of what it seals: its kind (a run, a sign-off step, a standard's or
 * a library's version event, an attachment, an audit event), the row's id, the sha256 of the record as stored, and when it was
 * made. Its leaf hash is RFC 9162's, SHA-256(0x00 || entry) (merkle.ts).
 *
 * A tree head says "the log had `size` leaves with root `rootHash` at `sealedAt`". What is signed is the head's
 * text, four lines, so that anyone can rebuild it by hand and check the signature with a standard Ed25519
 * verifier (openssl pkeyutl -verify -rawin):
 *
 *   gusset-tree-head/1
 *   <size, decimal>
 *   <root hash, 64 lowercase hex digits>
 *   <sealed at, ISO 8601 UTC with milliseconds>
 *
 * each line ending in one "\n". The head's digest, e-mailed to the QA witness and printed on calc sheets, is the
 * SHA-256 of that text.
 */
import canonicalize from "canonicalize";
import { createHash, createPrivateKey, createPublicKey, generateKeyPairSync, sign, verify, type KeyObject } from "node:crypto";

export const TREE_HEAD_FORMAT = "gusset-tree-head/1";

/** One per kind of evidence row (db/schema/log.ts LOG_LEAF_KINDS, which the migration's triggers write). */
export const LEAF_KINDS = ["run", "sign-off", "version-event", "library-event", "attachment", "audit-event"] as const;
export type LeafKind = (typeof LEAF_KINDS)[number];

export interface LeafEntry {
  readonly kind: LeafKind;
  /** The sealed row's id (a run's uuid, an event's number). */
  readonly ref: string;
  /** sha256 (hex) of the sealed record exactly as stored. */
  readonly sha256: string;
  /** When the row was made, ISO 8601 UTC. */
  readonly at: string;
}

const HEX64 = /^[0-9a-f]{64}$/;
const ISO_UTC = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/;

/** The bytes a leaf's hash is taken over: the entry's canonical JSON, UTF-8. */
export function leafEntryBytes(entry: LeafEntry): Uint8Array {
  if (!(LEAF_KINDS as readonly string[]).includes(entry.kind)) throw new Error(`leafEntryBytes: unknown kind "${entry.kind}"`);
  if (!entry.ref) throw new Error("leafEntryBytes: the leaf names no row (ref is empty)");
  if (!HEX64.test(entry.sha256)) throw new Error("leafEntryBytes: sha256 must be 64 lowercase hex digits");
  if (!ISO_UTC.test(entry.at)) throw new Error("leafEntryBytes: at must be ISO 8601 UTC with milliseconds");
  const text = canonicalize({ kind: entry.kind, ref: entry.ref, sha256: entry.sha256, at: entry.at });
  return new TextEncoder().encode(text);
}

export interface TreeHead {
  readonly size: number;
  /** 64 lowercase hex digits. */
  readonly rootHash: string;
  /** ISO 8601 UTC with milliseconds. */
  readonly sealedAt: string;
}

/** The text a tree head's signature is over (see the top of this file). */
export function treeHeadText(head: TreeHead): string {
  if (!Number.isSafeInteger(head.size) || head.size < 0) throw new Error("treeHeadText: size must be a whole number ≥ 0");
  if (!HEX64.test(head.rootHash)) throw new Error("treeHeadText: rootHash must be 64 lowercase hex digits");
  if (!ISO_UTC.test(head.sealedAt)) throw new Error("treeHeadText: sealedAt must be ISO 8601 UTC with milliseconds");
  return `${TREE_HEAD_FORMAT}\n${head.size}\n${head.rootHash}\n${head.sealedAt}\n`;
}

/** SHA-256 (hex) of the head's text: the digest sent to the witness and printed on sheets. */
export function treeHeadDigest(head: TreeHead): string {
  return createHash("sha256").update(treeHeadText(head), "utf8").digest("hex");
}

/** A new Ed25519 key pair for the log, as PEM (PKCS #8 private, SPKI public). */
export function generateLogKeyPair(): { privateKeyPem: string; publicKeyPem: string } {
  const { privateKey, publicKey } = generateKeyPairSync("ed25519");
  return {
    privateKeyPem: privateKey.export({ type: "pkcs8", format: "pem" }).toString(),
    publicKeyPem: publicKey.export({ type: "spki", format: "pem" }).toString(),
  };
}

function ed25519(key: KeyObject, which: string): KeyObject {
  if (key.asymmetricKeyType !== "ed25519") throw new Error(`${which} is not an Ed25519 key`);
  return key;
}

/** The head's Ed25519 signature over its text, base64. */
export function signTreeHead(head: TreeHead, privateKeyPem: string): string {
  const key = ed25519(createPrivateKey(privateKeyPem), "the log's private key");
  return sign(null, Buffer.from(treeHeadText(head), "utf8"), key).toString("base64");
}

/** Whether `signature` (base64) is the log key's signature of this head. */
export function verifyTreeHead(head: TreeHead, signature: string, publicKeyPem: string): boolean {
  const key = ed25519(createPublicKey(publicKeyPem), "the log's public key");
  const bytes = Buffer.from(signature, "base64");
  if (bytes.length !== 64) return false;
  return verify(null, Buffer.from(treeHeadText(head), "utf8"), key, bytes);
}

/** A public key's fingerprint: SHA-256 (hex) of its SPKI DER bytes, for people to compare by eye. */
export function publicKeyFingerprint(publicKeyPem: string): string {
  const der = createPublicKey(publicKeyPem).export({ type: "spki", format: "der" });
  return createHash("sha256").update(der).digest("hex");
}

/** A key given as one line of base64 DER (PKCS #8 private, SPKI public; how settings carry it) as PEM. */
export function pemFromBase64Der(base64: string, kind: "PRIVATE KEY" | "PUBLIC KEY"): string {
  const body = base64.replace(/\s+/g, "");
  if (!/^[A-Za-z0-9+/]+={0,2}$/.test(body)) throw new Error(`pemFromBase64Der: the ${kind.toLowerCase()} is not base64`);
  const lines = body.match(/.{1,64}/g) ?? [];
  return `-----BEGIN ${kind}-----\n${lines.join("\n")}\n-----END ${kind}-----\n`;
}
