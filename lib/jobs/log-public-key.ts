import "server-only";
// The log's public key as PEM, with its fingerprint: from GUSSET_LOG_PUBLIC_KEY, else derived from the signing key.
import { createPrivateKey, createPublicKey } from "node:crypto";
import { pemFromBase64Der, publicKeyFingerprint } from "@/lib/integrity/tree-head";
import { serverEnv } from "@/lib/server-env";

export type LogPublicKey = { pem: string; fingerprint: string };

let cached: { source: string; key: LogPublicKey } | null = null;

export function logPublicKeyFromSettings(): LogPublicKey {
  const { GUSSET_LOG_PUBLIC_KEY: publicKey, GUSSET_LOG_SIGNING_KEY: signingKey } = serverEnv();
  const source = publicKey ?? signingKey;
  if (!source) throw new Error("GUSSET_LOG_PUBLIC_KEY is not set (npm start and npm test set it).");
  if (cached?.source === source) return cached.key;
  const pem = publicKey
    ? pemFromBase64Der(publicKey, "PUBLIC KEY")
    : createPublicKey(createPrivateKey(pemFromBase64Der(signingKey!, "PRIVATE KEY")))
        .export({ type: "spki", format: "pem" })
        .toString();
  cached = { source, key: { pem, fingerprint: publicKeyFingerprint(pem) } };
  return cached.key;
}
