import { describe, expect, it } from "vitest";
import { getMembershipRole, listMembers, setMembership } from "@/db/queries/memberships";
import { countNotes, createNote, listActivity } from "@/db/queries/notes";
import { ensureUser } from "@/db/queries/users";
import { ensureWorkspace, getWorkspaceBySlug, getWorkspaceSummary, listWorkspacesForUser } from "@/db/queries/workspaces";
import { useQueryLayerDatabase } from "@/tests/support/query-database";

useQueryLayerDatabase();

describe("workspaces and memberships", () => {
  it("creates a workspace once by slug and keeps the first name", async () => {
    const a = await ensureWorkspace({ slug: "fen-lab", name: "Fen Lab" });
    const b = await ensureWorkspace({ slug: "fen-lab", name: "Renamed" });
    expect(b).toEqual(a);
    expect(await getWorkspaceBySlug({ slug: "fen-lab" })).toEqual({ id: a.id, slug: "fen-lab", name: "Fen Lab" });
    expect(await getWorkspaceBySlug({ slug: "missing" })).toBeNull();
  });

  it("gives each member one role, which a second grant replaces", async () => {
    const ws = await ensureWorkspace({ slug: "fen-lab", name: "Fen Lab" });
    const ana = await ensureUser({ email: "ana@example.org", name: "Ana", passwordHash: null });
    const bo = await ensureUser({ email: "bo@example.org", name: "Bo", passwordHash: null });
    await setMembership({ workspaceId: ws.id, userId: ana.id, role: "viewer" });
    await setMembership({ workspaceId: ws.id, userId: ana.id, role: "curator" });
    await setMembership({ workspaceId: ws.id, userId: bo.id, role: "contributor" });
    expect(await getMembershipRole({ workspaceId: ws.id, userId: ana.id })).toBe("curator");
    expect(await listMembers({ workspaceId: ws.id })).toEqual([
      { userId: ana.id, name: "Ana", email: "ana@example.org", role: "curator" },
      { userId: bo.id, name: "Bo", email: "bo@example.org", role: "contributor" },
    ]);
    const other = await ensureWorkspace({ slug: "moss-lab", name: "Moss Lab" });
    expect(await getMembershipRole({ workspaceId: other.id, userId: ana.id })).toBeNull();
    expect((await listWorkspacesForUser({ userId: ana.id })).map((w) => w.slug)).toEqual(["fen-lab"]);
    expect(await getWorkspaceSummary({ workspaceId: ws.id })).toEqual({ members: 2, models: 0, maps: 0, chains: 0, jobs: 0 });
  });

  it("keeps notes in the workspace's activity log, newest first", async () => {
    const ws = await ensureWorkspace({ slug: "fen-lab", name: "Fen Lab" });
    const bo = await ensureUser({ email: "bo@example.org", name: "Bo", passwordHash: null });
    await createNote({ workspaceId: ws.id, actorId: bo.id, text: "first" });
    await new Promise((r) => setTimeout(r, 5));
    await createNote({ workspaceId: ws.id, actorId: bo.id, text: "second" });
    expect(await countNotes({ workspaceId: ws.id })).toBe(2);
    const log = await listActivity({ workspaceId: ws.id });
    expect(log.map((e) => [e.action, e.detail.text, e.actorName])).toEqual([
      ["note:post", "second", "Bo"],
      ["note:post", "first", "Bo"],
    ]);
    const other = await ensureWorkspace({ slug: "moss-lab", name: "Moss Lab" });
    expect(await listActivity({ workspaceId: other.id })).toEqual([]);
  });
});
