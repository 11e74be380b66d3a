import nodemailer, { type Transporter } from "nodemailer";
import { env } from "@/env";

export type OutgoingMail = { to: string; subject: string; text: string; html?: string };

const globalForMail = globalThis as unknown as { squarelyMailTransport?: Transporter };

function transport(): Transporter {
  globalForMail.squarelyMailTransport ??= nodemailer.createTransport({
    host: env.SMTP_HOST,
    port: env.SMTP_PORT,
    secure: env.SMTP_SECURE,
    auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASS ?? "" } : undefined,
    // The local catcher speaks plain SMTP on the loopback interface; a real host negotiates TLS.
    ignoreTLS: env.MAIL_CATCHER === "on" && !env.SMTP_SECURE,
  });
  return globalForMail.squarelyMailTransport;
}

/** Sends one message over SMTP (the local catcher in demo and tests, a real host in production). */
export async function sendMail({ to, subject, text, html }: OutgoingMail): Promise<{ messageId: string }> {
  const info = await transport().sendMail({ from: env.MAIL_FROM, to, subject, text, html });
  return { messageId: info.messageId };
}
