import { describe, expect, it } from "vitest";
import { and, eq, like } from "drizzle-orm";
import * as notificationsRoute from "@/app/api/notifications/route";
import { createChain } from "@/db/queries/chains";
import { createCertifiedEdge, retractMap } from "@/db/queries/maps";
import { setMailDelivery } from "@/db/queries/memberships";
import { listNotifications, queueDueDigests } from "@/db/queries/notifications";
import { addWatchRule, removeWatchRule, watchModel } from "@/db/queries/watches";
import { memberships, notificationOutbox, notifications, users } from "@/db/schema";
import { useSeededWorkspace } from "@/tests/support/seeded-workspace";
import { call } from "./api-support";
import { edgeInput } from "./atlas-fixtures";

const lab = useSeededWorkspace("notice-lab");

/** Another viewer of the workspace. */
async function addReader(name: string) {
  const [user] = await lab.db.insert(users).values({ email: `${name}@notice-lab.test`, name }).returning();
  await lab.db.insert(memberships).values({ workspaceId: lab.ws, userId: user.id, role: "viewer" });
  return user.id;
}

const retractionMail = (userId: string, mapId: string) =>
  lab.db
    .select()
    .from(notificationOutbox)
    .where(and(eq(notificationOutbox.userId, userId), eq(notificationOutbox.mapId, mapId), like(notificationOutbox.subject, "Map retracted:%")))
    .all();
const retractionNotices = (userId: string, mapId: string) =>
  lab.db
    .select()
    .from(notifications)
    .where(and(eq(notifications.userId, userId), eq(notifications.mapId, mapId), like(notifications.title, "Map retracted:%")))
    .all();

describe("a retraction is told to everyone who watches the map", () => {
  it("a watcher of the map (a saved search and a class, no model) gets exactly one notification and one mail; the curator who retracts gets none", async () => {
    const { contributor, curator, viewer } = lab.people;
    const first = await createCertifiedEdge(edgeInput(lab.ws, contributor.id, 232, 128, 2));
    const ontoId = (await lab.db.query.maps.findFirst({ where: (m, { eq: is }) => is(m.id, first.mapId) }))!.targetModelId;
    // The viewer watches the map twice over (onto its target, and every ECA) but neither of its models.
    await addWatchRule({ workspaceId: lab.ws, userId: viewer.id, scope: "onto", modelId: ontoId });
    await addWatchRule({ workspaceId: lab.ws, userId: viewer.id, scope: "class", modelKind: "eca" });
    await watchModel({ workspaceId: lab.ws, userId: curator.id, modelId: ontoId });
    const map = await createCertifiedEdge({ ...edgeInput(lab.ws, contributor.id, 146, 128, 3), linkBase: "http://atlas.test" });

    await retractMap({ workspaceId: lab.ws, mapId: map.mapId, userId: curator.id, reason: "the projection was read with the wrong bit order" });

    const notices = await retractionNotices(viewer.id, map.mapId);
    expect(notices.map((n) => [n.title, n.link])).toEqual([["Map retracted: ECA 146 → ECA 128 at block 3", `/atlas/maps/${map.mapId}`]]);
    const mails = await retractionMail(viewer.id, map.mapId);
    expect(mails).toHaveLength(1);
    expect(mails[0].body).toContain("Reason: the projection was read with the wrong bit order");
    expect(mails[0].unsubscribeUrl).toMatch(/\/unsubscribe\?/);
    expect(await retractionNotices(curator.id, map.mapId)).toEqual([]);
    expect(await retractionMail(curator.id, map.mapId)).toEqual([]);
    // The author watches nothing and was told nothing: no retraction either.
    expect(await retractionNotices(contributor.id, map.mapId)).toEqual([]);
  });

  it("someone told of the map whose watch has since gone still hears; a digest reader finds it in the digest, not in a mail of its own", async () => {
    const { contributor, curator, admin } = lab.people;
    await setMailDelivery({ workspaceId: lab.ws, userId: admin.id, delivery: "digest" });
    const rule = await addWatchRule({ workspaceId: lab.ws, userId: admin.id, scope: "class", modelKind: "eca" });
    const map = await createCertifiedEdge(edgeInput(lab.ws, contributor.id, 30, 90, 2));
    await removeWatchRule({ workspaceId: lab.ws, userId: admin.id, id: rule!.id });
    const told = await addReader("Once told");
    await lab.db.insert(notifications).values({ workspaceId: lab.ws, userId: told, mapId: map.mapId, title: "certified", body: "", link: `/atlas/maps/${map.mapId}` });

    await retractMap({ workspaceId: lab.ws, mapId: map.mapId, userId: curator.id, reason: "duplicate of an older map" });

    expect(await retractionNotices(told, map.mapId)).toHaveLength(1);
    expect(await retractionMail(told, map.mapId)).toHaveLength(1);
    expect(await retractionNotices(admin.id, map.mapId)).toHaveLength(1);
    expect(await retractionMail(admin.id, map.mapId)).toEqual([]);
    const tomorrow = new Date(Date.now() + 24 * 3600_000 + 1000);
    await queueDueDigests({ now: tomorrow, appUrl: "http://atlas.test", unsubscribeLink: (w, u) => `http://atlas.test/unsubscribe?w=${w}&u=${u}` });
    const digest = (await lab.db.select().from(notificationOutbox).where(eq(notificationOutbox.userId, admin.id)).all()).filter((m) => m.subject.startsWith("Your daily digest"));
    // One certification (30 → 90) and its retraction; nothing else reached the admin's digest.
    expect(digest.map((d) => d.subject)).toEqual(["Your daily digest: 1 certified result and 1 retraction"]);
    expect(digest[0].body).toContain("Map retracted: ECA 30 → ECA 90 at block 2");
  });

  it("someone told of a chain citing the map hears of the retraction, once", async () => {
    const { contributor, curator } = lab.people;
    const reader = await addReader("Chain reader");
    const a = await createCertifiedEdge(edgeInput(lab.ws, contributor.id, 22, 126, 2));
    const b = await createCertifiedEdge(edgeInput(lab.ws, contributor.id, 126, 136, 2));
    const sourceId = (await lab.db.query.maps.findFirst({ where: (m, { eq: is }) => is(m.id, a.mapId) }))!.sourceModelId;
    // Watching ECA 22 only: told of the chain 22 → 136, not of the map 126 → 136 it cites.
    await watchModel({ workspaceId: lab.ws, userId: reader, modelId: sourceId });
    const stored = await createChain({
      workspaceId: lab.ws,
      userId: contributor.id,
      name: "Two squares",
      mapIds: [a.mapId, b.mapId],
      composite: { address: `sha256:${"d".repeat(64)}`, kind: "projection", formatVersion: 1, body: "{}", checkerVersion: "test", verifiedAt: new Date() },
      verification: "links",
    });
    expect((await lab.db.select().from(notifications).where(eq(notifications.userId, reader)).all()).map((n) => n.link)).toEqual([`/chains/${stored.chainId}`]);

    await retractMap({ workspaceId: lab.ws, mapId: b.mapId, userId: curator.id, reason: "wrong target" });

    expect(await retractionNotices(reader, b.mapId)).toHaveLength(1);
    expect(await retractionMail(reader, b.mapId)).toHaveLength(1);
  });
});

