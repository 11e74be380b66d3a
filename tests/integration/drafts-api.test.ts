import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as draftById from "@/app/api/drafts/[id]/route";
import * as duplicate from "@/app/api/drafts/[id]/duplicate/route";
import * as draftsRoute from "@/app/api/drafts/route";
import { setDatabase } from "@/db/queries/atlas";
import { listCompositeEdges, listWorkspaceComposites, searchChains } from "@/db/queries/chain-list";
import { drafts } from "@/db/schema";
import { closeVerificationPool } from "@/server/atlas/pool";
import { submitBuild, submitChain } from "@/server/atlas/submit";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { call, tokenFor } from "./api-support";
import { seedAtlasPeople } from "./atlas-fixtures";

let t: TestDatabase;
let seeded: Awaited<ReturnType<typeof seedAtlasPeople>>;
const tokens = {} as Record<"viewer" | "contributor" | "curator", string>;

const canvas = {
  nodes: [{ id: "n1", name: "ECA 105", description: "", model: { kind: "eca", rule: 105 }, modelId: null, note: "", x: 0, y: 0 }],
  edges: [],
  chain: { name: "", id: null, address: null },
};

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  seeded = await seedAtlasPeople(t.db, "drafts-lab");
  for (const role of ["viewer", "contributor", "curator"] as const) tokens[role] = await tokenFor(seeded.people[role].id, seeded.workspace.id, role);
});
afterAll(async () => {
  setDatabase(null);
  await closeVerificationPool();
  await t?.cleanup();
});

describe("/api/drafts", () => {
  it("keeps a draft private to its owner until it is shared, then read-only for the rest of the workspace", async () => {
    const created = await call(draftsRoute.POST, { path: "/api/drafts", method: "POST", token: tokens.contributor, body: { name: "My bench", canvas } });
    expect(created.status).toBe(201);
    const id = created.json.id as string;
    expect(created.json).toMatchObject({ name: "My bench", mine: true, shared: false, canvas });

    const hidden = await call(draftById.GET, { path: `/api/drafts/${id}`, token: tokens.curator, params: { id } });
    expect(hidden.status).toBe(404);
    const list = await call(draftsRoute.GET, { path: "/api/drafts", token: tokens.curator });
    expect(list.json.items).toEqual([]);

    const shared = await call(draftById.PATCH, { path: `/api/drafts/${id}`, method: "PATCH", token: tokens.contributor, params: { id }, body: { shared: true, name: "Shared bench" } });
    expect(shared.status).toBe(200);
    const seen = await call(draftById.GET, { path: `/api/drafts/${id}`, token: tokens.viewer, params: { id } });
    expect(seen.json).toMatchObject({ name: "Shared bench", mine: false, shared: true, canvas });
  });

  it("refuses with 403 and writes nothing when someone else changes, deletes or a viewer creates a draft", async () => {
    const created = await call(draftsRoute.POST, { path: "/api/drafts", method: "POST", token: tokens.contributor, body: { name: "Theirs" } });
    const id = created.json.id as string;
    await call(draftById.PATCH, { path: `/api/drafts/${id}`, method: "PATCH", token: tokens.contributor, params: { id }, body: { shared: true } });
    const [before] = await t.db.select().from(drafts).where(eq(drafts.id, id));

    const curatorPatch = await call(draftById.PATCH, { path: `/api/drafts/${id}`, method: "PATCH", token: tokens.curator, params: { id }, body: { name: "Mine now" } });
    expect(curatorPatch.status).toBe(403);
    expect((curatorPatch.json.error as { field: string }).field).toBe("id");
    const curatorDelete = await call(draftById.DELETE, { path: `/api/drafts/${id}`, method: "DELETE", token: tokens.curator, params: { id } });
    expect(curatorDelete.status).toBe(403);
    const viewerCreate = await call(draftsRoute.POST, { path: "/api/drafts", method: "POST", token: tokens.viewer, body: { name: "A viewer's" } });
    expect(viewerCreate.status).toBe(403);
    const viewerCopy = await call(duplicate.POST, { path: `/api/drafts/${id}/duplicate`, method: "POST", token: tokens.viewer, params: { id } });
    expect(viewerCopy.status).toBe(403);

    const [after] = await t.db.select().from(drafts).where(eq(drafts.id, id));
    expect(after).toEqual(before);
    expect((await t.db.select().from(drafts)).filter((d) => d.ownerId === seeded.people.viewer.id)).toEqual([]);
  });

  it("names the field of a bad body, duplicates into the caller's own draft, and deletes", async () => {
    const bad = await call(draftsRoute.POST, { path: "/api/drafts", method: "POST", token: tokens.contributor, body: { name: "x", canvas: { nodes: "many", edges: [], chain: {} } } });
    expect(bad.status).toBe(400);
    expect((bad.json.error as { field: string }).field).toBe("canvas.nodes");
    const empty = await call(draftsRoute.POST, { path: "/api/drafts", method: "POST", token: tokens.contributor, body: { name: "  " } });
    expect((empty.json.error as { field: string; message: string }).field).toBe("name");

    const original = await call(draftsRoute.POST, { path: "/api/drafts", method: "POST", token: tokens.contributor, body: { name: "Original", canvas } });
    const id = original.json.id as string;
    await call(draftById.PATCH, { path: `/api/drafts/${id}`, method: "PATCH", token: tokens.contributor, params: { id }, body: { shared: true } });
    const copy = await call(duplicate.POST, { path: `/api/drafts/${id}/duplicate`, method: "POST", token: tokens.curator, params: { id } });
    expect(copy.status).toBe(201);
    expect(copy.json).toMatchObject({ name: "Copy of Original", mine: true, shared: false, canvas });

    const gone = await call(draftById.DELETE, { path: `/api/drafts/${id}`, method: "DELETE", token: tokens.contributor, params: { id } });
    expect(gone.status).toBe(200);
    const after = await call(draftById.GET, { path: `/api/drafts/${id}`, token: tokens.contributor, params: { id } });
    expect(after.status).toBe(404);
  });
});

