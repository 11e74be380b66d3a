import type { Database } from "@/db/client";
import { listPendingOutbox, markOutboxSent, recordOutboxFailure } from "@/db/queries/outbox";
import type { OutgoingMail } from "./send";

export const MAX_DELIVERY_ATTEMPTS = 5;
/** Wait before retry n (1-based): 10 s, 20 s, 40 s, 80 s. */
export const RETRY_BASE_MS = 10_000;

export type DeliveryOptions = {
  db?: Database;
  send: (mail: OutgoingMail) => Promise<unknown>;
  /** @default MAX_DELIVERY_ATTEMPTS */
  maxAttempts?: number;
  /** @default RETRY_BASE_MS */
  retryBaseMs?: number;
  /** @default 50 */
  batch?: number;
};

export type DeliveryReport = { sent: number; retrying: number; failed: number };

export type OutboxDelivery = {
  /** One pass over the pending messages that are due; passes never overlap. */
  deliverDue(): Promise<DeliveryReport>;
  start(intervalMs?: number): void;
  stop(): void;
};

/**
 * Delivers notification_outbox rows: the rows were written in the same transaction as the event
 * (so no event is lost and none is mailed for a write that rolled back); here each one is sent once
 * and marked sent, or retried with exponential back-off and marked failed after the last attempt.
 * The back-off schedule is kept in memory, so after a restart a pending message is tried at once.
 * One process delivers; several instances would need a claim column first.
 */
export function createOutboxDelivery(options: DeliveryOptions): OutboxDelivery {
  const maxAttempts = options.maxAttempts ?? MAX_DELIVERY_ATTEMPTS;
  const retryBaseMs = options.retryBaseMs ?? RETRY_BASE_MS;
  const notBefore = new Map<string, number>();
  let running: Promise<DeliveryReport> | null = null;
  let timer: NodeJS.Timeout | undefined;

  async function pass(): Promise<DeliveryReport> {
    const report: DeliveryReport = { sent: 0, retrying: 0, failed: 0 };
    const now = Date.now();
    for (const message of await listPendingOutbox({ db: options.db, limit: options.batch ?? 50 })) {
      if ((notBefore.get(message.id) ?? 0) > now) continue;
      try {
        await options.send({ to: message.toAddress, subject: message.subject, text: message.body });
        await markOutboxSent({ db: options.db, id: message.id });
        notBefore.delete(message.id);
        report.sent++;
      } catch (err) {
        const reason = err instanceof Error ? err.message : String(err);
        const row = await recordOutboxFailure({ db: options.db, id: message.id, error: reason, maxAttempts });
        if (row?.status === "failed") {
          notBefore.delete(message.id);
          report.failed++;
          console.warn(`mail to ${message.toAddress} given up after ${row.attempts} attempts: ${reason}`);
        } else {
          notBefore.set(message.id, Date.now() + retryBaseMs * 2 ** ((row?.attempts ?? 1) - 1));
          report.retrying++;
        }
      }
    }
    return report;
  }

  function deliverDue(): Promise<DeliveryReport> {
    running ??= pass().finally(() => {
      running = null;
    });
    return running;
  }

  return {
    deliverDue,
    start(intervalMs = 5_000) {
      if (timer) return;
      timer = setInterval(() => void deliverDue().catch((err) => console.error("mail outbox:", err)), intervalMs);
      timer.unref();
    },
    stop() {
      clearInterval(timer);
      timer = undefined;
    },
  };
}
