import { and, eq } from "drizzle-orm";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { addWatchRule } from "@/db/queries/watches";
import { notificationOutbox, notifications } from "@/db/schema";
import { DEMO_WORKSPACE } from "@/db/seed/people";
import { launchBrowser, screenshotWidths, signedInPage, startTestServer, type TestServer } from "@/tests/support";

let server: TestServer;
let browser: Browser;
/** Set SHOTS_DIR to keep screenshots of the pages this test visits (never committed). */
const SHOTS = process.env.SHOTS_DIR;

const person = (role: string) => server.person(role);

const signedIn = (role: string): Promise<Page> => signedInPage(browser, server.url, person(role), { width: 1366 });

async function shoot(page: Page, name: string): Promise<void> {
  if (SHOTS) await screenshotWidths(page, SHOTS, name);
}

/** A JSON request from the signed-in page itself (same origin, its session cookie). */
async function api(page: Page, path: string, body: unknown): Promise<{ status: number; json: Record<string, unknown> }> {
  return page.evaluate(
    async ([p, b]) => {
      const res = await fetch(p as string, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(b) });
      return { status: res.status, json: (await res.json()) as Record<string, unknown> };
    },
    [path, body] as const,
  );
}

function linkIn(text: string, pattern: RegExp): string {
  const match = pattern.exec(text);
  if (!match) throw new Error(`no link ${pattern} in:\n${text}`);
  return match[0];
}

