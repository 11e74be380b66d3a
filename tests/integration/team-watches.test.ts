import { describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import * as annotationsRoute from "@/app/api/annotations/route";
import * as auditRoute from "@/app/api/audit/route";
import * as currentWorkspace from "@/app/api/workspaces/current/route";
import * as unsubscribeRoute from "@/app/unsubscribe/route";
import { createChain } from "@/db/queries/chains";
import { createCertifiedEdge } from "@/db/queries/maps";
import { getMailDelivery, setMailDelivery } from "@/db/queries/memberships";
import { countUnreadNotifications, markNotificationsRead, queueDueDigests } from "@/db/queries/notifications";
import { addWatchRule, watchModel } from "@/db/queries/watches";
import { getPublicWorkspace } from "@/db/queries/workspaces";
import { jobs, notificationOutbox, notifications } from "@/db/schema";
import { env } from "@/env";
import { unsubscribeUrl } from "@/lib/policy";
import { readableLog } from "@/server/team/log";
import { useSeededWorkspace } from "@/tests/support/seeded-workspace";
import { call } from "./api-support";
import { ecaFields, edgeInput } from "./atlas-fixtures";

const lab = useSeededWorkspace("watch-lab");

const mailTo = async (userId: string, mapId: string) =>
  lab.db.select().from(notificationOutbox).where(and(eq(notificationOutbox.userId, userId), eq(notificationOutbox.mapId, mapId))).all();
const noticesOf = async (userId: string, mapId: string) =>
  lab.db.select().from(notifications).where(and(eq(notifications.userId, userId), eq(notifications.mapId, mapId))).all();

/** A lumping between two invented chain models (storage-level stand-ins, as in atlas-fixtures). */
function lumpingInput(from: string, to: string) {
  const input = edgeInput(lab.ws, lab.people.contributor.id, 0, 0);
  const chain = (name: string) => ({ ...ecaFields(0), kind: "markov" as const, name, canonical: JSON.stringify({ kind: "markov", name }), address: `sha256:${name.padEnd(64, "0")}`, rule: null });
  const body = JSON.stringify({ map: { kind: "lumping", partition: [0, 0, 1] }, from, to });
  return {
    ...input,
    certificate: { ...input.certificate, address: `sha256:${(from + to).padEnd(64, "1")}`, kind: "lumping", body },
    source: chain(from),
    target: chain(to),
    map: { kind: "lumping" as const, block: null, steps: 1, summary: `${from} lumps onto ${to}` },
  };
}

describe("watching classes and saved searches", () => {
  it("one notification and one mail per matching watcher: every ECA, onto a model, any lumping of a chain; nothing for the author", async () => {
    const viewer = lab.people.viewer.id;
    const curator = lab.people.curator.id;
    const admin = lab.people.admin.id;
    const author = lab.people.contributor.id;
    // A map into ECA 128 makes its model; then the saved search onto it can be stored.
    const seedMap = await createCertifiedEdge(edgeInput(lab.ws, author, 232, 128, 2));
    const ontoId = (await lab.db.query.maps.findFirst({ where: (m, { eq: is }) => is(m.id, seedMap.mapId) }))!.targetModelId;
    await addWatchRule({ workspaceId: lab.ws, userId: viewer, scope: "class", modelKind: "eca" });
    await addWatchRule({ workspaceId: lab.ws, userId: viewer, scope: "class", modelKind: "eca" }); // twice is one watch
    await addWatchRule({ workspaceId: lab.ws, userId: curator, scope: "onto", modelId: ontoId });
    await watchModel({ workspaceId: lab.ws, userId: curator, modelId: ontoId }); // two matching watches, still one mail
    await addWatchRule({ workspaceId: lab.ws, userId: author, scope: "class", modelKind: "eca" });

    const onto = await createCertifiedEdge({ ...edgeInput(lab.ws, author, 146, 128, 3), linkBase: "http://atlas.test" });
    expect((await mailTo(viewer, onto.mapId)).length).toBe(1);
    expect((await mailTo(curator, onto.mapId)).length).toBe(1);
    expect(await mailTo(author, onto.mapId)).toEqual([]);
    expect(await mailTo(admin, onto.mapId)).toEqual([]);
    const [mail] = await mailTo(curator, onto.mapId);
    expect(mail.subject).toBe("Certified: ECA 146 → ECA 128, coarse-graining at block 3");
    expect(mail.body).toContain("By: The contributor");
    expect(mail.body).toContain("Block size: 3");
    expect(mail.body).toContain(`Open the certificate page: http://atlas.test/atlas/maps/${onto.mapId}`);
    expect(mail.unsubscribeUrl).toBe(unsubscribeUrl({ appUrl: "http://atlas.test", secret: env.AUTH_SECRET, workspaceId: lab.ws, userId: curator }));
    expect((await noticesOf(curator, onto.mapId)).map((n) => n.title)).toEqual(["The contributor certified ECA 146 → ECA 128, coarse-graining at block 3"]);

    // Not onto ECA 128: the class watcher hears of it, the saved search does not.
    const elsewhere = await createCertifiedEdge(edgeInput(lab.ws, author, 150, 90, 2));
    expect((await mailTo(viewer, elsewhere.mapId)).length).toBe(1);
    expect(await mailTo(curator, elsewhere.mapId)).toEqual([]);

    // Any lumping of a chain: the partition is in the mail.
    const lumped = await createCertifiedEdge(lumpingInput("weather", "weather2"));
    const chainId = (await lab.db.query.maps.findFirst({ where: (m, { eq: is }) => is(m.id, lumped.mapId) }))!.sourceModelId;
    await addWatchRule({ workspaceId: lab.ws, userId: admin, scope: "lumping-of", modelId: chainId });
    const again = await createCertifiedEdge(lumpingInput("weather", "weather3"));
    const [lumpMail] = await mailTo(admin, again.mapId);
    expect(lumpMail.body).toContain("Partition: [0,0,1]");
    expect(await mailTo(viewer, again.mapId)).toEqual([]);
  });

  it("counts unread notifications and marks them read", async () => {
    const viewer = lab.people.viewer.id;
    const unread = await countUnreadNotifications({ workspaceId: lab.ws, userId: viewer });
    expect(unread).toBe(2);
    expect(await markNotificationsRead({ workspaceId: lab.ws, userId: viewer })).toBe(2);
    expect(await countUnreadNotifications({ workspaceId: lab.ws, userId: viewer })).toBe(0);
  });

  it("a digest reader gets no mail per event, then one digest listing them a day later", async () => {
    const viewer = lab.people.viewer.id;
    await setMailDelivery({ workspaceId: lab.ws, userId: viewer, delivery: "digest" });
    const one = await createCertifiedEdge(edgeInput(lab.ws, lab.people.contributor.id, 30, 128, 2));
    const two = await createCertifiedEdge(edgeInput(lab.ws, lab.people.contributor.id, 45, 128, 2));
    expect(await mailTo(viewer, one.mapId)).toEqual([]);
    expect(await mailTo(viewer, two.mapId)).toEqual([]);
    const link = (w: string, u: string) => `http://atlas.test/unsubscribe?w=${w}&u=${u}`;
    expect(await queueDueDigests({ now: new Date(), appUrl: "http://atlas.test", unsubscribeLink: link })).toBe(0);
    const tomorrow = new Date(Date.now() + 24 * 3600_000 + 1000);
    expect(await queueDueDigests({ now: tomorrow, appUrl: "http://atlas.test", unsubscribeLink: link })).toBe(1);
    expect(await queueDueDigests({ now: tomorrow, appUrl: "http://atlas.test", unsubscribeLink: link })).toBe(0);
    const digests = (await lab.db.select().from(notificationOutbox).where(eq(notificationOutbox.userId, viewer)).all()).filter((m) => m.subject.startsWith("Your daily digest"));
    expect(digests).toHaveLength(1);
    expect(digests[0].subject).toBe("Your daily digest: 2 certified results");
    expect(digests[0].body).toContain(`http://atlas.test/atlas/maps/${one.mapId}`);
    expect(digests[0].body).toContain(`http://atlas.test/atlas/maps/${two.mapId}`);
    await setMailDelivery({ workspaceId: lab.ws, userId: viewer, delivery: "immediate" });
  });

  it("the signed unsubscribe link works signed out; a forged one is refused and changes nothing", async () => {
    const curator = lab.people.curator.id;
    const good = unsubscribeUrl({ appUrl: "http://atlas.test", secret: env.AUTH_SECRET, workspaceId: lab.ws, userId: curator });
    const forged = unsubscribeUrl({ appUrl: "http://atlas.test", secret: "someone-else's-secret-value", workspaceId: lab.ws, userId: curator });
    const refused = await unsubscribeRoute.GET(new Request(forged));
    expect(refused.status).toBe(400);
    expect(await getMailDelivery({ workspaceId: lab.ws, userId: curator })).toBe("immediate");
    const incomplete = await unsubscribeRoute.GET(new Request("http://atlas.test/unsubscribe?w=x"));
    expect(incomplete.status).toBe(400);
    const res = await unsubscribeRoute.POST(new Request(good, { method: "POST", body: "List-Unsubscribe=One-Click" }));
    expect(res.status).toBe(200);
    expect(await res.text()).toContain("You will get no more watch mail from Atlas lab");
    expect(await getMailDelivery({ workspaceId: lab.ws, userId: curator })).toBe("off");
    const after = await createCertifiedEdge(edgeInput(lab.ws, lab.people.contributor.id, 60, 128, 2));
    expect(await mailTo(curator, after.mapId)).toEqual([]);
    expect(await noticesOf(curator, after.mapId)).toHaveLength(1);
  });
});

describe("a certified chain", () => {
  it("is announced like a map: one notification and one mail per matching watcher, linking the chain's page", async () => {
    const viewer = lab.people.viewer.id;
    const map = (await lab.db.query.maps.findMany()).find((m) => m.summary === "ECA 146 → ECA 128 at block 3")!;
    const body = JSON.stringify({ kind: "chain", links: [map.certificateAddress] });
    const stored = await createChain({
      workspaceId: lab.ws,
      userId: lab.people.contributor.id,
      name: "Proof by one square",
      mapIds: [map.id],
      composite: { address: `sha256:${"c".repeat(64)}`, kind: "projection", formatVersion: 1, body, checkerVersion: "test", verifiedAt: new Date() },
      verification: "links",
    });
    const notes = (await lab.db.select().from(notifications).where(eq(notifications.userId, viewer)).all()).filter((n) => n.link === `/chains/${stored.chainId}`);
    expect(notes.map((n) => [n.title, n.mapId])).toEqual([["The contributor certified ECA 146 → ECA 128, chain “Proof by one square”", null]]);
    const mails = (await lab.db.select().from(notificationOutbox).where(eq(notificationOutbox.userId, viewer)).all()).filter((m) => m.subject.includes("chain"));
    expect(mails.map((m) => m.subject)).toEqual(["Certified: ECA 146 → ECA 128, chain “Proof by one square”"]);
    expect(mails[0].body).toContain(`/chains/${stored.chainId}`);
  });
});

describe("a log people can read", () => {
  it("names who certified what, and folds what one job wrote into one line with counts and a link", async () => {
    const [job] = await lab.db
      .insert(jobs)
      .values({
        workspaceId: lab.ws,
        ownerId: lab.people.curator.id,
        kind: "eca-atlas",
        params: JSON.stringify({ minBlock: 2, maxBlock: 3, search: "projections" }),
        status: "succeeded",
        result: JSON.stringify({ found: 3, certificates: { created: 2, existing: 1, refused: [] } }),
        startedAt: new Date(Date.now() - 1000),
        finishedAt: new Date(Date.now() + 5000),
      })
      .returning();
    await createCertifiedEdge(edgeInput(lab.ws, lab.people.curator.id, 18, 128, 2));
    await createCertifiedEdge(edgeInput(lab.ws, lab.people.curator.id, 22, 128, 2));
    const lines = await readableLog({ workspaceId: lab.ws, limit: 50 });
    const jobLines = lines.filter((l) => l.action === "job");
    expect(jobLines.map((l) => [l.text, l.href])).toEqual([[`The curator's ECA atlas job, all 256 rules, projections, block 2–3: 3 coarse-grainings certified, 2 new maps`, `/jobs/${job.id}`]]);
    expect(lines.map((l) => l.text)).toContain("The contributor certified ECA 146 → ECA 128, coarse-graining at block 3");
    expect(lines.some((l) => l.text.includes("ECA 18 →"))).toBe(false);
  });

  it("admins page through the audit log filtered by kind and person; others are refused", async () => {
    lab.signIn({ id: lab.people.admin.id, email: lab.people.admin.email, name: "admin" });
    const page1 = await call(auditRoute.GET, { path: `/api/audit?action=map:create&actorId=${lab.people.contributor.id}&limit=3&page=1` });
    expect(page1.status).toBe(200);
    const items = page1.json.items as { action: string; actorId: string; text: string }[];
    expect(items).toHaveLength(3);
    expect(items.every((i) => i.action === "map:create" && i.actorId === lab.people.contributor.id)).toBe(true);
    const total = page1.json.total as number;
    // The contributor certified 232, 146, 150, two lumpings, 30, 45 and 60: eight maps.
    expect(total).toBe(8);
    const page3 = await call(auditRoute.GET, { path: `/api/audit?action=map:create&actorId=${lab.people.contributor.id}&limit=3&page=3` });
    expect((page3.json.items as unknown[]).length).toBe(2);
    const page4 = await call(auditRoute.GET, { path: `/api/audit?action=map:create&actorId=${lab.people.contributor.id}&limit=3&page=4` });
    expect(page4.json.items).toEqual([]);
    const bad = await call(auditRoute.GET, { path: "/api/audit?page=0" });
    expect([bad.status, (bad.json.error as { field: string }).field]).toEqual([400, "page"]);
    lab.signIn({ id: lab.people.curator.id, email: lab.people.curator.email, name: "curator" });
    expect((await call(auditRoute.GET, { path: "/api/audit" })).status).toBe(403);
  });
});

describe("curating and the public view", () => {
  it("refuses a malformed DOI or arXiv identifier next to the field and stores a valid one normalised", async () => {
    lab.signIn({ id: lab.people.contributor.id, email: lab.people.contributor.email, name: "contributor" });
    const map = await lab.db.query.maps.findFirst();
    const post = (body: Record<string, unknown>) => call(annotationsRoute.POST, { path: "/x", method: "POST", body: { subjectType: "map", subjectId: map!.id, ...body } });
    const bad = await post({ kind: "published", text: "arXiv:1501.0001" });
    expect([bad.status, (bad.json.error as { field: string }).field]).toEqual([400, "text"]);
    const badTag = await post({ kind: "tag", text: "Not a tag!" });
    expect([badTag.status, (badTag.json.error as { field: string }).field]).toEqual([400, "text"]);
    expect((await post({ kind: "published", text: "https://doi.org/10.1103/PhysRevE.73.026203" })).status).toBe(201);
    const listed = await call(annotationsRoute.GET, { path: `/api/annotations?subjectType=map&subjectId=${map!.id}` });
    expect((listed.json.items as { kind: string; text: string }[]).map((a) => [a.kind, a.text])).toEqual([["published", "doi:10.1103/physreve.73.026203"]]);
    const onModel = await call(annotationsRoute.POST, { path: "/x", method: "POST", body: { subjectType: "model", subjectId: map!.sourceModelId, kind: "published", text: "1501.00001" } });
    expect([onModel.status, (onModel.json.error as { field: string }).field]).toEqual([400, "subjectType"]);
  });

  it("an admin turns the public view on and off; a private workspace is not found publicly", async () => {
    expect(await getPublicWorkspace({ slug: "watch-lab" })).toBeNull();
    lab.signIn({ id: lab.people.admin.id, email: lab.people.admin.email, name: "admin" });
    const on = await call(currentWorkspace.PATCH, { path: "/x", method: "PATCH", body: { publicView: true } });
    expect(on.json).toMatchObject({ publicView: true, slug: "watch-lab" });
    expect(String(on.json.publicUrl)).toMatch(/\/public\/watch-lab$/);
    expect((await getPublicWorkspace({ slug: "watch-lab" }))?.id).toBe(lab.ws);
    const bad = await call(currentWorkspace.PATCH, { path: "/x", method: "PATCH", body: { publicView: "yes" } });
    expect([bad.status, (bad.json.error as { field: string }).field]).toEqual([400, "publicView"]);
    await call(currentWorkspace.PATCH, { path: "/x", method: "PATCH", body: { publicView: false } });
    expect(await getPublicWorkspace({ slug: "watch-lab" })).toBeNull();
  });
});
