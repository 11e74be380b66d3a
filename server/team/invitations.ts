import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { getDatabase, withDb } from "@/db/queries/connection";
import { recordAuditEvent } from "@/db/queries/audit";
import {
  addInvitedMember,
  claimInvitation,
  createInvitation,
  findInvitationByTokenHash,
  getInvitation,
  renewInvitationToken,
} from "@/db/queries/invitations";
import { getMembershipRole } from "@/db/queries/memberships";
import { enqueueMail } from "@/db/queries/outbox";
import { getUserByEmail, normalizeEmail } from "@/db/queries/users";
import { getWorkspaceById } from "@/db/queries/workspaces";
import { users, type Invitation } from "@/db/schema";
import type { Role } from "@/lib/policy";
import { AppError } from "@/server/errors";

/** How long an invitation link works unless the admin says otherwise. */
export const INVITATION_DAYS = 7;
const DAY_MS = 24 * 60 * 60_000;

/** Only the SHA-256 of an invitation token is stored, as for sign-in links (server/auth/sign-in-link.ts). */
export function hashInvitationToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

function newToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString("base64url");
  return { token, tokenHash: hashInvitationToken(token) };
}

export function invitationLink(appUrl: string, token: string): string {
  const link = new URL("/invite", appUrl);
  link.searchParams.set("token", token);
  return link.toString();
}

function invitationMail({ workspaceName, inviterName, role, link, expiresAt }: { workspaceName: string; inviterName: string; role: Role; link: string; expiresAt: Date }) {
  return {
    subject: `${inviterName} invites you to ${workspaceName} on Squarely`,
    body: [
      `${inviterName} invites you to join the workspace "${workspaceName}" as ${role}.`,
      "",
      "Open this link to accept. It works once, until " + expiresAt.toUTCString() + ":",
      "",
      link,
      "",
      "If you do not know the sender, ignore this message; nothing happens without the link.",
    ].join("\n"),
  };
}

type Inviter = { id: string; name: string };

/**
 * Invites an address with a role: the invitation (token stored hashed) and its mail in the outbox,
 * in one transaction. A member of the workspace cannot be invited again.
 */
export async function inviteMember({
  workspaceId,
  inviter,
  email,
  role,
  appUrl,
  days = INVITATION_DAYS,
  now = new Date(),
}: {
  workspaceId: string;
  inviter: Inviter;
  email: string;
  role: Role;
  appUrl: string;
  days?: number;
  now?: Date;
}): Promise<{ invitation: Invitation; link: string }> {
  const db = getDatabase();
  const address = normalizeEmail(email);
  const existing = await getUserByEmail({ email: address });
  if (existing && (await getMembershipRole({ workspaceId, userId: existing.id })))
    throw new AppError("conflict", `${address} is already a member of this workspace.`, { field: "email" });
  const workspace = await getWorkspaceById({ id: workspaceId });
  if (!workspace) throw new AppError("not_found", "No such workspace.");
  const { token, tokenHash } = newToken();
  const expiresAt = new Date(now.getTime() + days * DAY_MS);
  const link = invitationLink(appUrl, token);
  const invitation = await withDb("saving an invitation", () => db.transaction(async (tx) => {
    const row = await createInvitation({ db: tx, workspaceId, email: address, role, tokenHash, invitedBy: inviter.id, expiresAt });
    const mail = invitationMail({ workspaceName: workspace.name, inviterName: inviter.name, role, link, expiresAt });
    await enqueueMail({ db: tx, mail: { workspaceId, userId: null, toAddress: address, ...mail } });
    await recordAuditEvent({ db: tx, workspaceId, actorId: inviter.id, action: "member:invite", subjectType: "invitation", subjectId: row.id, detail: { email: address, role } });
    return row;
  }));
  return { invitation, link };
}

/** Mails a pending invitation again with a new link (the old one stops working) and a new expiry. */
export async function resendInvitation({
  workspaceId,
  invitationId,
  inviter,
  appUrl,
  days = INVITATION_DAYS,
  now = new Date(),
}: {
  workspaceId: string;
  invitationId: string;
  inviter: Inviter;
  appUrl: string;
  days?: number;
  now?: Date;
}): Promise<{ invitation: Invitation; link: string }> {
  const db = getDatabase();
  const current = await getInvitation({ workspaceId, id: invitationId });
  if (!current) throw new AppError("not_found", `No invitation ${invitationId} in this workspace.`, { field: "id" });
  if (current.acceptedAt || current.revokedAt)
    throw new AppError("conflict", `This invitation was already ${current.acceptedAt ? "accepted" : "revoked"}; invite the address again instead.`);
  const workspace = await getWorkspaceById({ id: workspaceId });
  const { token, tokenHash } = newToken();
  const expiresAt = new Date(now.getTime() + days * DAY_MS);
  const link = invitationLink(appUrl, token);
  const invitation = await withDb("saving an invitation", () => db.transaction(async (tx) => {
    const row = await renewInvitationToken({ db: tx, workspaceId, id: invitationId, tokenHash, expiresAt });
    if (!row) throw new AppError("conflict", "This invitation was accepted or revoked meanwhile.");
    const mail = invitationMail({ workspaceName: workspace?.name ?? "a workspace", inviterName: inviter.name, role: row.role, link, expiresAt });
    await enqueueMail({ db: tx, mail: { workspaceId, userId: null, toAddress: row.email, ...mail } });
    await recordAuditEvent({ db: tx, workspaceId, actorId: inviter.id, action: "member:invite", subjectType: "invitation", subjectId: row.id, detail: { email: row.email, role: row.role, resent: true } });
    return row;
  }));
  return { invitation, link };
}

