import "server-only";
// The client's address for rate limits and the audit trail. scripts/serve.mjs resolves it from the
// connection (and from X-Forwarded-For only when the peer is a configured trusted proxy) and passes it in
// x-gusset-client-address, after dropping any copy the client sent. Nothing else reads forwarded headers.
import { isIP } from "node:net";
import { serverEnv } from "@/lib/server-env";

export const CLIENT_ADDRESS_HEADER = "x-gusset-client-address";

/** The client's address, or null when Gusset's own server did not set it (or it is not an IP address). */
export function clientAddressFrom(requestHeaders: Headers): string | null {
  if (serverEnv().GUSSET_CLIENT_ADDRESS_FROM_SERVER !== "1") return null;
  const address = requestHeaders.get(CLIENT_ADDRESS_HEADER);
  return address && isIP(address) !== 0 ? address : null;
}
