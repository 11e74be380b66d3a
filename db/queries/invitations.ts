import "server-only";
import { and, desc, eq, gt, isNull } from "drizzle-orm";
import type { Role } from "@/lib/policy";
import { invitations, memberships, users, type Invitation } from "../schema";
import { recordAuditEvent } from "./audit";
import { getDatabase, withDb, type Executor } from "./connection";
import { normalizeEmail } from "./users";

export type InvitationView = Pick<Invitation, "id" | "email" | "role" | "expiresAt" | "createdAt"> & { invitedByName: string | null };

/** Stores an invitation by the hash of its token; the caller mails the token in the same transaction. */
export async function createInvitation({
  db = getDatabase(),
  workspaceId,
  email,
  role,
  tokenHash,
  invitedBy,
  expiresAt,
}: {
  db?: Executor;
  workspaceId: string;
  email: string;
  role: Role;
  tokenHash: string;
  invitedBy: string;
  expiresAt: Date;
}): Promise<Invitation> {
  return withDb("saving an invitation", async () => {
    const [row] = await db
      .insert(invitations)
      .values({ workspaceId, email: normalizeEmail(email), role, tokenHash, invitedBy, expiresAt })
      .returning();
    return row;
  });
}

/** Pending invitations of a workspace (neither accepted nor revoked), newest first; expired ones included so an admin can resend. */
export async function listPendingInvitations({ db = getDatabase(), workspaceId }: { db?: Executor; workspaceId: string }): Promise<InvitationView[]> {
  return withDb("listing invitations", () =>
    db
      .select({
        id: invitations.id,
        email: invitations.email,
        role: invitations.role,
        expiresAt: invitations.expiresAt,
        createdAt: invitations.createdAt,
        invitedByName: users.name,
      })
      .from(invitations)
      .leftJoin(users, eq(users.id, invitations.invitedBy))
      .where(and(eq(invitations.workspaceId, workspaceId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
      .orderBy(desc(invitations.createdAt)),
  );
}

export async function getInvitation({ db = getDatabase(), workspaceId, id }: { db?: Executor; workspaceId: string; id: string }): Promise<Invitation | null> {
  return withDb("reading an invitation", async () => {
    const [row] = await db
      .select()
      .from(invitations)
      .where(and(eq(invitations.workspaceId, workspaceId), eq(invitations.id, id)))
      .limit(1);
    return row ?? null;
  });
}

export async function findInvitationByTokenHash({ db = getDatabase(), tokenHash }: { db?: Executor; tokenHash: string }): Promise<Invitation | null> {
  return withDb("reading an invitation", async () => {
    const [row] = await db.select().from(invitations).where(eq(invitations.tokenHash, tokenHash)).limit(1);
    return row ?? null;
  });
}

/** Withdraws a pending invitation; returns false when it was already accepted or revoked. */
export async function revokeInvitation({
  db = getDatabase(),
  workspaceId,
  id,
  actorId,
  now = new Date(),
}: {
  db?: Executor;
  workspaceId: string;
  id: string;
  actorId: string;
  now?: Date;
}): Promise<boolean> {
  return withDb("revoking an invitation", () =>
    db.transaction(async (tx) => {
      const rows = await tx
        .update(invitations)
        .set({ revokedAt: now })
        .where(and(eq(invitations.workspaceId, workspaceId), eq(invitations.id, id), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
        .returning({ email: invitations.email });
      if (rows.length === 0) return false;
      await recordAuditEvent({ db: tx, workspaceId, actorId, action: "invitation:revoke", subjectType: "invitation", subjectId: id, detail: { email: rows[0].email } });
      return true;
    }),
  );
}

/** A new token and expiry for a pending invitation (the old link stops working). */
export async function renewInvitationToken({
  db = getDatabase(),
  workspaceId,
  id,
  tokenHash,
  expiresAt,
}: {
  db?: Executor;
  workspaceId: string;
  id: string;
  tokenHash: string;
  expiresAt: Date;
}): Promise<Invitation | null> {
  const [row] = await db
    .update(invitations)
    .set({ tokenHash, expiresAt })
    .where(and(eq(invitations.workspaceId, workspaceId), eq(invitations.id, id), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
    .returning();
  return row ?? null;
}

/**
 * Uses an invitation up: one conditional UPDATE (unused, not revoked, not expired), so two clicks
 * racing on the same link cannot both succeed. Returns the invitation or null.
 */
export async function claimInvitation({
  db,
  tokenHash,
  userId,
  now,
}: {
  db: Executor;
  tokenHash: string;
  userId: string;
  now: Date;
}): Promise<Invitation | null> {
  const [row] = await db
    .update(invitations)
    .set({ acceptedAt: now, acceptedBy: userId })
    .where(and(eq(invitations.tokenHash, tokenHash), isNull(invitations.acceptedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, now)))
    .returning();
  return row ?? null;
}

/** Adds the member with the invited role; a person already a member keeps their role. */
export async function addInvitedMember({ db, workspaceId, userId, role }: { db: Executor; workspaceId: string; userId: string; role: Role }): Promise<Role> {
  const [existing] = await db
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.workspaceId, workspaceId), eq(memberships.userId, userId)))
    .limit(1);
  if (existing) return existing.role;
  await db.insert(memberships).values({ workspaceId, userId, role });
  return role;
}
