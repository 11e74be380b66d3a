import { spawn } from "node:child_process";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { eq } from "drizzle-orm";
import { setDatabase } from "@/db/queries/connection";
import { createCertifiedEdge } from "@/db/queries/maps";
import { listOutboxMessages } from "@/db/queries/outbox";
import { addWatchRule } from "@/db/queries/watches";
import { notificationOutbox, notifications } from "@/db/schema";
import { LEASE_MS, createOutboxDelivery } from "@/server/mail/outbox";
import { sendMail } from "@/server/mail/send";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { edgeInput, seedAtlasPeople } from "./atlas-fixtures";
import { startTestSmtp, type Received } from "./watch-smtp";

// Below Linux's ephemeral range (32768–60999): a port there can be taken by any outgoing connection first.
const port = vi.hoisted(() => {
  const chosen = 20_000 + ((process.pid + 13) % 12_000);
  process.env.SMTP_PORT = String(chosen);
  process.env.MAIL_CATCHER = "on";
  return chosen;
});

const MINUTE = 60_000;
const ROOT = new URL("../../", import.meta.url).pathname;

let t: TestDatabase;
let seeded: Awaited<ReturnType<typeof seedAtlasPeople>>;

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  seeded = await seedAtlasPeople(t.db, "fault-lab");
});

afterAll(() => {
  setDatabase(null);
  t.cleanup();
});

describe("mail faults", () => {
  it("SMTP down while three maps are certified, back 10 minutes (test clock) later: every watcher's mail arrives, none twice", async () => {
    const ws = seeded.workspace.id;
    // The viewer watches every ECA; the curator watches anything that coarse-grains onto ECA 128.
    await addWatchRule({ workspaceId: ws, userId: seeded.people.viewer.id, scope: "class", modelKind: "eca" });
    const first = await createCertifiedEdge(edgeInput(ws, seeded.people.contributor.id, 146, 128, 3));
    const onto = (await t.db.query.maps.findFirst({ where: (m, { eq: is }) => is(m.id, first.mapId) }))!.targetModelId;
    await addWatchRule({ workspaceId: ws, userId: seeded.people.curator.id, scope: "onto", modelId: onto });
    await t.db.delete(notificationOutbox);
    await t.db.delete(notifications);

    let at = Date.UTC(2026, 2, 2, 8, 0, 0);
    const delivery = createOutboxDelivery({ send: sendMail, now: () => new Date(at) });
    // No SMTP server listens: the three certifications happen while mail cannot go out.
    const mapIds: string[] = [];
    for (const from of [150, 178, 232]) mapIds.push((await createCertifiedEdge({ ...edgeInput(ws, seeded.people.contributor.id, from, 128, 2), linkBase: "http://atlas.test" })).mapId);
    const stop = at + 10 * MINUTE;
    while (at < stop) {
      const report = await delivery.deliverDue();
      expect(report.sent).toBe(0);
      at += MINUTE;
    }
    const waiting = await listOutboxMessages({ workspaceId: ws, status: "pending" });
    expect(waiting).toHaveLength(6);
    expect(waiting.every((m) => m.attempts >= 3 && /ECONNREFUSED|connect/i.test(m.lastError ?? ""))).toBe(true);

    const smtp = await startTestSmtp(port);
    try {
      for (let i = 0; i < 40; i++, at += MINUTE) await delivery.deliverDue();
      const got = smtp.received.map((m) => `${m.to[0]} ${m.subject}`).sort();
      const expected = ["150", "178", "232"].flatMap((r) => [
        `${seeded.people.curator.email} Certified: ECA ${r} → ECA 128, coarse-graining at block 2`,
        `${seeded.people.viewer.email} Certified: ECA ${r} → ECA 128, coarse-graining at block 2`,
      ]);
      expect(got).toEqual(expected.sort());
      expect(new Set(smtp.received.map((m) => m.messageId)).size).toBe(6);
      expect(smtp.received.every((m) => m.listUnsubscribe?.startsWith("<http://atlas.test/unsubscribe?"))).toBe(true);
      expect(await listOutboxMessages({ workspaceId: ws, status: "pending" })).toEqual([]);
      expect((await t.db.select().from(notifications).all()).filter((n) => mapIds.includes(n.mapId ?? ""))).toHaveLength(6);
    } finally {
      await smtp.close();
    }
  });

  it("a process killed (SIGKILL) between send and mark-sent: after restart the message goes out once more, with the same Message-ID", async () => {
    await t.db.delete(notificationOutbox);
    const [row] = await t.db
      .insert(notificationOutbox)
      .values({ workspaceId: seeded.workspace.id, toAddress: seeded.people.viewer.email, subject: "crash between send and mark", body: "once or twice" })
      .returning();
    const smtp = await startTestSmtp(port);
    try {
      const child = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", "tests/integration/outbox-crash-child.ts"], {
        cwd: ROOT,
        env: { ...process.env, DATABASE_URL: t.url, SMTP_PORT: String(port), MAIL_CATCHER: "on" },
        stdio: ["ignore", "pipe", "pipe"],
      });
      let output = "";
      child.stderr.on("data", (d) => (output += d));
      const exited = new Promise<NodeJS.Signals | null>((resolve) => child.once("exit", (_code, signal) => resolve(signal)));
      await new Promise<void>((resolve, reject) => {
        const timer = setTimeout(() => reject(new Error(`the child never sent; its output:\n${output}`)), 90_000);
        child.stdout.on("data", (d) => {
          if (String(d).includes(`SENT ${row.id}`)) {
            clearTimeout(timer);
            resolve();
          }
        });
      });
      child.kill("SIGKILL");
      expect(await exited).toBe("SIGKILL");
      expect(smtp.received).toHaveLength(1);
      const [afterCrash] = await t.db.select().from(notificationOutbox).where(eq(notificationOutbox.id, row.id));
      expect([afterCrash.status, afterCrash.leaseOwner]).toEqual(["pending", "doomed-process"]);

      // Restarted: while the dead process's lease lasts nobody sends; once it ends, the row goes out again.
      const claimedAt = afterCrash.leaseExpiresAt!.getTime() - LEASE_MS;
      let at = claimedAt + LEASE_MS - 1_000;
      const restarted = createOutboxDelivery({ send: sendMail, messageIdDomain: "atlas.test", now: () => new Date(at) });
      expect(await restarted.deliverDue()).toEqual({ sent: 0, retrying: 0, failed: 0 });
      at = claimedAt + LEASE_MS + 1_000;
      expect(await restarted.deliverDue()).toEqual({ sent: 1, retrying: 0, failed: 0 });
      expect(await restarted.deliverDue()).toEqual({ sent: 0, retrying: 0, failed: 0 });

      const ids = smtp.received.map((m: Received) => m.messageId);
      expect(ids).toEqual([`<outbox.${row.id}@atlas.test>`, `<outbox.${row.id}@atlas.test>`]);
      const [done] = await t.db.select().from(notificationOutbox).where(eq(notificationOutbox.id, row.id));
      expect(done.status).toBe("sent");
    } finally {
      await smtp.close();
    }
  }, 120_000);
});
