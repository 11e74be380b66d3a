/**
 * The role × action matrix of the team features, as one table through the real route handlers and
 * server actions. Each row's expected answers are written out by hand, one per person:
 * [viewer, contributor, curator, admin, admin of another workspace, signed out].
 * The other workspace's admin acts in their own workspace, so this workspace's records are 404 to them.
 * Server actions answer with a redirect (403 → /forbidden, 401 → /sign-in) or a form state; the
 * table maps those to the same numbers.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { eq } from "drizzle-orm";
import { setSessionReader } from "@/app/api/_lib/actor";
import * as annotationsRoute from "@/app/api/annotations/route";
import * as auditRoute from "@/app/api/audit/route";
import * as invitationById from "@/app/api/invitations/[id]/route";
import * as resendRoute from "@/app/api/invitations/[id]/resend/route";
import * as invitationsRoute from "@/app/api/invitations/route";
import * as memberById from "@/app/api/members/[userId]/route";
import * as membersRoute from "@/app/api/members/route";
import * as deliveryRoute from "@/app/api/notifications/delivery/route";
import * as notificationsRoute from "@/app/api/notifications/route";
import * as outboxResend from "@/app/api/outbox/[id]/resend/route";
import * as outboxRoute from "@/app/api/outbox/route";
import * as watchRules from "@/app/api/watch-rules/route";
import * as currentWorkspace from "@/app/api/workspaces/current/route";
import * as workspacesRoute from "@/app/api/workspaces/route";
import { annotateAction } from "@/app/curate/actions";
import { changeRoleAction, inviteAction, removeMemberAction, revokeInvitationAction } from "@/app/members/actions";
import { setPublicViewAction } from "@/app/workspaces/actions";
import { setDatabase } from "@/db/queries/connection";
import { createCertifiedEdge } from "@/db/queries/maps";
import { memberships, notificationOutbox, users, workspaces } from "@/db/schema";
import { inviteMember } from "@/server/team/invitations";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { call } from "./api-support";
import { edgeInput, seedAtlasPeople } from "./atlas-fixtures";

type Person = { id: string; email: string } | null;
const session = vi.hoisted(() => ({ person: null as { id: string } | null, workspaceId: "" }));

// Server actions read the session through next-auth and the chosen workspace from a cookie; outside
// Next both are given here. Everything after that (policy, queries, database) is the real code.
vi.mock("@/auth", () => ({
  auth: async () => (session.person ? { user: { id: session.person.id } } : null),
  signIn: async () => undefined,
  signOut: async () => undefined,
}));
vi.mock("next/headers", () => ({
  cookies: async () => ({ get: (name: string) => (name === "squarely-ws" && session.workspaceId ? { value: session.workspaceId } : undefined), set: () => undefined }),
  headers: async () => new Headers(),
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

let t: TestDatabase;
let seeded: Awaited<ReturnType<typeof seedAtlasPeople>>;
let other: { id: string; email: string };
let mapId: string;
let modelId: string;
let n = 0;

const WHO = ["viewer", "contributor", "curator", "admin", "other", "signedOut"] as const;
type Who = (typeof WHO)[number];
type Expect = [number, number, number, number, number, number];

function personOf(who: Who): Person {
  if (who === "signedOut") return null;
  if (who === "other") return other;
  return seeded.people[who];
}

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  seeded = await seedAtlasPeople(t.db, "matrix-lab");
  const [ws2] = await t.db.insert(workspaces).values({ slug: "elsewhere", name: "Elsewhere" }).returning();
  const [u] = await t.db.insert(users).values({ email: "admin@elsewhere.test", name: "Other admin" }).returning();
  await t.db.insert(memberships).values({ workspaceId: ws2.id, userId: u.id, role: "admin" });
  other = { id: u.id, email: u.email };
  const edge = await createCertifiedEdge(edgeInput(seeded.workspace.id, seeded.people.contributor.id, 146, 128, 3));
  mapId = edge.mapId;
  modelId = (await t.db.query.maps.findFirst({ where: (m, { eq: is }) => is(m.id, mapId) }))!.targetModelId;
  setSessionReader(async () => {
    const p = session.person;
    if (!p) return null;
    const row = await t.db.select().from(users).where(eq(users.id, p.id)).get();
    return row ? { id: row.id, email: row.email, name: row.name } : null;
  });
});

afterAll(() => {
  setSessionReader(null);
  setDatabase(null);
  t.cleanup();
});

/** A fresh member of the workspace to act on (each removal or role change needs its own). */
async function freshMember(): Promise<string> {
  const [u] = await t.db.insert(users).values({ email: `m${++n}@matrix-lab.test`, name: `Member ${n}` }).returning();
  await t.db.insert(memberships).values({ workspaceId: seeded.workspace.id, userId: u.id, role: "viewer" });
  return u.id;
}

