"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { fieldErrorsOf, type FormState } from "@/components/ui/form-state";
import { revokeInvitation } from "@/db/queries/invitations";
import { env } from "@/env";
import { ROLES } from "@/lib/policy";
import { requireAction } from "@/server/context";
import { isAppError } from "@/server/errors";
import { inviteMember, resendInvitation } from "@/server/team/invitations";
import { changeRole, removeFromWorkspace } from "@/server/team/members";

const InviteForm = z.object({
  email: z.string().trim().min(1, "Enter an e-mail address.").max(254, "Use at most 254 characters.").email("Enter a valid e-mail address."),
  role: z.enum(ROLES, { message: "Choose a role." }),
});
const Id = z.string().min(1).max(200);
const RoleForm = z.object({ userId: Id, role: z.enum(ROLES, { message: "Choose a role." }) });

function text(form: FormData, name: string): string {
  const v = form.get(name);
  return typeof v === "string" ? v : "";
}

function refusal(err: unknown): FormState {
  if (isAppError(err)) return { status: "error", message: err.message };
  console.error("members:", err);
  return { status: "error", message: "That did not work just now; nothing was changed. Please try again." };
}

export async function inviteAction(_prev: FormState<"email" | "role">, form: FormData): Promise<FormState<"email" | "role">> {
  const { user, workspace } = await requireAction("member:invite");
  const values = { email: text(form, "email"), role: text(form, "role") };
  const parsed = InviteForm.safeParse(values);
  if (!parsed.success) return { status: "error", fieldErrors: fieldErrorsOf(parsed.error.issues), values };
  try {
    await inviteMember({ workspaceId: workspace.id, inviter: user, email: parsed.data.email, role: parsed.data.role, appUrl: env.APP_URL });
  } catch (err) {
    if (isAppError(err) && err.field === "email") return { status: "error", fieldErrors: { email: [err.message] }, values };
    return { ...refusal(err), values };
  }
  revalidatePath("/members");
  return { status: "ok", message: `Invitation mailed to ${parsed.data.email} as ${parsed.data.role}. The link works once, for 7 days.` };
}

export async function changeRoleAction(_prev: FormState, form: FormData): Promise<FormState> {
  const { user, workspace } = await requireAction("member:change-role");
  const parsed = RoleForm.safeParse({ userId: text(form, "userId"), role: text(form, "role") });
  if (!parsed.success) return { status: "error", message: parsed.error.issues[0].message };
  try {
    const member = await changeRole({ workspaceId: workspace.id, userId: parsed.data.userId, role: parsed.data.role, actorId: user.id });
    revalidatePath("/members");
    return { status: "ok", message: `${member.name} is now ${member.role}.` };
  } catch (err) {
    return refusal(err);
  }
}

export async function removeMemberAction(_prev: FormState, form: FormData): Promise<FormState> {
  const { user, workspace } = await requireAction("member:remove");
  const parsed = Id.safeParse(text(form, "userId"));
  if (!parsed.success) return { status: "error", message: "Choose a member to remove." };
  try {
    await removeFromWorkspace({ workspaceId: workspace.id, userId: parsed.data, actorId: user.id });
    revalidatePath("/members");
    return { status: "ok", message: "Removed from the workspace." };
  } catch (err) {
    return refusal(err);
  }
}

export async function resendInvitationAction(_prev: FormState, form: FormData): Promise<FormState> {
  const { user, workspace } = await requireAction("member:invite");
  const parsed = Id.safeParse(text(form, "invitationId"));
  if (!parsed.success) return { status: "error", message: "Choose an invitation." };
  try {
    const { invitation } = await resendInvitation({ workspaceId: workspace.id, invitationId: parsed.data, inviter: user, appUrl: env.APP_URL });
    revalidatePath("/members");
    return { status: "ok", message: `Mailed again to ${invitation.email} with a new link.` };
  } catch (err) {
    return refusal(err);
  }
}

export async function revokeInvitationAction(_prev: FormState, form: FormData): Promise<FormState> {
  const { user, workspace } = await requireAction("invitation:revoke");
  const parsed = Id.safeParse(text(form, "invitationId"));
  if (!parsed.success) return { status: "error", message: "Choose an invitation." };
  const revoked = await revokeInvitation({ workspaceId: workspace.id, id: parsed.data, actorId: user.id }).catch(() => null);
  if (revoked === null) return { status: "error", message: "The invitation could not be revoked just now; nothing was changed." };
  if (!revoked) return { status: "error", message: "No pending invitation like that in this workspace: it was accepted or revoked already." };
  revalidatePath("/members");
  return { status: "ok", message: "Invitation revoked; its link no longer works." };
}
