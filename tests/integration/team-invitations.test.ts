import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { count, eq } from "drizzle-orm";
import { setSessionReader } from "@/app/api/_lib/actor";
import * as invitationById from "@/app/api/invitations/[id]/route";
import * as resend from "@/app/api/invitations/[id]/resend/route";
import * as accept from "@/app/api/invitations/accept/route";
import * as invitationsRoute from "@/app/api/invitations/route";
import * as memberById from "@/app/api/members/[userId]/route";
import { setDatabase } from "@/db/queries/connection";
import { auditEvents, invitations, memberships, notificationOutbox, users } from "@/db/schema";
import { createWorkspace, listWorkspacesForUser } from "@/db/queries/workspaces";
import { inviteMember } from "@/server/team/invitations";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { call } from "./api-support";
import { seedAtlasPeople } from "./atlas-fixtures";

let t: TestDatabase;
let seeded: Awaited<ReturnType<typeof seedAtlasPeople>>;
let signedIn: { id: string; email: string; name: string } | null = null;
const as = (p: { id: string; email: string }) => (signedIn = { ...p, name: p.email });

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  seeded = await seedAtlasPeople(t.db, "team-lab");
  setSessionReader(async () => signedIn);
});

afterAll(() => {
  setSessionReader(null);
  setDatabase(null);
  t.cleanup();
});

/** The token in the newest invitation mail to `address`, read from the outbox as a mail reader would. */
async function mailedToken(address: string): Promise<string> {
  const rows = await t.db.select().from(notificationOutbox).where(eq(notificationOutbox.toAddress, address)).all();
  const body = rows.sort((a, b) => b.createdAt.getTime() - a.createdAt.getTime() || (a.body < b.body ? 1 : -1))[0]?.body ?? "";
  const match = /\/invite\?token=([A-Za-z0-9_-]+)/.exec(body);
  if (!match) throw new Error(`no invitation link mailed to ${address}`);
  return match[1];
}

/** Rows that accepting could write: a failed accept must leave every count as it was. */
async function counts() {
  const n = async (table: typeof users | typeof memberships | typeof auditEvents) => (await t.db.select({ n: count() }).from(table))[0].n;
  const accepted = (await t.db.select().from(invitations).all()).filter((i) => i.acceptedAt !== null).length;
  return { users: await n(users), memberships: await n(memberships), audit: await n(auditEvents), accepted };
}

const invite = (email: string, role: string) => call(invitationsRoute.POST, { path: "/api/invitations", method: "POST", body: { email, role } });
const acceptNew = (token: string, name = "New Person") =>
  call(accept.POST, { path: "/api/invitations/accept", method: "POST", body: { token, name, password: "a long enough secret" } });