async function freshInvitation(): Promise<string> {
  const { invitation } = await inviteMember({ workspaceId: seeded.workspace.id, inviter: { id: seeded.people.admin.id, name: "admin" }, email: `i${++n}@elsewhere.test`, role: "viewer", appUrl: "http://atlas.test" });
  return invitation.id;
}

async function freshFailedMail(): Promise<string> {
  const [row] = await t.db.insert(notificationOutbox).values({ workspaceId: seeded.workspace.id, toAddress: `f${++n}@matrix-lab.test`, subject: "s", body: "b", status: "failed", lastError: "550" }).returning();
  return row.id;
}

type Row = { name: string; expect: Expect; run: () => Promise<number> };

type Req = Parameters<typeof call>[1];
/** A route handler call; the request is built when the row runs (fresh subjects, ids known by then). */
const api = (handler: unknown, request: Req | (() => Req | Promise<Req>)) => async () =>
  (await call(handler, typeof request === "function" ? await request() : request)).status;

/** Calls a server action and reads its outcome as an HTTP status would say it. */
function action<S extends { status: string; message?: string }>(fn: (prev: S, form: FormData) => Promise<S>, fields: () => Promise<Record<string, string>> | Record<string, string>) {
  return async () => {
    const form = new FormData();
    for (const [k, v] of Object.entries(await fields())) form.set(k, v);
    try {
      const state = await fn({ status: "idle" } as S, form);
      if (state.status === "ok") return 200;
      if (/^No |not a member/.test(state.message ?? "")) return 404;
      if (/you need the .* role/.test(state.message ?? "")) return 403;
      return 400;
    } catch (err) {
      const digest = String((err as { digest?: string }).digest ?? "");
      if (digest.includes("/forbidden")) return 403;
      if (digest.includes("/sign-in")) return 401;
      if (digest.includes("/dashboard")) return 200;
      throw err;
    }
  };
}

