// scripts/serve.mjs answering a route itself, without Next (directRouteHandler): over a real node:http server, with
// stand-in route handlers. The routes it serves in the build are tested over HTTP in
// tests/integration/direct-routes.test.ts.
import http from "node:http";
import net from "node:net";
import type { AddressInfo } from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
// @ts-expect-error -- a plain ES module of the server script, without types
import { DIRECT_BODY_LIMIT, DIRECT_TOO_LARGE, DIRECT_UNREADABLE, directRouteHandler } from "@/scripts/serve.mjs";

class HandToNext extends Error {}

type Handler = (request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response>;
const calls: { method: string; url: string; body: string; headers: Headers }[] = [];

const routes: Record<string, Handler> = {
  // Echoes what it was given, with a header of its own and two cookies.
  "POST /echo": async (request) => {
    const body = await request.text();
    calls.push({ method: request.method, url: request.url, body, headers: request.headers });
    const headers = new Headers({ "content-type": "application/json", "x-route": "echo", "cache-control": "no-store" });
    headers.append("set-cookie", "a=1; Path=/");
    headers.append("set-cookie", "b=2; Path=/");
    return new Response(JSON.stringify({ body, address: request.headers.get("x-gusset-client-address") }), {
      status: 201,
      headers,
    });
  },
  // Hands every request to Next before reading its body, as a session only better-auth can answer does.
  "POST /hand-over": async () => {
    throw new HandToNext();
  },
  // A bug: the route throws something no route handler lets through.
  "POST /broken": async () => {
    throw new Error("SELECT secret FROM somewhere failed");
  },
  // Reads the body, then hands over: too late, the body is gone, so it is a failure, not a hand-over.
  "POST /late-hand-over": async (request) => {
    await request.text();
    throw new HandToNext();
  },
};

const answerHeaders = { "content-security-policy": "default-src 'self'", "x-frame-options": "DENY", "cache-control": "public" };
const nextSaw: { url: string; body: string }[] = [];

let server: http.Server;
let base: string;

beforeAll(async () => {
  const serveDirect = (
    directRouteHandler as (
      bundle: unknown,
      toNext: (req: http.IncomingMessage, res: http.ServerResponse) => void,
    ) => (req: http.IncomingMessage, res: http.ServerResponse) => boolean
  )({ routes, answerHeaders, internalMessage: "Something went wrong on our side.", HandToNext }, (req, res) => {
    // Next's stand-in: reads the body itself, as Next would, a while later (after its routing).
    setTimeout(() => {
      const chunks: Buffer[] = [];
      req.on("data", (chunk: Buffer) => chunks.push(chunk));
      req.on("end", () => {
        nextSaw.push({ url: req.url ?? "", body: Buffer.concat(chunks).toString("utf8") });
        res.writeHead(200, { "content-type": "text/plain" });
        res.end("next");
      });
    }, 20);
  });
  server = http.createServer((req, res) => {
    req.headers["x-gusset-client-address"] = "192.0.2.44";
    if (!serveDirect(req, res)) {
      req.resume();
      res.writeHead(200, { "content-type": "text/plain" });
      res.end("next, for a route not served directly");
    }
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});

afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));

describe("a route served without Next (scripts/serve.mjs, directRouteHandler)", () => {
  it("hands its route the request as sent, and answers with the route's status, headers and body plus Next's headers", async () => {
    const response = await fetch(`${base}/echo?x=1`, {
      method: "POST",
      headers: { "content-type": "application/json", cookie: "session=abc" },
      body: '{"inputs":{"L":"6 m"}}',
    });
    expect(response.status).toBe(201);
    const text = await response.text();
    expect(JSON.parse(text)).toEqual({ body: '{"inputs":{"L":"6 m"}}', address: "192.0.2.44" });
    expect(response.headers.get("content-length")).toBe(String(Buffer.byteLength(text)));
    const call = calls.at(-1)!;
    expect(call.method).toBe("POST");
    expect(new URL(call.url).pathname + new URL(call.url).search).toBe("/echo?x=1");
    expect(call.headers.get("cookie")).toBe("session=abc");
    // The security headers next.config.ts adds; the route's own header wins where both set one (cache-control).
    expect(response.headers.get("content-security-policy")).toBe("default-src 'self'");
    expect(response.headers.get("x-frame-options")).toBe("DENY");
    expect(response.headers.get("cache-control")).toBe("no-store");
    expect(response.headers.get("x-route")).toBe("echo");
    expect(response.headers.getSetCookie()).toEqual(["a=1; Path=/", "b=2; Path=/"]);
  });

  it("leaves other methods and paths to Next", async () => {
    expect(await (await fetch(`${base}/echo`)).text()).toBe("next, for a route not served directly");
    expect(await (await fetch(`${base}/echo/more`, { method: "POST", body: "{}" })).text()).toBe(
      "next, for a route not served directly",
    );
  });

  it("hands a request to Next, its body unread and whole, when the route says so before reading it", async () => {
    const body = JSON.stringify({ inputs: { note: "x".repeat(200_000) } });
    const response = await fetch(`${base}/hand-over?y=2`, {
      method: "POST",
      body,
      headers: { "content-type": "application/json" },
    });
    expect(response.status).toBe(200);
    expect(await response.text()).toBe("next");
    expect(nextSaw.at(-1)).toEqual({ url: "/hand-over?y=2", body });
  });

  it("answers a route's unexpected failure with the API's internal error, never the error's own text", async () => {
    for (const path of ["/broken", "/late-hand-over"]) {
      const response = await fetch(`${base}${path}`, { method: "POST", body: "{}" });
      expect(response.status).toBe(500);
      expect(response.headers.get("x-frame-options")).toBe("DENY");
      const text = await response.text();
      expect(JSON.parse(text)).toEqual({ error: { code: "internal", message: "Something went wrong on our side." } });
      expect(text).not.toContain("secret");
    }
  });

  it("refuses a body over the limit with 413, whether its length is declared or not, and the route never sees it", async () => {
    const before = calls.length;
    const big = "x".repeat((DIRECT_BODY_LIMIT as number) + 1);
    const declared = await fetch(`${base}/echo`, { method: "POST", body: big });
    expect(declared.status).toBe(413);
    expect(await declared.json()).toEqual({ error: { code: "bad-request", message: DIRECT_TOO_LARGE } });
    // Streamed in pieces (chunked, no Content-Length): refused once the limit is passed.
    const chunks = new ReadableStream<Uint8Array>({
      start(controller) {
        for (let sent = 0; sent <= (DIRECT_BODY_LIMIT as number); sent += 64 * 1024)
          controller.enqueue(new Uint8Array(64 * 1024).fill(120));
        controller.close();
      },
    });
    const streamed = await fetch(`${base}/echo`, { method: "POST", body: chunks, duplex: "half" } as RequestInit);
    expect(streamed.status).toBe(413);
    expect(streamed.headers.get("content-security-policy")).toBe("default-src 'self'");
    expect(calls.length).toBe(before);
    // The server still answers on.
    expect((await fetch(`${base}/echo`, { method: "POST", body: "{}" })).status).toBe(201);
  });

  it("answers 400 to a request whose Host the Fetch API cannot read, and a body cut off on the way harms nothing", async () => {
    const raw = (lines: string) =>
      new Promise<string>((resolve, reject) => {
        const socket = net.connect(Number(new URL(base).port), "127.0.0.1", () => socket.end(lines));
        let text = "";
        socket.on("data", (chunk) => (text += chunk.toString("utf8")));
        socket.on("end", () => resolve(text));
        socket.on("error", reject);
      });
    const badHost = await raw("POST /echo HTTP/1.1\r\nHost: bad host\r\nContent-Length: 2\r\nConnection: close\r\n\r\n{}");
    expect(badHost).toMatch(/^HTTP\/1\.1 400 /);
    expect(badHost).toContain(JSON.stringify(DIRECT_UNREADABLE));
    // Twenty bytes promised, five sent, then the client goes: the route's read fails, and nothing else does.
    await raw('POST /echo HTTP/1.1\r\nHost: 127.0.0.1\r\nContent-Length: 20\r\n\r\n{"a":');
    expect((await fetch(`${base}/echo`, { method: "POST", body: "{}" })).status).toBe(201);
  });
});