describe("chain list queries", () => {
  it("finds a chain by part of its name and by a model it passes through, and shows its composite on both end models", async () => {
    const ws = seeded.workspace.id;
    const userId = seeded.people.contributor.id;
    // Rule 105 onto 150 by block-2 parity, then 150 onto itself (Israeli & Goldenfeld, PRE 73, 026203, 2006).
    const a = await submitBuild({ workspaceId: ws, userId, build: { kind: "projection", rule: 105, block: 2, projection: [0, 1, 1, 0] } });
    const b = await submitBuild({ workspaceId: ws, userId, build: { kind: "projection", rule: 150, block: 2, projection: [0, 1, 1, 0] } });
    const chain = await submitChain({ workspaceId: ws, userId, name: "Parity twice", mapIds: [a.mapId, b.mapId] });

    const byName = await searchChains({ workspaceId: ws, q: "twice" });
    expect(byName.items.map((c) => [c.name, c.source.name, c.target.name, c.links])).toEqual([["Parity twice", "ECA 105", "ECA 150", 2]]);
    expect((await searchChains({ workspaceId: ws, q: "100%_" })).items).toEqual([]);

    const [source] = (await searchChains({ workspaceId: ws })).items;
    const byModel = await searchChains({ workspaceId: ws, modelId: source.source.id });
    expect(byModel.items.map((c) => c.id)).toEqual([chain.chainId]);
    expect((await searchChains({ workspaceId: ws, modelId: "no-such-model" })).items).toEqual([]);

    const composites = await listCompositeEdges({ workspaceId: ws, modelId: source.target.id });
    expect(composites.map((c) => [c.name, c.compositeKind, c.compositeBlock])).toEqual([["Parity twice", "projection", 4]]);

    // The atlas's maps list: the composite under the list's filters (kind, block, a part of a name).
    const listed = (filters: { kind?: string; block?: number; q?: string }) => listWorkspaceComposites({ workspaceId: ws, ...filters }).then((es) => es.map((e) => e.name));
    expect(await listed({})).toEqual(["Parity twice"]);
    expect(await listed({ kind: "projection", block: 4, q: "eca 150" })).toEqual(["Parity twice"]);
    expect(await listed({ block: 2 })).toEqual([]);
    expect(await listed({ kind: "lumping" })).toEqual([]);
    expect(await listed({ q: "rule 30" })).toEqual([]);
  });
});