describe("the notification list is paged", () => {
  it("pages newest first with a cursor, without repeating or skipping a row, even within one millisecond", async () => {
    const reader = await addReader("Pager");
    // 7 notifications, 5 of them written in one statement (one stored time).
    const at = new Date("2026-01-05T10:00:00Z");
    await lab.db.insert(notifications).values([0, 1].map((i) => ({ workspaceId: lab.ws, userId: reader, title: `older ${i}`, body: "", link: "/atlas", createdAt: new Date(at.getTime() - 60_000 * (i + 1)) })));
    await lab.db.insert(notifications).values([0, 1, 2, 3, 4].map((i) => ({ workspaceId: lab.ws, userId: reader, title: `same time ${i}`, body: "", link: "/atlas" })));
    const seen: string[] = [];
    let cursor: string | null = null;
    let pages = 0;
    do {
      const page: Awaited<ReturnType<typeof listNotifications>> = await listNotifications({ workspaceId: lab.ws, userId: reader, limit: 3, cursor });
      seen.push(...page.items.map((n) => n.title));
      cursor = page.nextCursor;
      pages++;
    } while (cursor && pages < 10);
    expect(pages).toBe(3);
    expect(seen).toHaveLength(7);
    expect(new Set(seen).size).toBe(7);
    expect(seen.slice(5)).toEqual(["older 0", "older 1"]);
  });

  it("the API pages the same way and names the field of a bad cursor or page size", async () => {
    const reader = (await lab.db.select().from(users).where(eq(users.name, "Pager")).all())[0];
    lab.signIn({ id: reader.id, email: reader.email, name: reader.name });
    const first = await call(notificationsRoute.GET, { path: "/api/notifications?limit=4" });
    expect(first.status).toBe(200);
    expect((first.json.items as unknown[]).length).toBe(4);
    expect(first.json.unread).toBe(7);
    const second = await call(notificationsRoute.GET, { path: `/api/notifications?limit=4&cursor=${String(first.json.nextCursor)}` });
    // Five written at once come first (newest), then the two older ones: 4 on the first page, 3 on the second.
    const titles = (second.json.items as { title: string }[]).map((n) => n.title);
    expect(titles).toHaveLength(3);
    expect(titles[0]).toMatch(/^same time \d$/);
    expect(titles.slice(1)).toEqual(["older 0", "older 1"]);
    expect(second.json.nextCursor).toBeNull();
    const bad = await call(notificationsRoute.GET, { path: "/api/notifications?cursor=not-ours" });
    expect([bad.status, (bad.json.error as { field: string }).field]).toEqual([400, "cursor"]);
    const big = await call(notificationsRoute.GET, { path: "/api/notifications?limit=5000" });
    expect([big.status, (big.json.error as { field: string }).field]).toEqual([400, "limit"]);
    lab.signIn(null);
  });
});
