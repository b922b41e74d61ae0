import "server-only";
// The demo mailbox: e-mails caught by the fake SMTP server of `npm start`, shown to admins so that
// someone trying Gusset can follow an invitation link. Absent when real mail is configured.
import { z } from "zod";
import { AppError } from "@/lib/domain/errors";
import { serverEnv } from "@/lib/server-env";

const capturedMailSchema = z.object({
  id: z.union([z.string(), z.number()]).transform(String),
  from: z
    .string()
    .nullish()
    .transform((v) => v ?? ""),
  to: z.array(z.string()).catch([]),
  subject: z
    .string()
    .nullish()
    .transform((v) => v ?? ""),
  text: z
    .string()
    .nullish()
    .transform((v) => v ?? ""),
  html: z
    .string()
    .nullish()
    .transform((v) => v ?? ""),
  date: z
    .string()
    .nullish()
    .transform((v) => v ?? ""),
});
export type CapturedMailDto = z.infer<typeof capturedMailSchema>;

/** True while the fake SMTP server is in use (FAKE_MAIL_API_URL is set by the start script). */
export function isMailboxEnabled(): boolean {
  return serverEnv().FAKE_MAIL_API_URL !== undefined;
}

/** Newest first; null when the fake SMTP server is not in use. Callers check mailbox.read. */
export async function listCapturedMail(): Promise<CapturedMailDto[] | null> {
  const base = serverEnv().FAKE_MAIL_API_URL;
  if (!base) return null;
  let body: unknown;
  try {
    const response = await fetch(`${base.replace(/\/+$/, "")}/messages`, { cache: "no-store" });
    if (!response.ok) throw new Error(`fake mail API answered ${response.status}`);
    body = await response.json();
  } catch (error) {
    console.error("[gusset] could not read the demo mailbox:", error);
    throw new AppError("internal", "The demo mailbox is not answering. Restart `npm start` if this persists.");
  }
  const parsed = z.array(capturedMailSchema).safeParse(body);
  if (!parsed.success) {
    console.error("[gusset] unexpected demo mailbox answer:", parsed.error);
    throw new AppError("internal", "The demo mailbox answered in an unexpected form.");
  }
  return parsed.data;
}
