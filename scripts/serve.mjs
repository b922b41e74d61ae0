// Gusset's HTTP server: Next's request handler behind a plain node:http server, so the client's address
// comes from the connection itself and not from whatever X-Forwarded-For a browser chooses to send.
//
//   node scripts/serve.mjs --hostname 127.0.0.1 --port 3000
//
// For every request it works out the client address once and hands it to the app in the
// x-gusset-client-address header (any copy of that header the client sent is dropped first):
// - when the connecting peer is one of GUSSET_TRUSTED_PROXIES (addresses or CIDR ranges, comma
//   separated), the address is read from X-Forwarded-For, walking from the right past the trusted hops;
// - otherwise it is the socket's own address, and X-Forwarded-For is removed so nothing downstream
//   believes it.
// Rate limits and the audit trail read only x-gusset-client-address (lib/auth/client-address.ts), and
// only when this server set GUSSET_CLIENT_ADDRESS_FROM_SERVER, so `next start` run on its own cannot be
// fooled by a forged header either: it records no address at all.
import http from "node:http";
import net from "node:net";
import { parseArgs } from "node:util";
import path from "node:path";
import { pathToFileURL } from "node:url";
import next from "next";
import { DIRECT_ROUTES_FILE, directRoutesBuildId } from "./build-direct-routes.mjs";
import { readBuildId } from "./lib/build-id.mjs";

export const CLIENT_ADDRESS_HEADER = "x-gusset-client-address";

/** "127.0.0.1, 10.0.0.0/8, ::1" → a BlockList that answers "is this a trusted proxy?". */
export function trustedProxyList(setting) {
  const list = new net.BlockList();
  for (const entry of (setting ?? "")
    .split(",")
    .map((item) => item.trim())
    .filter(Boolean)) {
    const [address, prefix] = entry.split("/");
    const family = net.isIPv6(address) ? "ipv6" : net.isIPv4(address) ? "ipv4" : null;
    if (!family) throw new Error(`GUSSET_TRUSTED_PROXIES: "${entry}" is not an IP address or CIDR range`);
    if (prefix === undefined) list.addAddress(address, family);
    else {
      const bits = Number(prefix);
      if (!/^\d+$/.test(prefix) || bits > (family === "ipv4" ? 32 : 128)) {
        throw new Error(`GUSSET_TRUSTED_PROXIES: "${entry}" has a bad prefix length`);
      }
      list.addSubnet(address, bits, family);
    }
  }
  return list;
}

/** "::ffff:192.0.2.1" → "192.0.2.1"; other addresses unchanged. */
function plainAddress(address) {
  const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/i.exec(address ?? "");
  return mapped ? mapped[1] : (address ?? null);
}

function isTrusted(list, address) {
  if (!address) return false;
  const family = net.isIPv6(address) ? "ipv6" : net.isIPv4(address) ? "ipv4" : null;
  return family !== null && list.check(address, family);
}

/**
 * The client's address for a request that reached us from `peer` with this X-Forwarded-For value.
 * Only a trusted peer's forwarded chain is read; a malformed hop ends the walk at the last good one.
 */
export function resolveClientAddress(peer, forwardedFor, trusted) {
  const from = plainAddress(peer);
  if (!isTrusted(trusted, from) || typeof forwardedFor !== "string") return from;
  const hops = forwardedFor
    .split(",")
    .map((hop) => plainAddress(hop.trim()))
    .filter(Boolean);
  let client = from;
  for (let i = hops.length - 1; i >= 0; i--) {
    if (net.isIP(hops[i]) === 0) break;
    client = hops[i];
    if (!isTrusted(trusted, hops[i])) break;
  }
  return client;
}

/** Next's own limit on a server action's body (serverActions.bodySizeLimit, 1 MB by default). */
export const ACTION_BODY_LIMIT = 1024 * 1024;

export const ACTION_MESSAGES = {
  foreignOrigin: "This request did not come from a Gusset page. Open Gusset at its own address and try again.",
  tooLarge: "This request is larger than Gusset accepts (1 MB). Shorten what you entered and try again.",
  unreadable: "Gusset could not read this request. Reload the page and try again.",
};

/** The security headers of a plain-text answer given here, before Next (which adds them to its own, proxy.ts). */
const PLAIN_ANSWER_HEADERS = {
  "content-type": "text/plain; charset=utf-8",
  "cache-control": "no-store",
  "content-security-policy": "default-src 'none'; frame-ancestors 'none'",
  "x-content-type-options": "nosniff",
  "x-frame-options": "DENY",
  "referrer-policy": "strict-origin-when-cross-origin",
};

function answer(res, status, message) {
  res.writeHead(status, PLAIN_ANSWER_HEADERS);
  res.end(`${message}\n`);
}

