import "server-only";
// Outgoing e-mail through SMTP (the fake SMTP server of `npm start` / `npm test`, or the firm's relay).
// Only the worker sends (lib/jobs/worker.ts); the app queues mail in the transaction that caused it.
import nodemailer, { type Transporter } from "nodemailer";
import { serverEnv } from "@/lib/server-env";

export type OutgoingMail = { to: string; subject: string; text: string; html: string };

let cached: { key: string; transporter: Transporter } | null = null;

function getTransporter(): Transporter {
  const { SMTP_HOST: host, SMTP_PORT: port } = serverEnv();
  const key = `${host}:${port}`;
  if (cached?.key !== key) {
    // The loopback fake speaks plain SMTP; a real relay would be configured with TLS here.
    cached = { key, transporter: nodemailer.createTransport({ host, port, secure: false, ignoreTLS: true }) };
  }
  return cached.transporter;
}

export function getMailFrom(): string {
  return serverEnv().MAIL_FROM;
}

export async function sendMail(mail: OutgoingMail): Promise<{ messageId: string }> {
  const info = await getTransporter().sendMail({ from: getMailFrom(), ...mail });
  return { messageId: info.messageId };
}
