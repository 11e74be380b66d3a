import "server-only";
import { and, asc, eq } from "drizzle-orm";
import type { Role } from "@/lib/policy";
import { memberships, users } from "../schema";
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
