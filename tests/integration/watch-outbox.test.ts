import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { setDatabase } from "@/db/queries/connection";
import { notificationOutbox } from "@/db/schema";
import { listOutboxMessages, resendOutboxMessage } from "@/db/queries/outbox";
import { sendMail } from "@/server/mail/send";
import { createOutboxDelivery } from "@/server/mail/outbox";
import { startTestSmtp } from "./watch-smtp";
import { seedPeople } from "./jobs-fixtures";

// sendMail reads SMTP_PORT when it first connects: point it at this file's own server.
// Below Linux's ephemeral range (32768–60999): a port there can be taken by any outgoing connection first.
const port = vi.hoisted(() => {
  const chosen = 20_000 + (process.pid % 12_000);
  process.env.SMTP_PORT = String(chosen);
  process.env.MAIL_CATCHER = "on";
  return chosen;
});

const MINUTE = 60_000;
const HOUR = 60 * MINUTE;

let t: TestDatabase;
let smtp: Awaited<ReturnType<typeof startTestSmtp>>;
let ws: string;
let people: Awaited<ReturnType<typeof seedPeople>>["people"];

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  ({ workspace: { id: ws }, people } = await seedPeople(t.db));
  smtp = await startTestSmtp(port);
});

afterAll(async () => {
  await smtp?.close();
  setDatabase(null);
  t.cleanup();
});

/** A settable clock for the delivery: tests move time forward without waiting. */
function testClock(start = Date.UTC(2026, 0, 5, 9, 0, 0)) {
  let at = start;
  return { now: () => new Date(at), advance: (ms: number) => (at += ms), set: (ms: number) => (at = ms) };
}

describe("delivering the watchers' outbox", () => {
  it("sends each pending message once over SMTP, with a Message-ID made from the row, and marks it sent", async () => {
    const rows = await t.db
      .insert(notificationOutbox)
      .values([
        { workspaceId: ws, userId: people.viewer.id, toAddress: people.viewer.email, subject: "New certified map: A → B", body: "first" },
        { workspaceId: ws, userId: people.curator.id, toAddress: people.curator.email, subject: "New certified map: C → D", body: "second" },
      ])
      .returning();
    const delivery = createOutboxDelivery({ send: sendMail, messageIdDomain: "atlas.test" });
    expect(await delivery.deliverDue()).toEqual({ sent: 2, retrying: 0, failed: 0 });
    expect(await delivery.deliverDue()).toEqual({ sent: 0, retrying: 0, failed: 0 });
    // Written in one statement, the two rows share a timestamp: their order among themselves is free.
    expect(smtp.received.map((m) => [m.to[0], m.subject, m.text.trim(), m.messageId]).sort((a, b) => String(a[1]).localeCompare(String(b[1])))).toEqual([
      [people.viewer.email, "New certified map: A → B", "first", `<outbox.${rows[0].id}@atlas.test>`],
      [people.curator.email, "New certified map: C → D", "second", `<outbox.${rows[1].id}@atlas.test>`],
    ]);
    const sent = await listOutboxMessages({ workspaceId: ws, status: "sent" });
    expect(sent).toHaveLength(2);
    expect(sent.every((m) => m.attempts === 1 && m.sentAt instanceof Date && m.lastError === null && m.leaseOwner === null)).toBe(true);
  });

  it("retries a refused message with back-off for at least 24 hours, then marks it failed; an admin can send it again", async () => {
    smtp.received.length = 0;
    const clock = testClock();
    const start = clock.now().getTime();
    const [row] = await t.db
      .insert(notificationOutbox)
      .values({ workspaceId: ws, toAddress: "bounce@queue-lab.test", subject: "never arrives", body: "x" })
      .returning();
    const delivery = createOutboxDelivery({ send: sendMail, now: clock.now });
    expect(await delivery.deliverDue()).toEqual({ sent: 0, retrying: 1, failed: 0 });
    clock.advance(30_000);
    // Inside the back-off window nothing is tried.
    expect(await delivery.deliverDue()).toEqual({ sent: 0, retrying: 0, failed: 0 });
    let [pending] = await listOutboxMessages({ workspaceId: ws, status: "pending" });
    expect(pending.attempts).toBe(1);
    expect(pending.lastError).toMatch(/550/);
    expect(pending.nextAttemptAt?.getTime()).toBe(start + MINUTE);

    // Step the clock to each scheduled retry until the message is given up.
    let failedAt: number | null = null;
    for (let i = 0; i < 100 && failedAt === null; i++) {
      [pending] = await listOutboxMessages({ workspaceId: ws, status: "pending" });
      if (!pending) break;
      clock.set(pending.nextAttemptAt!.getTime());
      const report = await delivery.deliverDue();
      if (report.failed === 1) failedAt = clock.now().getTime();
    }
    expect(failedAt).not.toBeNull();
    expect(failedAt! - start).toBeGreaterThanOrEqual(24 * HOUR);
    // …but not much longer: the waits are capped at one hour.
    expect(failedAt! - start).toBeLessThan(26 * HOUR);
    const [failed] = await listOutboxMessages({ workspaceId: ws, status: "failed" });
    expect(failed.id).toBe(row.id);
    expect(failed.lastError).toMatch(/550/);
    expect(smtp.received).toEqual([]);

    expect(await resendOutboxMessage({ workspaceId: ws, id: row.id })).toBe(true);
    const [again] = await listOutboxMessages({ workspaceId: ws, status: "pending" });
    expect([again.id, again.attempts, again.nextAttemptAt]).toEqual([row.id, 0, null]);
    // Only a failed message of one's own workspace can be sent again.
    expect(await resendOutboxMessage({ workspaceId: ws, id: row.id })).toBe(false);
    expect(await resendOutboxMessage({ workspaceId: "another-workspace", id: row.id })).toBe(false);
    await t.db.delete(notificationOutbox);
  });

  it("never lets two delivering processes send the same row: each claim holds a lease", async () => {
    smtp.received.length = 0;
    const values = Array.from({ length: 12 }, (_, i) => ({ workspaceId: ws, toAddress: `reader${i}@queue-lab.test`, subject: `lease ${i}`, body: String(i) }));
    await t.db.insert(notificationOutbox).values(values);
    const a = createOutboxDelivery({ send: sendMail, owner: "process-a", batch: 5 });
    const b = createOutboxDelivery({ send: sendMail, owner: "process-b", batch: 5 });
    const reports = [];
    for (let i = 0; i < 3; i++) reports.push(...(await Promise.all([a.deliverDue(), b.deliverDue()])));
    expect(reports.reduce((n, r) => n + r.sent, 0)).toBe(12);
    expect(smtp.received.map((m) => m.subject).sort()).toEqual(values.map((v) => v.subject).sort());
    await t.db.delete(notificationOutbox);
  });
});