/**
 * A server action (a POST carrying Next-Action) is refused before Next sees it when it comes from another
 * site or is too large; Next would answer both with a bare 500. Any other 5xx Next gives an action is a
 * body it could not decode (Gusset's own actions catch their errors and answer 200 with a message), so it
 * becomes a 400 with a sentence. Returns true when the request has been answered here.
 */
export function guardServerAction(req, res) {
  if (req.method !== "POST" || !req.headers["next-action"]) return false;
  const origin = req.headers.origin;
  const originHost = URL.canParse(origin ?? "") ? new URL(origin).host : null;
  if (!originHost || originHost !== req.headers.host) {
    answer(res, 403, ACTION_MESSAGES.foreignOrigin);
    return true;
  }
  if (Number(req.headers["content-length"] ?? 0) > ACTION_BODY_LIMIT) {
    answer(res, 413, ACTION_MESSAGES.tooLarge);
    return true;
  }
  const writeHead = res.writeHead.bind(res);
  const write = res.write.bind(res);
  const end = res.end.bind(res);
  let replaced = false;
  res.writeHead = (status, ...rest) => {
    if (status < 500) return writeHead(status, ...rest);
    replaced = true;
    for (const name of res.getHeaderNames()) res.removeHeader(name);
    return writeHead(400, PLAIN_ANSWER_HEADERS);
  };
  res.write = (chunk, ...rest) => (replaced ? true : write(chunk, ...rest));
  res.end = (...args) => {
    if (!res.headersSent) res.writeHead(res.statusCode);
    return replaced ? end(`${ACTION_MESSAGES.unreadable}\n`) : end(...args);
  };
  return false;
}

/** The largest body a route served here reads (a run's inputs are a few hundred bytes). */
export const DIRECT_BODY_LIMIT = 1024 * 1024;

export const DIRECT_TOO_LARGE = "This request is larger than Gusset accepts (1 MB). Send less and try again.";
export const DIRECT_UNREADABLE = "Gusset could not read this request's address or headers. Send it again from Gusset's own page.";

/** A JSON answer given here in the API's error shape, with the headers Next would add. */
function answerJson(res, status, body, headers) {
  const text = JSON.stringify(body);
  res.writeHead(status, { ...headers, "content-type": "application/json", "content-length": Buffer.byteLength(text) });
  res.end(text);
}

/**
 * Serves the routes of scripts/direct-routes.ts (bundled by build-direct-routes.mjs) here, without Next's router:
 * the same handler functions Next would call, given a web Request of the node request and their Response written
 * back, with the security headers next.config.ts adds to every answer. Returns a function that answers a request and
 * returns true, or returns false for a request that is not one of these routes (Next's to answer).
 *
 * The body is read only when the handler asks for it, up to DIRECT_BODY_LIMIT (413 past it). A handler that throws
 * `HandToNext` (a session only better-auth can answer, before the body is read) has its request handed to `toNext`
 * untouched.
 */
export function directRouteHandler({ routes, answerHeaders, internalMessage, HandToNext }, toNext) {
  const refuse = (res, status, code, message) => answerJson(res, status, { error: { code, message } }, answerHeaders);
  return (req, res) => {
    const query = req.url.indexOf("?");
    const handler = routes[`${req.method} ${query === -1 ? req.url : req.url.slice(0, query)}`];
    if (!handler) return false;
    if (Number(req.headers["content-length"] ?? 0) > DIRECT_BODY_LIMIT) {
      refuse(res, 413, "bad-request", DIRECT_TOO_LARGE);
      req.resume();
      return true;
    }
    const state = { read: false, tooLarge: false, handedOver: false };
    let request;
    try {
      request = webRequestOf(req, state);
    } catch {
      // A Host header or header value the Fetch API refuses (Node's own parser let it through).
      refuse(res, 400, "bad-request", DIRECT_UNREADABLE);
      req.resume();
      return true;
    }
    const answer = async () => {
      let response;
      try {
        response = await handler(request, { params: Promise.resolve({}) });
      } catch (error) {
        if (!state.tooLarge && error instanceof HandToNext && !state.read) {
          state.handedOver = true; // the body is Next's to read now: it must not be drained below
          return toNext(req, res);
        }
        throw error;
      }
      if (state.tooLarge) return refuse(res, 413, "bad-request", DIRECT_TOO_LARGE);
      const bytes = Buffer.from(await response.arrayBuffer());
      const headers = { ...answerHeaders };
      for (const [name, value] of response.headers) if (name !== "set-cookie") headers[name] = value;
      const cookies = response.headers.getSetCookie();
      if (cookies.length > 0) headers["set-cookie"] = cookies;
      headers["content-length"] = String(bytes.length);
      res.writeHead(response.status, headers);
      res.end(bytes);
    };
    answer()
      .catch((error) => {
        if (state.tooLarge) return refuse(res, 413, "bad-request", DIRECT_TOO_LARGE);
        console.error(`[gusset] ${req.method} ${req.url}, served without Next, failed:`, error);
        if (res.headersSent) res.destroy();
        else refuse(res, 500, "internal", internalMessage);
      })
      .finally(() => {
        // A body nobody read is drained, so the connection can serve the next request.
        if (!state.read && !state.handedOver) req.resume();
      });
    return true;
  };
}

