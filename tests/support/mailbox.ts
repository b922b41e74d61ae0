// Client for the fake SMTP's HTTP API (scripts/fake-smtp.mjs): what the app sent, newest first.
import { testEnv } from "./env";

export type CapturedMessage = {
  id: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
  date: string;
};

async function api(pathname: string, init?: RequestInit): Promise<Response> {
  const response = await fetch(new URL(pathname, testEnv.mailApiUrl), init);
  if (!response.ok) throw new Error(`mail API ${init?.method ?? "GET"} ${pathname} answered ${response.status}`);
  return response;
}

export async function listMessages(): Promise<CapturedMessage[]> {
  return (await (await api("/messages")).json()) as CapturedMessage[];
}

export async function clearMessages(): Promise<void> {
  await api("/messages", { method: "DELETE" });
}

export type MessageQuery = { to?: string; subjectIncludes?: string; timeoutMs?: number };

function matches(message: CapturedMessage, { to, subjectIncludes }: MessageQuery): boolean {
  const toMatches = !to || message.to.some((address) => address.toLowerCase() === to.toLowerCase());
  return toMatches && (!subjectIncludes || message.subject.includes(subjectIncludes));
}

/** The newest message matching the query; polls until it arrives or throws after timeoutMs (10 s). */
export async function waitForMessage(query: MessageQuery = {}): Promise<CapturedMessage> {
  const deadline = Date.now() + (query.timeoutMs ?? 10_000);
  for (;;) {
    const found = (await listMessages()).find((message) => matches(message, query));
    if (found) return found;
    if (Date.now() > deadline) {
      throw new Error(
        `no e-mail${query.to ? ` to ${query.to}` : ""}${query.subjectIncludes ? ` with "${query.subjectIncludes}"` : ""} arrived in time`,
      );
    }
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

/** The first http(s) link in a message's text (or HTML), e.g. an invitation or reset link. */
export function firstLink(message: CapturedMessage): string {
  const link = /https?:\/\/[^\s"'<>]+/.exec(message.text || message.html);
  if (!link) throw new Error(`message "${message.subject}" contains no link`);
  return link[0].replace(/&amp;/g, "&");
}
