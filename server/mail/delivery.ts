import type { Database } from "@/db/client";
import { env } from "@/env";
import { queueDigests } from "./digest";
import { createOutboxDelivery, type OutboxDelivery } from "./outbox";
import { sendMail, type OutgoingMail } from "./send";

export type MailDeliveryOptions = {
  db: Database;
  /** How often the outbox is looked at. @default 5000 */
  intervalMs?: number;
  /** The sender. @default sendMail (SMTP as configured) */
  send?: (mail: OutgoingMail) => Promise<unknown>;
};

/**
 * The watchers' mail delivery of one app process: digests queued and due outbox rows sent every
 * `intervalMs`, and one pass at once. Every app process runs one; the outbox claims (a lease per
 * row) keep two processes from sending the same row.
 */
export function startMailDelivery({ db, intervalMs = 5_000, send = sendMail }: MailDeliveryOptions): OutboxDelivery {
  const outbox = createOutboxDelivery({ db, send, messageIdDomain: new URL(env.APP_URL).hostname, beforePass: queueDigests });
  outbox.start(intervalMs);
  void outbox.deliverDue().catch((err) => console.error("mail outbox:", err));
  return outbox;
}
