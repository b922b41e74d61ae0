// The sentence the sign-in and password pages show for each answer of /api/auth/* (lib/auth/client.ts).
import { describe, expect, it } from "vitest";
import { describeAuthError } from "@/lib/auth/client";

describe("describeAuthError", () => {
  it("says an account is locked, and what to do, rather than the generic 429 sentence", () => {
    expect(describeAuthError({ status: 429, code: "ACCOUNT_LOCKED" })).toBe(
      "Too many failed sign-ins for this e-mail address. Wait 15 minutes, or set a new password with “Forgot your password?”.",
    );
    expect(describeAuthError({ status: 429, code: "TOO_MANY_REQUESTS" })).toBe("Too many attempts. Wait a minute and try again.");
  });

  it("names a request from another address of Gusset, a bad e-mail, and falls back to a general sentence", () => {
    expect(describeAuthError({ status: 403, code: "INVALID_ORIGIN" })).toBe(
      "This page's address does not match Gusset's. Reload and try again.",
    );
    expect(describeAuthError({ status: 400, code: "INVALID_EMAIL" })).toBe("Enter an e-mail address like name@firm.example.");
    expect(describeAuthError({ status: 500 })).toBe("Something went wrong. Try again; if it keeps happening, tell your admin.");
    expect(describeAuthError(null)).toBe("");
  });
});
