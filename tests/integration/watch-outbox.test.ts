import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { setDatabase } from "@/db/queries/connection";
import { notificationOutbox } from "@/db/schema";
import { listOutboxMessages } from "@/db/queries/outbox";
import { sendMail } from "@/server/mail/send";
import { createOutboxDelivery } from "@/server/mail/outbox";
import { startTestSmtp } from "./watch-smtp";
import { seedPeople } from "./jobs-fixtures";

// sendMail reads SMTP_PORT when it first connects: point it at this file's own server.
const port = vi.hoisted(() => {
  const chosen = 30_000 + (process.pid % 20_000);
  process.env.SMTP_PORT = String(chosen);
  process.env.MAIL_CATCHER = "on";
  return chosen;
});

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
  await smtp.close();
  setDatabase(null);
  t.cleanup();
});

describe("delivering the watchers' outbox", () => {
  it("sends each pending message once over SMTP and marks it sent", async () => {
    await t.db.insert(notificationOutbox).values([
      { workspaceId: ws, userId: people.viewer.id, toAddress: people.viewer.email, subject: "New certified map: A → B", body: "first" },
      { workspaceId: ws, userId: people.curator.id, toAddress: people.curator.email, subject: "New certified map: C → D", body: "second" },
    ]);
    const delivery = createOutboxDelivery({ send: sendMail });
    expect(await delivery.deliverDue()).toEqual({ sent: 2, retrying: 0, failed: 0 });
    expect(await delivery.deliverDue()).toEqual({ sent: 0, retrying: 0, failed: 0 });
    // Written in one statement, the two rows share a timestamp: their order among themselves is free.
    expect(smtp.received.map((m) => [m.to[0], m.subject, m.text.trim()]).sort((a, b) => a[1].localeCompare(b[1]))).toEqual([
      [people.viewer.email, "New certified map: A → B", "first"],
      [people.curator.email, "New certified map: C → D", "second"],
    ]);
    const sent = await listOutboxMessages({ workspaceId: ws, status: "sent" });
    expect(sent).toHaveLength(2);
    expect(sent.every((m) => m.attempts === 1 && m.sentAt instanceof Date && m.lastError === null)).toBe(true);
  });

  it("retries a refused message with back-off and gives it up as failed after the last attempt", async () => {
    smtp.received.length = 0;
    const [row] = await t.db
      .insert(notificationOutbox)
      .values({ workspaceId: ws, toAddress: "bounce@queue-lab.test", subject: "never arrives", body: "x" })
      .returning();
    const delivery = createOutboxDelivery({ send: sendMail, maxAttempts: 3, retryBaseMs: 300 });
    expect(await delivery.deliverDue()).toEqual({ sent: 0, retrying: 1, failed: 0 });
    // Inside the back-off window nothing is tried.
    expect(await delivery.deliverDue()).toEqual({ sent: 0, retrying: 0, failed: 0 });
    let [pending] = await listOutboxMessages({ workspaceId: ws, status: "pending" });
    expect(pending.id).toBe(row.id);
    expect(pending.attempts).toBe(1);
    expect(pending.lastError).toMatch(/550/);
    await new Promise((r) => setTimeout(r, 400));
    expect(await delivery.deliverDue()).toEqual({ sent: 0, retrying: 1, failed: 0 });
    await new Promise((r) => setTimeout(r, 700));
    expect(await delivery.deliverDue()).toEqual({ sent: 0, retrying: 0, failed: 1 });
    [pending] = await listOutboxMessages({ workspaceId: ws, status: "failed" });
    expect(pending.attempts).toBe(3);
    expect(smtp.received).toEqual([]);
  });
});
