// Fake SMTP server for local runs and tests: accepts every message on loopback, keeps it in memory, and
// lists it through a small HTTP API (used by tests/support/mailbox.ts and the admin mailbox page).
//   node scripts/fake-smtp.mjs --smtp-port 2525 --api-port 2580 [--parent-pid N]
//   GET /messages → newest first [{ id, from, to, subject, text, html, date }]
//   GET /messages/:id, DELETE /messages, DELETE /messages/:id, GET /health
import http from "node:http";
import { parseArgs } from "node:util";
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";
import { exitOnSignals, exitWithParent } from "./lib/watch-parent.mjs";

const { values } = parseArgs({
  options: {
    "smtp-port": { type: "string", default: "2525" },
    "api-port": { type: "string", default: "2580" },
    "parent-pid": { type: "string" },
  },
});
const smtpPort = Number(values["smtp-port"]);
const apiPort = Number(values["api-port"]);
const KEEP_AT_MOST = 1000;

/** @type {{ id: string, from: string, to: string[], subject: string, text: string, html: string, date: string }[]} */
let messages = [];
let nextId = 1;

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ["STARTTLS"],
  logger: false,
  banner: "Gusset fake SMTP",
  size: 25 * 1024 * 1024,
  onData(stream, session, callback) {
    simpleParser(stream)
      .then((parsed) => {
        const message = {
          id: String(nextId++),
          from: parsed.from?.text || session.envelope.mailFrom?.address || "",
          to: session.envelope.rcptTo.map((r) => r.address),
          subject: parsed.subject ?? "",
          text: parsed.text ?? "",
          html: typeof parsed.html === "string" ? parsed.html : "",
          date: new Date().toISOString(),
        };
        messages = [message, ...messages].slice(0, KEEP_AT_MOST);
        console.log(`received #${message.id} to ${message.to.join(", ")}: ${message.subject}`);
        callback();
      })
      .catch((error) => callback(error));
  },
});
smtp.on("error", (error) => console.error("smtp error:", error.message));

function sendJson(res, status, body) {
  res.writeHead(status, { "content-type": "application/json; charset=utf-8", "cache-control": "no-store" });
  res.end(JSON.stringify(body));
}

const api = http.createServer((req, res) => {
  const { pathname } = new URL(req.url ?? "/", "http://127.0.0.1");
  const one = /^\/messages\/([^/]+)$/.exec(pathname);
  if (req.method === "GET" && pathname === "/health") return sendJson(res, 200, { service: "gusset-fake-smtp", smtpPort });
  if (req.method === "GET" && pathname === "/messages") return sendJson(res, 200, messages);
  if (req.method === "DELETE" && pathname === "/messages") {
    messages = [];
    return sendJson(res, 200, { deleted: true });
  }
  if (one) {
    const found = messages.find((m) => m.id === decodeURIComponent(one[1]));
    if (!found) return sendJson(res, 404, { error: { code: "not_found", message: "No such message" } });
    if (req.method === "GET") return sendJson(res, 200, found);
    if (req.method === "DELETE") {
      messages = messages.filter((m) => m !== found);
      return sendJson(res, 200, { deleted: true });
    }
  }
  sendJson(res, 404, { error: { code: "not_found", message: "Unknown route" } });
});

smtp.listen(smtpPort, "127.0.0.1", () => {
  api.listen(apiPort, "127.0.0.1", () => {
    console.log(`fake SMTP on 127.0.0.1:${smtpPort}, mail API on http://127.0.0.1:${apiPort}`);
  });
});
api.on("error", (error) => {
  console.error("mail API error:", error.message);
  process.exit(1);
});

const stop = exitOnSignals(() => new Promise((resolve) => smtp.close(() => api.close(() => resolve()))));
exitWithParent(Number(values["parent-pid"]), stop);
