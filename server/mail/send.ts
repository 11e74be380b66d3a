import nodemailer, { type Transporter } from "nodemailer";
import { env } from "@/env";

export type OutgoingMail = {
  to: string;
  subject: string;
  text: string;
  html?: string;
  /** A fixed Message-ID (the outbox's stable id); nodemailer makes one up when absent. */
  messageId?: string;
  /** One-click unsubscribe address: sent as List-Unsubscribe (RFC 2369) with List-Unsubscribe-Post (RFC 8058). */
  unsubscribeUrl?: string;
};

const globalForMail = globalThis as unknown as { squarelyMailTransport?: Transporter };

function transport(): Transporter {
  globalForMail.squarelyMailTransport ??= nodemailer.createTransport({
    host: env.SMTP_HOST,
    port: env.SMTP_PORT,
    secure: env.SMTP_SECURE,
    auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASS ?? "" } : undefined,
    // The local catcher speaks plain SMTP on the loopback interface; a real host negotiates TLS.
    ignoreTLS: env.MAIL_CATCHER === "on" && !env.SMTP_SECURE,
    // Bounded waits, all well below the outbox lease (server/mail/outbox.ts LEASE_MS).
    connectionTimeout: 30_000,
    greetingTimeout: 30_000,
    socketTimeout: 60_000,
  });
  return globalForMail.squarelyMailTransport;
}

/** Sends one message over SMTP (the local catcher in demo and tests, a real host in production). */
export async function sendMail({ to, subject, text, html, messageId, unsubscribeUrl }: OutgoingMail): Promise<{ messageId: string }> {
  const headers: Record<string, string> = {};
  if (unsubscribeUrl) {
    headers["List-Unsubscribe"] = `<${unsubscribeUrl}>`;
    headers["List-Unsubscribe-Post"] = "List-Unsubscribe=One-Click";
  }
  const info = await transport().sendMail({ from: env.MAIL_FROM, to, subject, text, html, messageId, headers });
  return { messageId: info.messageId };
}