/**
 * The node request as a web Request. Its body is read only when the handler asks for it (`state.read`), whole, up to
 * DIRECT_BODY_LIMIT (past it `state.tooLarge`, and the rest is drained unread).
 */
function webRequestOf(req, state) {
  const headers = new Headers();
  for (const [name, value] of Object.entries(req.headers))
    for (const each of Array.isArray(value) ? value : [value]) if (each !== undefined) headers.append(name, each);
  const body = new ReadableStream(
    {
      pull: (controller) =>
        new Promise((resolve) => {
          state.read = true;
          const chunks = [];
          let size = 0;
          const settle = (error) => {
            req.off("data", onData).off("end", onEnd).off("error", settle).off("close", onClose);
            if (error) controller.error(error);
            else {
              if (size > 0) controller.enqueue(new Uint8Array(Buffer.concat(chunks, size)));
              controller.close();
            }
            resolve();
          };
          const onData = (chunk) => {
            size += chunk.length;
            if (size <= DIRECT_BODY_LIMIT) return void chunks.push(chunk);
            state.tooLarge = true;
            settle(new Error("the request body is larger than the limit"));
            req.resume();
          };
          const onEnd = () => settle(null);
          const onClose = () => {
            if (!req.complete) settle(new Error("the request was cut off"));
          };
          req.on("data", onData).on("end", onEnd).on("error", settle).on("close", onClose);
        }),
    },
    { highWaterMark: 0 }, // nothing is read until the handler asks
  );
  const withBody = req.method !== "GET" && req.method !== "HEAD";
  return new Request(new URL(req.url, `http://${req.headers.host ?? "localhost"}`), {
    method: req.method,
    headers,
    ...(withBody ? { body, duplex: "half" } : {}),
  });
}

/** The direct routes bundled for the build being served, or null (then Next serves every route) and why. */
async function loadDirectRoutes(buildId) {
  const bundledFor = directRoutesBuildId(process.cwd());
  if (!bundledFor) return { routes: null, why: `no ${DIRECT_ROUTES_FILE}` };
  if (bundledFor !== buildId) return { routes: null, why: `${DIRECT_ROUTES_FILE} was bundled for another build` };
  return { routes: await import(pathToFileURL(path.resolve(DIRECT_ROUTES_FILE)).href), why: null };
}

async function main() {
  const { values } = parseArgs({
    options: { hostname: { type: "string", default: "127.0.0.1" }, port: { type: "string", default: "3000" } },
  });
  const port = Number.parseInt(values.port, 10);
  const trusted = trustedProxyList(process.env.GUSSET_TRUSTED_PROXIES);
  // Read by lib/server-env.ts: the app believes x-gusset-client-address only under this server.
  process.env.GUSSET_CLIENT_ADDRESS_FROM_SERVER = "1";
  // Read by lib/server-env.ts: the build served, part of a calc sheet's key (a kept PDF is served without Chromium
  // only for the build that drew it, lib/use-cases/sheet-key.ts).
  const buildId = readBuildId(process.cwd());
  if (buildId) process.env.GUSSET_BUILD_ID = buildId;
  else delete process.env.GUSSET_BUILD_ID;
  const app = next({ dev: false, hostname: values.hostname, port });
  const handle = app.getRequestHandler();
  await app.prepare();
  const direct = await loadDirectRoutes(buildId);
  if (direct.why) console.warn(`[gusset] every route is served through Next: ${direct.why} (npm run build makes it)`);
  const serveDirect = direct.routes ? directRouteHandler(direct.routes, handle) : () => false;
  const server = http.createServer((req, res) => {
    const client = resolveClientAddress(req.socket.remoteAddress, req.headers["x-forwarded-for"], trusted);
    delete req.headers[CLIENT_ADDRESS_HEADER];
    if (!isTrusted(trusted, plainAddress(req.socket.remoteAddress))) delete req.headers["x-forwarded-for"];
    if (client) req.headers[CLIENT_ADDRESS_HEADER] = client;
    if (guardServerAction(req, res)) {
      req.resume();
      return;
    }
    if (serveDirect(req, res)) return;
    handle(req, res);
  });
  server.listen(port, values.hostname, () => {
    console.log(`Gusset serving on http://${values.hostname}:${port}`);
  });
  const stop = () => {
    server.close(() => process.exit(0));
    server.closeAllConnections();
  };
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
}

if (import.meta.url === `file://${process.argv[1]}`) {
  main().catch((error) => {
    console.error(error);
    process.exit(1);
  });
}