describe("invitations", () => {
  it("an admin invites an address; the mail carries a single-use link; accepting creates the account with the invited role", async () => {
    as(seeded.people.admin);
    const res = await invite("Carol@Example.org", "curator");
    expect(res.status).toBe(201);
    expect(res.json).toMatchObject({ email: "carol@example.org", role: "curator" });
    const expires = new Date(String(res.json.expiresAt)).getTime();
    // 7 days by default, give or take the test's own run time.
    expect(Math.abs(expires - (Date.now() + 7 * 24 * 3600_000))).toBeLessThan(60_000);
    const token = await mailedToken("carol@example.org");
    // Only the hash is stored.
    const stored = await t.db.select().from(invitations).where(eq(invitations.email, "carol@example.org")).get();
    expect(stored!.tokenHash).not.toContain(token);
    expect(stored!.tokenHash).toMatch(/^[0-9a-f]{64}$/);

    signedIn = null;
    const joined = await acceptNew(token, "Carol");
    expect(joined.status).toBe(200);
    expect(joined.json).toMatchObject({ role: "curator", email: "carol@example.org", workspaceId: seeded.workspace.id });
    const carol = await t.db.select().from(users).where(eq(users.email, "carol@example.org")).get();
    expect(carol?.name).toBe("Carol");
    const member = await t.db.select().from(memberships).where(eq(memberships.userId, carol!.id)).get();
    expect(member?.role).toBe("curator");

    // The same link a second time: a clear refusal, nothing written.
    const before = await counts();
    const again = await acceptNew(token, "Carol again");
    expect(again.status).toBe(409);
    expect(String((again.json.error as { message: string }).message)).toMatch(/already accepted; a link works only once/);
    expect(await counts()).toEqual(before);
  });

  it("refuses an expired link with the date it expired, and writes nothing", async () => {
    const eightDaysAgo = new Date(Date.now() - 8 * 24 * 3600_000);
    await inviteMember({
      workspaceId: seeded.workspace.id,
      inviter: { id: seeded.people.admin.id, name: "The admin" },
      email: "late@example.org",
      role: "viewer",
      appUrl: "http://atlas.test",
      now: eightDaysAgo,
    });
    const token = await mailedToken("late@example.org");
    signedIn = null;
    const before = await counts();
    const res = await acceptNew(token);
    expect(res.status).toBe(409);
    expect(res.json.error).toMatchObject({ field: "token", details: { reason: "expired" } });
    expect(String((res.json.error as { message: string }).message)).toMatch(/^This invitation expired on .+ Ask an admin of the workspace to resend it\.$/);
    expect(await counts()).toEqual(before);
  });

  it("refuses the link of a revoked invitation, and writes nothing", async () => {
    as(seeded.people.admin);
    const made = await invite("gone@example.org", "contributor");
    const token = await mailedToken("gone@example.org");
    const revoked = await call(invitationById.DELETE, { path: `/api/invitations/${made.json.id}`, method: "DELETE", params: { id: String(made.json.id) } });
    expect(revoked.status).toBe(200);
    signedIn = null;
    const before = await counts();
    const res = await acceptNew(token);
    expect(res.status).toBe(409);
    expect(res.json.error).toMatchObject({ details: { reason: "revoked" } });
    expect(String((res.json.error as { message: string }).message)).toMatch(/withdrawn by an admin/);
    expect(await counts()).toEqual(before);
    // Revoking twice: nothing pending under that id any more.
    as(seeded.people.admin);
    expect((await call(invitationById.DELETE, { path: "/x", method: "DELETE", params: { id: String(made.json.id) } })).status).toBe(404);
  });

  it("refuses an unknown token with 404 and a resend replaces the old link", async () => {
    signedIn = null;
    const before = await counts();
    const unknown = await acceptNew("x".repeat(43));
    expect(unknown.status).toBe(404);
    expect(await counts()).toEqual(before);

    as(seeded.people.admin);
    const made = await invite("twice@example.org", "viewer");
    const first = await mailedToken("twice@example.org");
    const resent = await call(resend.POST, { path: "/x", method: "POST", params: { id: String(made.json.id) } });
    expect(resent.status).toBe(200);
    const second = await mailedToken("twice@example.org");
    expect(second).not.toBe(first);
    signedIn = null;
    expect((await acceptNew(first)).status).toBe(404);
    expect((await acceptNew(second)).status).toBe(200);
  });

  it("adds an existing account when its owner accepts signed in, and refuses someone signed in as another address", async () => {
    as(seeded.people.admin);
    const outsider = seeded.outsider;
    await invite(outsider.email, "contributor");
    const token = await mailedToken(outsider.email);
    as(seeded.people.viewer);
    const wrong = await call(accept.POST, { path: "/x", method: "POST", body: { token } });
    expect(wrong.status).toBe(403);
    expect(String((wrong.json.error as { message: string }).message)).toContain(outsider.email);
    signedIn = null;
    const signedOut = await acceptNew(token);
    expect(signedOut.status).toBe(409);
    expect(signedOut.json.error).toMatchObject({ field: "email" });
    // Everyone who signs up has a workspace of their own; so does the outsider here.
    await createWorkspace({ userId: outsider.id, name: "Outsider's atlas" });
    signedIn = { id: outsider.id, email: outsider.email, name: "An outsider" };
    const res = await call(accept.POST, { path: "/x", method: "POST", body: { token } });
    expect(res.status).toBe(200);
    expect(res.json).toMatchObject({ role: "contributor", workspaceId: seeded.workspace.id });
    const mine = await listWorkspacesForUser({ userId: outsider.id });
    expect(mine.map((w) => [w.name, w.role])).toEqual([
      ["Outsider's atlas", "admin"],
      ["Atlas lab", "contributor"],
    ]);
  });

  it("refuses a member's address, a bad role and a bad address with the field named", async () => {
    as(seeded.people.admin);
    const member = await invite(seeded.people.viewer.email, "viewer");
    expect(member.status).toBe(409);
    expect(member.json.error).toMatchObject({ field: "email" });
    const badRole = await invite("x@example.org", "owner");
    expect([badRole.status, (badRole.json.error as { field: string }).field]).toEqual([400, "role"]);
    const badEmail = await invite("not an address", "viewer");
    expect([badEmail.status, (badEmail.json.error as { field: string }).field]).toEqual([400, "email"]);
  });
});

describe("the last admin", () => {
  it("can be neither demoted nor removed; once another admin exists, both work", async () => {
    as(seeded.people.admin);
    const adminId = seeded.people.admin.id;
    const demote = await call(memberById.PATCH, { path: "/x", method: "PATCH", body: { role: "curator" }, params: { userId: adminId } });
    expect(demote.status).toBe(409);
    expect(String((demote.json.error as { message: string }).message)).toBe("A workspace needs at least one admin: make another member admin first.");
    const remove = await call(memberById.DELETE, { path: "/x", method: "DELETE", params: { userId: adminId } });
    expect(remove.status).toBe(409);
    const role = async (userId: string) => (await t.db.select().from(memberships).where(eq(memberships.userId, userId)).all()).find((m) => m.workspaceId === seeded.workspace.id)?.role;
    expect(await role(adminId)).toBe("admin");

    const promote = await call(memberById.PATCH, { path: "/x", method: "PATCH", body: { role: "admin" }, params: { userId: seeded.people.curator.id } });
    expect(promote.status).toBe(200);
    expect(promote.json).toMatchObject({ role: "admin", userId: seeded.people.curator.id });

    // Two admins demoting each other at the same moment: exactly one succeeds.
    const curatorAsAdmin = seeded.people.curator;
    const results = await Promise.all([
      call(memberById.PATCH, { path: "/x", method: "PATCH", body: { role: "viewer" }, params: { userId: curatorAsAdmin.id } }),
      call(memberById.PATCH, { path: "/x", method: "PATCH", body: { role: "viewer" }, params: { userId: adminId } }),
    ]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
    const admins = (await t.db.select().from(memberships).where(eq(memberships.workspaceId, seeded.workspace.id)).all()).filter((m) => m.role === "admin");
    expect(admins).toHaveLength(1);
  });

  it("answers 404 for someone who is not a member", async () => {
    as(seeded.people.admin);
    const admins = (await t.db.select().from(memberships).where(eq(memberships.workspaceId, seeded.workspace.id)).all()).filter((m) => m.role === "admin");
    const admin = await t.db.select().from(users).where(eq(users.id, admins[0].userId)).get();
    signedIn = { id: admin!.id, email: admin!.email, name: admin!.name };
    const res = await call(memberById.DELETE, { path: "/x", method: "DELETE", params: { userId: "nobody" } });
    expect(res.status).toBe(404);
    expect(res.json.error).toMatchObject({ field: "userId" });
  });
});