export type InvitationCheck =
  | { ok: true; invitation: Invitation; workspaceName: string; hasAccount: boolean }
  | { ok: false; reason: "unknown" | "revoked" | "used" | "expired"; message: string };

/** What a link is worth before anyone acts on it: the accept page shows this. Reads only. */
export async function checkInvitation({ token, now = new Date() }: { token: string; now?: Date }): Promise<InvitationCheck> {
  const invitation = await findInvitationByTokenHash({ tokenHash: hashInvitationToken(token) });
  if (!invitation) return { ok: false, reason: "unknown", message: "This invitation link is not valid. It may have been replaced by a newer one: use the latest mail, or ask the admin to resend it." };
  if (invitation.revokedAt) return { ok: false, reason: "revoked", message: "This invitation was withdrawn by an admin of the workspace. Ask them for a new one if you still need access." };
  if (invitation.acceptedAt) return { ok: false, reason: "used", message: "This invitation was already accepted; a link works only once. Sign in to reach the workspace." };
  if (invitation.expiresAt.getTime() <= now.getTime())
    return { ok: false, reason: "expired", message: `This invitation expired on ${invitation.expiresAt.toUTCString()}. Ask an admin of the workspace to resend it.` };
  const workspace = await getWorkspaceById({ id: invitation.workspaceId });
  const hasAccount = (await getUserByEmail({ email: invitation.email })) !== null;
  return { ok: true, invitation, workspaceName: workspace?.name ?? "", hasAccount };
}

function refusal(check: Exclude<InvitationCheck, { ok: true }>): AppError {
  return new AppError(check.reason === "unknown" ? "not_found" : "conflict", check.message, { field: "token", details: { reason: check.reason } });
}

/**
 * Accepts an invitation. Signed in (`userId`): the person must own the invited address, and joins.
 * Signed out with `newAccount`: creates the account for the invited address (the link proves the
 * address) and joins. Either way the token is used up in the same transaction; a refusal writes nothing.
 */
export async function acceptInvitation({
  token,
  userId,
  newAccount,
  now = new Date(),
}: {
  token: string;
  userId?: string;
  newAccount?: { name: string; passwordHash: string };
  now?: Date;
}): Promise<{ workspaceId: string; userId: string; email: string; role: Role }> {
  const check = await checkInvitation({ token, now });
  if (!check.ok) throw refusal(check);
  const { invitation } = check;
  const db = getDatabase();
  if (userId) {
    const account = await getUserByEmail({ email: invitation.email });
    if (!account || account.id !== userId)
      throw new AppError("forbidden", `This invitation is for ${invitation.email}; sign in with that address to accept it.`, { field: "token" });
  } else if (!newAccount) throw new AppError("unauthenticated", "Sign in, or create an account, to accept the invitation.");
  else if (check.hasAccount) throw new AppError("conflict", `${invitation.email} already has an account: sign in to accept.`, { field: "email" });

  return withDb("accepting an invitation", () => db.transaction(async (tx) => {
    let memberId = userId;
    if (!memberId) {
      const [created] = await tx
        .insert(users)
        .values({ email: invitation.email, name: newAccount!.name.trim(), passwordHash: newAccount!.passwordHash, emailVerifiedAt: now })
        .returning({ id: users.id });
      memberId = created.id;
    }
    const claimed = await claimInvitation({ db: tx, tokenHash: invitation.tokenHash, userId: memberId, now });
    if (!claimed) throw new AppError("conflict", "This invitation was used, withdrawn or expired a moment ago.", { field: "token" });
    const role = await addInvitedMember({ db: tx, workspaceId: claimed.workspaceId, userId: memberId, role: claimed.role });
    await recordAuditEvent({ db: tx, workspaceId: claimed.workspaceId, actorId: memberId, action: "member:join", subjectType: "user", subjectId: memberId, detail: { role, email: claimed.email } });
    return { workspaceId: claimed.workspaceId, userId: memberId, email: claimed.email, role };
  }));
}
