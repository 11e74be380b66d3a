import "server-only";
import { and, asc, eq, sql } from "drizzle-orm";
import type { Role } from "@/lib/policy";
import { memberships, users, type MAIL_DELIVERIES } from "../schema";
import { recordAuditEvent } from "./audit";
import { getDatabase, withDb, type Executor } from "./connection";

/** The person's role in the workspace, or null when they are not a member. */
export async function getMembershipRole(
  { workspaceId, userId }: { workspaceId: string; userId: string },
  db: Executor = getDatabase(),
): Promise<Role | null> {
  return withDb("reading a membership", async () => {
    const rows = await db
      .select({ role: memberships.role })
      .from(memberships)
      .where(and(eq(memberships.workspaceId, workspaceId), eq(memberships.userId, userId)))
      .limit(1);
    return rows[0]?.role ?? null;
  });
}

/** Adds a member, or changes the role of an existing one. */
export async function setMembership(
  { workspaceId, userId, role }: { workspaceId: string; userId: string; role: Role },
  db: Executor = getDatabase(),
): Promise<void> {
  await withDb("saving a membership", () =>
    db
      .insert(memberships)
      .values({ workspaceId, userId, role })
      .onConflictDoUpdate({ target: [memberships.workspaceId, memberships.userId], set: { role } }),
  );
}

export type Member = { userId: string; name: string; email: string; role: Role };

export async function listMembers({ workspaceId }: { workspaceId: string }, db: Executor = getDatabase()): Promise<Member[]> {
  return withDb("listing members", () =>
    db
      .select({ userId: users.id, name: users.name, email: users.email, role: memberships.role })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(eq(memberships.workspaceId, workspaceId))
      .orderBy(asc(users.name)),
  );
}

export type MailDelivery = (typeof MAIL_DELIVERIES)[number];
export type MemberChange = "changed" | "not_member" | "last_admin";

/**
 * "Someone other than this member is also an admin of the workspace": the condition that keeps the
 * last admin. It sits inside the one UPDATE or DELETE statement, so two admins demoting each other
 * at once cannot both succeed (SQLite runs each statement atomically).
 */
function anotherAdmin(workspaceId: string, userId: string) {
  return sql`exists (select 1 from ${memberships} m2 where m2.workspace_id = ${workspaceId} and m2.role = 'admin' and m2.user_id <> ${userId})`;
}

async function outcome(db: Executor, workspaceId: string, userId: string, changed: boolean): Promise<MemberChange> {
  if (changed) return "changed";
  return (await getMembershipRole({ workspaceId, userId }, db)) ? "last_admin" : "not_member";
}

/** Changes a member's role; the last admin cannot be demoted. */
export async function changeMemberRole({
  db = getDatabase(),
  workspaceId,
  userId,
  role,
  actorId,
}: {
  db?: Executor;
  workspaceId: string;
  userId: string;
  role: Role;
  actorId: string;
}): Promise<MemberChange> {
  return withDb("changing a role", () =>
    db.transaction(async (tx) => {
      const guard = role === "admin" ? sql`1` : sql`(${memberships.role} <> 'admin' or ${anotherAdmin(workspaceId, userId)})`;
      const rows = await tx
        .update(memberships)
        .set({ role })
        .where(and(eq(memberships.workspaceId, workspaceId), eq(memberships.userId, userId), guard))
        .returning({ userId: memberships.userId });
      const result = await outcome(tx, workspaceId, userId, rows.length > 0);
      if (result === "changed")
        await recordAuditEvent({ db: tx, workspaceId, actorId, action: "member:change-role", subjectType: "user", subjectId: userId, detail: { role } });
      return result;
    }),
  );
}

/** Removes a member; the last admin cannot be removed. */
export async function removeMember({
  db = getDatabase(),
  workspaceId,
  userId,
  actorId,
}: {
  db?: Executor;
  workspaceId: string;
  userId: string;
  actorId: string;
}): Promise<MemberChange> {
  return withDb("removing a member", () =>
    db.transaction(async (tx) => {
      const rows = await tx
        .delete(memberships)
        .where(
          and(
            eq(memberships.workspaceId, workspaceId),
            eq(memberships.userId, userId),
            sql`(${memberships.role} <> 'admin' or ${anotherAdmin(workspaceId, userId)})`,
          ),
        )
        .returning({ userId: memberships.userId });
      const result = await outcome(tx, workspaceId, userId, rows.length > 0);
      if (result === "changed")
        await recordAuditEvent({ db: tx, workspaceId, actorId, action: "member:remove", subjectType: "user", subjectId: userId });
      return result;
    }),
  );
}

export async function getMailDelivery({ db = getDatabase(), workspaceId, userId }: { db?: Executor; workspaceId: string; userId: string }): Promise<MailDelivery | null> {
  return withDb("reading a mail preference", async () => {
    const [row] = await db
      .select({ d: memberships.mailDelivery })
      .from(memberships)
      .where(and(eq(memberships.workspaceId, workspaceId), eq(memberships.userId, userId)))
      .limit(1);
    return row?.d ?? null;
  });
}

/** Immediate mail, a daily digest, or none; returns false when the person is not a member. */
export async function setMailDelivery({
  db = getDatabase(),
  workspaceId,
  userId,
  delivery,
}: {
  db?: Executor;
  workspaceId: string;
  userId: string;
  delivery: MailDelivery;
}): Promise<boolean> {
  return withDb("saving a mail preference", async () => {
    const rows = await db
      .update(memberships)
      .set({ mailDelivery: delivery })
      .where(and(eq(memberships.workspaceId, workspaceId), eq(memberships.userId, userId)))
      .returning({ userId: memberships.userId });
    return rows.length > 0;
  });
}
