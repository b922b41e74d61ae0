// ?next= after sign-in: only paths on Gusset itself (issue: /%09/evil.example landed on another site, and
// %0a, %0d%0a, %00 gave a 500). The values below are what the sign-in page receives once the query is decoded.
import { describe, expect, it } from "vitest";
import { safePath } from "@/lib/domain/safe-path";

describe("safePath", () => {
  it.each([
    ["/projects", "/projects"],
    ["/admin/users?tab=pending#invite", "/admin/users?tab=pending#invite"],
    ["/a/../audit", "/audit"],
    ["/%2F%2Fevil.example", "/%2F%2Fevil.example"],
  ])("keeps the same-site path %j as %j", (candidate, expected) => {
    expect(safePath(candidate)).toBe(expected);
  });

  it.each([
    ["a tab that browsers drop, leaving //evil.example", "/\t/evil.example"],
    ["a newline", "/\n/evil.example"],
    ["a carriage return and newline", "/home\r\nSet-Cookie: x=1"],
    ["a NUL byte", "/home\u0000"],
    ["DEL", "/home\u007f"],
    ["a backslash read as a slash", "/\\evil.example"],
    ["a backslash later on", "/x/..\\..\\evil"],
    ["a protocol-relative address", "//evil.example"],
    ["an absolute address", "https://evil.example/home"],
    ["a javascript: address", "javascript:alert(1)"],
    ["a relative path", "home"],
    ["nothing", ""],
    ["an address thousands of characters long", `/${"a".repeat(3000)}`],
  ])("sends %s home", (_what, candidate) => {
    expect(safePath(candidate)).toBe("/home");
  });

  it("falls back to the given page", () => {
    expect(safePath(null, "/sign-in")).toBe("/sign-in");
    expect(safePath("//evil.example", "/sign-in")).toBe("/sign-in");
  });
});
