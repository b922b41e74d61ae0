// The client's address as scripts/serve.mjs resolves it (common practice for X-Forwarded-For behind a
// proxy: walk from the right past the hops you trust; the first one you do not trust is the client).
import { describe, expect, it } from "vitest";
// @ts-expect-error -- a plain ES module of the server script, without types
import { resolveClientAddress, trustedProxyList } from "@/scripts/serve.mjs";

const resolve = resolveClientAddress as (
  peer: string | undefined,
  forwardedFor: string | undefined,
  trusted: unknown,
) => string | null;
const trusted = (trustedProxyList as (setting: string) => unknown)("10.0.0.0/8, 192.0.2.10, ::1");
const nobody = (trustedProxyList as (setting: string) => unknown)("");

describe("resolveClientAddress", () => {
  it("takes the socket's address from a peer that is not a trusted proxy, whatever it forwards", () => {
    expect(resolve("198.51.100.7", "203.0.113.9", trusted)).toBe("198.51.100.7");
    expect(resolve("198.51.100.7", "203.0.113.9", nobody)).toBe("198.51.100.7");
    expect(resolve("::ffff:198.51.100.7", undefined, nobody)).toBe("198.51.100.7");
  });

  it("reads the forwarded chain from a trusted proxy: the rightmost address it does not trust", () => {
    expect(resolve("10.1.2.3", "203.0.113.9", trusted)).toBe("203.0.113.9");
    // The client sent its own X-Forwarded-For; the proxy appended the real address on the right.
    expect(resolve("10.1.2.3", "6.6.6.6, 203.0.113.9", trusted)).toBe("203.0.113.9");
    // Two trusted hops in a row.
    expect(resolve("192.0.2.10", "203.0.113.9, 10.4.4.4", trusted)).toBe("203.0.113.9");
    expect(resolve("::1", "2001:db8::5", trusted)).toBe("2001:db8::5");
  });

  it("stops at a malformed hop, keeping the last good address", () => {
    expect(resolve("10.1.2.3", "203.0.113.9, not-an-ip", trusted)).toBe("10.1.2.3");
    expect(resolve("10.1.2.3", "", trusted)).toBe("10.1.2.3");
    expect(resolve("10.1.2.3", undefined, trusted)).toBe("10.1.2.3");
  });

  it("refuses a setting that is not an address or range, naming it", () => {
    expect(() => (trustedProxyList as (setting: string) => unknown)("10.0.0.0/8, proxy.internal")).toThrow(
      'GUSSET_TRUSTED_PROXIES: "proxy.internal" is not an IP address or CIDR range',
    );
    expect(() => (trustedProxyList as (setting: string) => unknown)("10.0.0.0/40")).toThrow(
      '"10.0.0.0/40" has a bad prefix length',
    );
  });
});
