import "server-only";
// Outgoing e-mail through SMTP (the fake SMTP server of `npm start` / `npm test`, or the firm's relay).
// Settings are read when a message is sent, not at import, so a test can point SMTP_* elsewhere.
import nodemailer, { type Transporter } from "nodemailer";

export type OutgoingMail = { to: string; subject: string; text: string; html: string };

let cached: { key: string; transporter: Transporter } | null = null;

function getTransporter(): Transporter {
  const host = process.env.SMTP_HOST ?? "127.0.0.1";
  const port = Number(process.env.SMTP_PORT ?? 2525);
  const key = `${host}:${port}`;
  if (cached?.key !== key) {
    // The loopback fake speaks plain SMTP; a real relay would be configured with TLS here.
    cached = { key, transporter: nodemailer.createTransport({ host, port, secure: false, ignoreTLS: true }) };
  }
  return cached.transporter;
}

export function getMailFrom(): string {
  return process.env.MAIL_FROM ?? "Gusset <no-reply@gusset.example>";
}

export async function sendMail(mail: OutgoingMail): Promise<{ messageId: string }> {
  const info = await getTransporter().sendMail({ from: getMailFrom(), ...mail });
  return { messageId: info.messageId };
}
