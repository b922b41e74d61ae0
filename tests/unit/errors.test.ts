// Error codes map to the HTTP statuses the API promises, and only AppError messages reach a person.
import { afterEach, describe, expect, it, vi } from "vitest";
import { AppError, ERROR_CODES, ERROR_STATUS, toPublicError } from "@/lib/domain/errors";

afterEach(() => vi.restoreAllMocks());

describe("errors", () => {
  it("maps every code to its status", () => {
    expect(ERROR_STATUS).toEqual({
      "bad-request": 400,
      unauthenticated: 401,
      forbidden: 403,
      "not-found": 404,
      conflict: 409,
      "invalid-input": 422,
      "rate-limited": 429,
      internal: 500,
    });
    for (const code of ERROR_CODES) expect(new AppError(code).status).toBe(ERROR_STATUS[code]);
  });

  it("keeps an AppError's own message and field messages", () => {
    const error = new AppError("invalid-input", "Check the form.", { fieldErrors: { email: ["Enter an e-mail."] } });
    expect(toPublicError(error)).toEqual({
      code: "invalid-input",
      message: "Check the form.",
      fieldErrors: { email: ["Enter an e-mail."] },
    });
    expect(toPublicError(new AppError("forbidden"))).toEqual({ code: "forbidden", message: "Your role does not allow this." });
  });

  it("logs anything else and shows only a generic message", () => {
    const log = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const leaked = toPublicError(new Error('duplicate key value violates unique constraint "user_email_unique"'));
    expect(leaked.code).toBe("internal");
    expect(leaked.message).not.toMatch(/constraint|user_email/);
    expect(log).toHaveBeenCalledOnce();
  });
});
