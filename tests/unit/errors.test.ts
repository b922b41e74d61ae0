// Error codes map to the HTTP statuses the API promises, and only AppError messages reach a person;
// a database that cannot be reached is told apart from a query that failed, on errors node-postgres
// really throws (against ports where nothing, or something mute, listens: no PostgreSQL needed).
import net from "node:net";
import { DrizzleQueryError } from "drizzle-orm/errors";
import pg from "pg";
import { afterEach, describe, expect, it, vi } from "vitest";
import { AppError, ERROR_CODES, ERROR_STATUS, isDatabaseUnavailable, toPublicError } from "@/lib/domain/errors";

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
      unavailable: 503,
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

/** A local TCP server doing `onSocket` with each connection; resolves its port. */
async function listen(onSocket: (socket: net.Socket) => void): Promise<{ port: number; close: () => Promise<void> }> {
  const sockets = new Set<net.Socket>();
  const server = net.createServer((socket) => {
    sockets.add(socket);
    onSocket(socket);
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const { port } = server.address() as net.AddressInfo;
  const close = () => {
    for (const socket of sockets) socket.destroy();
    return new Promise<void>((resolve) => server.close(() => resolve()));
  };
  return { port, close };
}

/** What a query on a fresh pool against that port throws. */
async function queryError(port: number, options: { connectionTimeoutMillis?: number } = {}): Promise<unknown> {
  const pool = new pg.Pool({ host: "127.0.0.1", port, user: "x", database: "x", ...options });
  pool.on("error", () => undefined);
  try {
    await pool.query("select 1");
    throw new Error("the query should have failed");
  } catch (error) {
    return error;
  } finally {
    await pool.end().catch(() => undefined);
  }
}

/** A PostgreSQL error as node-postgres builds it from the server's message. */
function serverError(code: string, message: string): pg.DatabaseError {
  return Object.assign(new pg.DatabaseError(message, message.length, "error"), { code, severity: "FATAL" });
}

describe("isDatabaseUnavailable", () => {
  it("is true for a refused connection (nothing listens on the port)", async () => {
    const closed = await listen(() => undefined);
    await closed.close();
    const error = await queryError(closed.port);
    expect(error).toMatchObject({ code: "ECONNREFUSED" });
    expect(isDatabaseUnavailable(error)).toBe(true);
  });

  it("is true for a connect that times out (the port takes the connection and never answers)", async () => {
    const mute = await listen(() => undefined);
    try {
      const error = await queryError(mute.port, { connectionTimeoutMillis: 200 });
      expect((error as Error).message).toMatch(/timeout/i);
      expect(isDatabaseUnavailable(error)).toBe(true);
    } finally {
      await mute.close();
    }
  });

  it("is true for a connection closed under the client (a server going away)", async () => {
    const slammer = await listen((socket) => socket.destroy());
    try {
      const error = await queryError(slammer.port);
      expect((error as Error).message).toMatch(/^Connection terminated/);
      expect(isDatabaseUnavailable(error)).toBe(true);
    } finally {
      await slammer.close();
    }
  });

  it.each([
    ["57P01", "terminating connection due to administrator command"],
    ["57P02", "terminating connection because of crash of another server process"],
    ["57P03", "the database system is starting up"],
    ["53300", "sorry, too many clients already"],
    ["08006", "connection failure"],
    ["08001", "could not establish connection"],
  ])("is true for the server's %s (%s)", (code, message) => {
    expect(isDatabaseUnavailable(serverError(code, message))).toBe(true);
  });

  it("looks through drizzle's wrapper, better-auth's causes and Node's AggregateError", () => {
    const refused = Object.assign(new Error("connect ECONNREFUSED 127.0.0.1:5432"), { code: "ECONNREFUSED" });
    expect(isDatabaseUnavailable(new DrizzleQueryError("select 1", [], serverError("57P01", "terminating")))).toBe(true);
    expect(isDatabaseUnavailable(new Error("Failed to get session", { cause: new Error("adapter", { cause: refused }) }))).toBe(
      true,
    );
    expect(isDatabaseUnavailable(new AggregateError([refused, refused], ""))).toBe(true);
  });

  it.each([
    ["a unique violation", serverError("23505", 'duplicate key value violates unique constraint "user_email_unique"')],
    ["a missing table", serverError("42P01", 'relation "nope" does not exist')],
    ["a refused password", serverError("28P01", 'password authentication failed for user "gusset"')],
    ["a query that failed in drizzle", new DrizzleQueryError("select 1", [], serverError("22P02", "invalid input syntax"))],
    ["a bug", new TypeError("Cannot read properties of undefined (reading 'id')")],
    ["nothing at all", null],
    ["a thrown string", "ECONNREFUSED"],
  ])("is false for %s", (_label, error) => {
    expect(isDatabaseUnavailable(error)).toBe(false);
  });
});

describe("toPublicError for an unreachable database", () => {
  it("answers `unavailable` with a message a person can act on, logged in one line without a stack", () => {
    const warn = vi.spyOn(console, "warn").mockImplementation(() => undefined);
    const log = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const error = new DrizzleQueryError("select * from session", [], serverError("57P01", "terminating connection"));
    expect(toPublicError(error)).toEqual({
      code: "unavailable",
      message: "Gusset cannot reach its database; try again in a minute.",
    });
    expect(ERROR_STATUS.unavailable).toBe(503);
    expect(log).not.toHaveBeenCalled();
    expect(warn).toHaveBeenCalledOnce();
    expect(warn.mock.calls[0].join(" ")).toBe("[gusset] the database cannot be reached: 57P01 terminating connection");
  });
});
