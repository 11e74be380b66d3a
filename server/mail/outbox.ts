import { randomUUID } from "node:crypto";
import type { Database } from "@/db/client";
import { claimDueOutbox, markOutboxSent, recordOutboxFailure } from "@/db/queries/outbox";
import type { OutboxMessage } from "@/db/schema";
import type { OutgoingMail } from "./send";

/** First retry after one minute, doubling, at most one hour apart (common practice for mail retries). */
export const RETRY_BASE_MS = 60_000;
export const RETRY_CAP_MS = 60 * 60_000;
/** A message is retried for at least this long after its first failure before it is marked failed. */
export const RETRY_WINDOW_MS = 24 * 60 * 60_000;
/**
 * How long a claim lasts. Longer than one SMTP exchange can take (send.ts bounds the connection,
 * greeting and socket waits well below it), so a live sender never loses its claim mid-send.
 */
export const LEASE_MS = 5 * 60_000;

/** The wait before retry `attempt` (1 = after the first failure). */
export function retryDelayMs(attempt: number, base = RETRY_BASE_MS, cap = RETRY_CAP_MS): number {
  return Math.min(cap, base * 2 ** Math.max(0, attempt - 1));
}

/** Total waiting after `attempts` failures: the retry window is spent when this reaches RETRY_WINDOW_MS. */
export function retrySpanMs(attempts: number, base = RETRY_BASE_MS, cap = RETRY_CAP_MS): number {
  let total = 0;
  for (let n = 1; n <= attempts; n++) total += retryDelayMs(n, base, cap);
  return total;
}

/**
 * The Message-ID of an outbox row (RFC 5322 §3.6.4): derived from the row id alone, so every
 * attempt to send the row, before or after a crash, carries the same id.
 */
export function outboxMessageId(rowId: string, domain: string): string {
  return `<outbox.${rowId}@${domain}>`;
}

export type DeliveryOptions = {
  db?: Database;
  send: (mail: OutgoingMail) => Promise<unknown>;
  /** The clock; tests pass their own. @default () => new Date() */
  now?: () => Date;
  /** This process's name in the lease column. @default a random id */
  owner?: string;
  /** @default RETRY_BASE_MS */
  retryBaseMs?: number;
  /** @default RETRY_WINDOW_MS */
  retryWindowMs?: number;
  /** @default LEASE_MS */
  leaseMs?: number;
  /** @default 50 */
  batch?: number;
  /** Right part of each Message-ID. @default "squarely.local" */
  messageIdDomain?: string;
  /** Runs at the start of each pass with the pass's time (the daily digests queue their mail here). */
  beforePass?: (now: Date) => Promise<unknown>;
  /** Called between a successful send and marking the row sent (crash tests only). */
  afterSend?: (message: OutboxMessage) => Promise<void> | void;
};

export type DeliveryReport = { sent: number; retrying: number; failed: number };

export type OutboxDelivery = {
  /** One pass over the messages that are due; passes of one process never overlap. */
  deliverDue(): Promise<DeliveryReport>;
  start(intervalMs?: number): void;
  stop(): void;
};

/**
 * Delivers notification_outbox rows. The rows were written in the same transaction as the event, so
 * none is lost and none is mailed for a write that rolled back. Each pass claims due rows with a
 * lease (so two processes never send the same row at once), sends each, and marks it sent, or
 * schedules a retry with back-off (1 min doubling to 1 h) until the retry window (24 h) is spent.
 *
 * Guarantee: at-least-once with a stable Message-ID. A crash after the SMTP server accepted a
 * message and before it was marked sent leaves the row pending; once the lease runs out it is sent
 * again, with the same Message-ID, so the duplicate is recognisable (and mail systems that
 * de-duplicate on Message-ID drop it). Exactly-once is impossible over SMTP, which has no
 * idempotency key a sender could check before sending.
 */
export function createOutboxDelivery(options: DeliveryOptions): OutboxDelivery {
  const now = options.now ?? (() => new Date());
  const owner = options.owner ?? `outbox-${randomUUID()}`;
  const base = options.retryBaseMs ?? RETRY_BASE_MS;
  const window = options.retryWindowMs ?? RETRY_WINDOW_MS;
  const domain = options.messageIdDomain ?? "squarely.local";
  let running: Promise<DeliveryReport> | null = null;
  let timer: NodeJS.Timeout | undefined;

  function retryAt(message: OutboxMessage, at: Date): Date | null {
    const attempts = message.attempts + 1;
    if (retrySpanMs(attempts - 1, base) >= window) return null;
    return new Date(at.getTime() + retryDelayMs(attempts, base));
  }

  async function deliverOne(message: OutboxMessage, report: DeliveryReport): Promise<void> {
    try {
      await options.send({
        to: message.toAddress,
        subject: message.subject,
        text: message.body,
        messageId: outboxMessageId(message.id, domain),
        unsubscribeUrl: message.unsubscribeUrl ?? undefined,
      });
    } catch (err) {
      const reason = err instanceof Error ? err.message : String(err);
      const row = await recordOutboxFailure({ db: options.db, id: message.id, owner, error: reason, retryAt: retryAt(message, now()) });
      if (row?.status === "failed") {
        report.failed++;
        console.warn(`mail to ${message.toAddress} given up after ${row.attempts} attempts: ${reason}`);
      } else report.retrying++;
      return;
    }
    await options.afterSend?.(message);
    await markOutboxSent({ db: options.db, id: message.id, now: now() });
    report.sent++;
  }

  async function pass(): Promise<DeliveryReport> {
    const report: DeliveryReport = { sent: 0, retrying: 0, failed: 0 };
    // A failing digest query must not hold up the mail that is already queued.
    await options.beforePass?.(now()).catch((err: unknown) => console.error("mail outbox: before the pass:", err));
    const claimed = await claimDueOutbox({ db: options.db, owner, now: now(), leaseMs: options.leaseMs ?? LEASE_MS, limit: options.batch ?? 50 });
    for (const message of claimed) await deliverOne(message, report);
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
