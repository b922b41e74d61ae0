import "server-only";
// The log's keys, from the settings (created once at first start, like the auth secret; scripts/lib/env.mjs).
// The worker signs with the private key; everyone else only ever needs the public one.
import { pemFromBase64Der } from "@/lib/integrity/tree-head";
import { requireSetting } from "@/lib/server-env";

export { logPublicKeyFromSettings, type LogPublicKey } from "./log-public-key";

export function logSigningKeyPem(): string {
  return pemFromBase64Der(requireSetting("GUSSET_LOG_SIGNING_KEY"), "PRIVATE KEY");
}