beforeAll(async () => {
  server = await startTestServer();
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

describe("a team of two watching, and a third invited", () => {
  it("B watches ECA 128; A certifies ECA 146 → ECA 128; B gets exactly one mail whose link opens the certificate page; the unsubscribe link, signed out, stops further mail", async () => {
    const a = await signedIn("contributor");
    const b = await signedIn("viewer");
    const bEmail = person("viewer").email;

    const model = await api(a, "/api/models", { model: { kind: "eca", rule: 128 } });
    expect([200, 201]).toContain(model.status);
    const modelId = String((model.json.model as { id?: string } | undefined)?.id ?? model.json.id);
    await b.goto(`${server.url}/atlas/models/${modelId}`);
    await b.getByRole("button", { name: /^Watch/ }).click();
    await b.locator('button[aria-pressed="true"]').waitFor();

    // Rule 146 onto rule 128 at block 3, the block 111 mapping to 1 (Israeli & Goldenfeld, PRE 73, 026203, 2006).
    const made = await api(a, "/api/certificates", { build: { kind: "projection", rule: 146, block: 3, projection: [0, 0, 0, 0, 0, 0, 0, 1] } });
    expect(made.status).toBe(201);
    const mapId = String(made.json.mapId);

    const mail = await server.waitForMail((m) => m.to.includes(bEmail), 60_000);
    expect(mail.subject).toBe("Certified: ECA 146 → ECA 128, projection at block 3");
    expect(mail.text).toContain(`By: ${person("contributor").name}`);
    expect(mail.text).toContain("Block size: 3");
    expect(mail.messageId).toMatch(/^<outbox\.[0-9a-f-]+@127\.0\.0\.1>$/);
    const certificateLink = linkIn(mail.text, new RegExp(`${server.url.replace(/[.:/]/g, "\\$&")}/atlas/maps/[0-9a-f-]+`));
    expect(certificateLink).toBe(`${server.url}/atlas/maps/${mapId}`);
    const unsubscribe = linkIn(mail.text, /http:\/\/127\.0\.0\.1:\d+\/unsubscribe\?\S+/);
    expect(mail.listUnsubscribe).toBe(`<${unsubscribe}>`);

    await b.goto(certificateLink);
    await b.getByText(String(made.json.address), { exact: true }).first().waitFor();
    await b.goto(`${server.url}/notifications`);
    await expect(b.getByTestId("unread-count").textContent()).resolves.toBe("1");
    await expect(b.getByRole("link", { name: `${person("contributor").name} certified ECA 146 → ECA 128, projection at block 3` }).count()).resolves.toBe(1);
    await shoot(b, "notifications");

    const anonymous = await (await browser.newContext()).newPage();
    await anonymous.goto(unsubscribe);
    await expect(anonymous.locator("h1").textContent()).resolves.toBe("Unsubscribed");
    await anonymous.context().close();

    // ECA 128 onto itself at block 2: B's watch matches (a notification appears) but no mail is queued.
    const second = await api(a, "/api/certificates", { build: { kind: "projection", rule: 128, block: 2, projection: [0, 0, 0, 1] } });
    expect(second.status).toBe(201);
    const bId = person("viewer").id;
    const seen = await server.db.select().from(notifications).where(and(eq(notifications.userId, bId), eq(notifications.mapId, String(second.json.mapId))));
    expect(seen).toHaveLength(1);
    expect(await server.db.select().from(notificationOutbox).where(and(eq(notificationOutbox.userId, bId), eq(notificationOutbox.mapId, String(second.json.mapId))))).toEqual([]);
    // Longer than the outbox's 5-second pass: had anything been queued, it would have gone out.
    await new Promise((r) => setTimeout(r, 8_000));
    expect((await server.readMail()).filter((m) => m.to.includes(bEmail))).toHaveLength(1);

    const admin = await signedIn("admin");
    await admin.goto(`${server.url}/dev/mail`);
    await shoot(admin, "received-mail");
    await admin.goto(`${server.url}/dashboard`);
    await shoot(admin, "workspace-home");
    for (const p of [a, b, admin]) await p.context().close();
  });

  it("a curator retracts a map the admin watches only through a class: one retraction mail and one notification; the list pages 25 at a time", async () => {
    const a = await signedIn("contributor");
    const curator = await signedIn("curator");
    const admin = await signedIn("admin");
    const adminPerson = person("admin");
    await addWatchRule({ workspaceId: server.workspace.id, userId: adminPerson.id, scope: "class", modelKind: "eca" });
    // ECA 90 onto itself at block 2 by the parity of the block (rule 90 is additive: x₋₁ ⊕ x₁; common practice).
    const made = await api(a, "/api/certificates", { build: { kind: "projection", rule: 90, block: 2, projection: [0, 1, 1, 0] } });
    expect(made.status).toBe(201);
    const mapId = String(made.json.mapId);
    const retracted = await api(curator, `/api/maps/${mapId}/retract`, { reason: "a second copy of an older map" });
    expect(retracted.status).toBe(200);

    const isRetraction = (m: { to: string[] | string; subject: string }) => String(m.to).includes(adminPerson.email) && m.subject.startsWith("Map retracted:");
    const mail = await server.waitForMail(isRetraction, 60_000);
    expect(mail.subject).toMatch(/^Map retracted: ECA 90 → ECA 90/);
    expect(mail.text).toContain("Reason: a second copy of an older map");
    // Longer than the outbox's 5-second pass: a second copy would have gone out by now.
    await new Promise((r) => setTimeout(r, 8_000));
    expect((await server.readMail()).filter(isRetraction)).toHaveLength(1);

    // 30 older notifications more: the newest 25 on the first page, the retraction first among them.
    const at = Date.parse("2026-01-05T10:00:00Z");
    await server.db.insert(notifications).values(
      Array.from({ length: 30 }, (_, i) => ({ workspaceId: server.workspace.id, userId: adminPerson.id, title: `Older result ${i + 1}`, body: "", link: "/atlas", createdAt: new Date(at - i * 60_000) })),
    );
    await admin.goto(`${server.url}/notifications`);
    const items = admin.getByRole("list", { name: "Notifications" }).locator(":scope > li");
    await expect(items.count()).resolves.toBe(25);
    await expect(items.first().textContent()).resolves.toContain("Map retracted: ECA 90 → ECA 90");
    const total = (await server.db.select().from(notifications).where(eq(notifications.userId, adminPerson.id))).length;
    await admin.getByRole("link", { name: "Next page →" }).click();
    await admin.waitForURL(/cursor=/);
    await expect(admin.getByRole("list", { name: "Notifications" }).locator(":scope > li").count()).resolves.toBe(total - 25);
    await expect(admin.getByRole("link", { name: "Older result 30" }).count()).resolves.toBe(1);
    await shoot(admin, "notifications-page-2");
    for (const p of [a, curator, admin]) await p.context().close();
  });

  it("an admin invites C as curator; C accepts from the mail and lands in the workspace with that role", async () => {
    const admin = await signedIn("admin");
    await admin.goto(`${server.url}/members`);
    await admin.fill("#email", "carmen@elsewhere.example");
    await admin.selectOption("#invite-role", "curator");
    await admin.getByRole("button", { name: "Send invitation" }).click();
    await admin.getByText("Invitation mailed to carmen@elsewhere.example as curator.", { exact: false }).waitFor();
    await admin.getByRole("list", { name: "Pending invitations" }).getByText("carmen@elsewhere.example").waitFor();
    await shoot(admin, "members");

    const mail = await server.waitForMail((m) => m.to.includes("carmen@elsewhere.example"), 60_000);
    const link = linkIn(mail.text, /http:\/\/127\.0\.0\.1:\d+\/invite\?token=[A-Za-z0-9_-]+/);
    const c = await (await browser.newContext()).newPage();
    await c.goto(link);
    await c.fill("#name", "Carmen Ruiz-Oduya");
    await c.fill("#password", "carmen-curates-2026");
    await c.getByRole("button", { name: "Create account and join" }).click();
    await c.waitForURL((u) => u.pathname === "/dashboard", { timeout: 60_000 });
    await expect(c.locator("h1").textContent()).resolves.toBe(DEMO_WORKSPACE.name);
    await expect(c.getByText("Your role here:").locator("span").first().textContent()).resolves.toBe("curator");

    // The link is used up.
    const again = await (await browser.newContext()).newPage();
    await again.goto(link);
    await expect(again.locator('p[data-reason]').textContent()).resolves.toContain("already accepted");
    for (const p of [admin, c, again]) await p.context().close();
  });

  it("an admin turns on a public read-only view: no sign-in, no members, no mail addresses; turned off, it is gone", async () => {
    const admin = await signedIn("admin");
    await admin.goto(`${server.url}/members`);
    await admin.getByRole("button", { name: "Turn the public view on" }).click();
    await admin.getByText("The public view is on.").waitFor();
    const anonymous = await (await browser.newContext()).newPage();
    const res = await anonymous.goto(`${server.url}/public/${DEMO_WORKSPACE.slug}`);
    expect(res?.status()).toBe(200);
    await anonymous.getByText("ECA 146 → ECA 128").first().waitFor();
    const html = await anonymous.content();
    for (const p of server.people) {
      expect(html).not.toContain(p.email);
      expect(html).not.toContain(p.name);
    }
    expect(html).not.toContain("sqt_");
    await shoot(anonymous, "public-view");
    await admin.getByRole("button", { name: "Turn the public view off" }).click();
    await admin.getByText("The public view is off.").waitFor();
    expect((await anonymous.goto(`${server.url}/public/${DEMO_WORKSPACE.slug}`))?.status()).toBe(404);
    for (const p of [admin, anonymous]) await p.context().close();
  });
});