const rows: Row[] = [
  // Members and invitations (API)
  { name: "GET /api/members", expect: [200, 200, 200, 200, 200, 401], run: api(membersRoute.GET, { path: "/api/members" }) },
  { name: "GET /api/invitations", expect: [403, 403, 403, 200, 200, 401], run: api(invitationsRoute.GET, { path: "/api/invitations" }) },
  {
    name: "POST /api/invitations (invite)",
    expect: [403, 403, 403, 201, 201, 401],
    run: api(invitationsRoute.POST, () => ({ path: "/x", method: "POST", body: { email: `new${++n}@elsewhere.test`, role: "viewer" } })),
  },
  {
    name: "DELETE /api/invitations/{id} (revoke)",
    expect: [403, 403, 403, 200, 404, 401],
    run: api(invitationById.DELETE, async () => ({ path: "/x", method: "DELETE", params: { id: await freshInvitation() } })),
  },
  {
    name: "POST /api/invitations/{id}/resend",
    expect: [403, 403, 403, 200, 404, 401],
    run: api(resendRoute.POST, async () => ({ path: "/x", method: "POST", params: { id: await freshInvitation() } })),
  },
  {
    name: "PATCH /api/members/{userId} (change role)",
    expect: [403, 403, 403, 200, 404, 401],
    run: api(memberById.PATCH, async () => ({ path: "/x", method: "PATCH", body: { role: "contributor" }, params: { userId: await freshMember() } })),
  },
  {
    name: "DELETE /api/members/{userId} (remove)",
    expect: [403, 403, 403, 200, 404, 401],
    run: api(memberById.DELETE, async () => ({ path: "/x", method: "DELETE", params: { userId: await freshMember() } })),
  },
  // Workspaces
  { name: "GET /api/workspaces", expect: [200, 200, 200, 200, 200, 401], run: api(workspacesRoute.GET, { path: "/api/workspaces" }) },
  { name: "POST /api/workspaces (create)", expect: [201, 201, 201, 201, 201, 401], run: api(workspacesRoute.POST, () => ({ path: "/x", method: "POST", body: { name: `Team ${++n}` } })) },
  {
    name: "PATCH /api/workspaces/current (publish view)",
    expect: [403, 403, 403, 200, 200, 401],
    run: api(currentWorkspace.PATCH, { path: "/x", method: "PATCH", body: { publicView: false } }),
  },
  // Curating
  {
    name: "POST /api/annotations (note)",
    expect: [403, 201, 201, 201, 404, 401],
    run: api(annotationsRoute.POST, () => ({ path: "/x", method: "POST", body: { subjectType: "map", subjectId: mapId, kind: "note", text: `note ${++n}` } })),
  },
  {
    name: "POST /api/annotations (tag)",
    expect: [403, 201, 201, 201, 404, 401],
    run: api(annotationsRoute.POST, () => ({ path: "/x", method: "POST", body: { subjectType: "model", subjectId: modelId, kind: "tag", text: `tag-${++n}` } })),
  },
  {
    name: "POST /api/annotations (mark published)",
    expect: [403, 201, 201, 201, 404, 401],
    run: api(annotationsRoute.POST, () => ({ path: "/x", method: "POST", body: { subjectType: "map", subjectId: mapId, kind: "published", text: "arXiv:1501.00001" } })),
  },
  // Mail, watches, log
  { name: "GET /api/outbox (delivery state)", expect: [403, 403, 403, 200, 200, 401], run: api(outboxRoute.GET, { path: "/api/outbox" }) },
  {
    name: "POST /api/outbox/{id}/resend",
    expect: [403, 403, 403, 200, 409, 401],
    run: api(outboxResend.POST, async () => ({ path: "/x", method: "POST", params: { id: await freshFailedMail() } })),
  },
  { name: "GET /api/audit (browse)", expect: [403, 403, 403, 200, 200, 401], run: api(auditRoute.GET, { path: "/api/audit?page=1" }) },
  {
    name: "POST /api/watch-rules (saved search)",
    expect: [201, 201, 201, 201, 404, 401],
    run: api(watchRules.POST, () => ({ path: "/x", method: "POST", body: { scope: "onto", modelId } })),
  },
  { name: "GET /api/notifications", expect: [200, 200, 200, 200, 200, 401], run: api(notificationsRoute.GET, { path: "/api/notifications" }) },
  { name: "PUT /api/notifications/delivery", expect: [200, 200, 200, 200, 200, 401], run: api(deliveryRoute.PUT, { path: "/x", method: "PUT", body: { delivery: "immediate" } }) },
  // Server actions
  { name: "action: invite", expect: [403, 403, 403, 200, 200, 401], run: action(inviteAction, () => ({ email: `act${++n}@elsewhere.test`, role: "viewer" })) },
  { name: "action: change role", expect: [403, 403, 403, 200, 404, 401], run: action(changeRoleAction, async () => ({ userId: await freshMember(), role: "curator" })) },
  { name: "action: remove member", expect: [403, 403, 403, 200, 404, 401], run: action(removeMemberAction, async () => ({ userId: await freshMember() })) },
  { name: "action: revoke invitation", expect: [403, 403, 403, 200, 404, 401], run: action(revokeInvitationAction, async () => ({ invitationId: await freshInvitation() })) },
  { name: "action: publish view", expect: [403, 403, 403, 200, 200, 401], run: action(setPublicViewAction, () => ({ publicView: "off" })) },
  { name: "action: note", expect: [403, 200, 200, 200, 404, 401], run: action(annotateAction, () => ({ subjectType: "map", subjectId: mapId, kind: "note", text: `an action note ${++n}` })) },
  { name: "action: tag", expect: [403, 200, 200, 200, 404, 401], run: action(annotateAction, () => ({ subjectType: "map", subjectId: mapId, kind: "tag", text: `t${++n}` })) },
  { name: "action: mark published", expect: [403, 200, 200, 200, 404, 401], run: action(annotateAction, () => ({ subjectType: "map", subjectId: mapId, kind: "published", text: "10.1103/PhysRevE.73.026203" })) },
];

describe("the team's role × action matrix", () => {
  it("answers each person as written in the table", async () => {
    const got: string[] = [];
    const want: string[] = [];
    for (const row of rows)
      for (const [i, who] of WHO.entries()) {
        const person = personOf(who);
        session.person = person;
        session.workspaceId = person === other ? "" : seeded.workspace.id;
        got.push(`${row.name} as ${who}: ${await row.run()}`);
        want.push(`${row.name} as ${who}: ${row.expect[i]}`);
      }
    expect(got).toEqual(want);
  });
});
