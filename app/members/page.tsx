import type { Metadata } from "next";
import { InviteForm } from "@/components/team/invite-form";
import { RowAction } from "@/components/team/row-action";
import { Panel } from "@/components/ui/panel";
import { RoleBadge } from "@/components/ui/role-badge";
import { listPendingInvitations } from "@/db/queries/invitations";
import { listMembers } from "@/db/queries/memberships";
import { getPublicView } from "@/db/queries/workspaces";
import { env } from "@/env";
import { PublicViewForm } from "@/components/team/public-view-form";
import { setPublicViewAction } from "@/app/workspaces/actions";
import { ROLES, can } from "@/lib/policy";
import { getWorkspaceContext } from "@/server/context";
import { changeRoleAction, inviteAction, removeMemberAction, resendInvitationAction, revokeInvitationAction } from "./actions";

export const metadata: Metadata = { title: "Members" };

function day(d: Date): string {
  return d.toISOString().slice(0, 10);
}

export default async function MembersPage() {
  const { user, workspace, role } = await getWorkspaceContext();
  const admin = can(role, "member:change-role");
  const [members, invitations, publicView] = await Promise.all([
    listMembers({ workspaceId: workspace.id }),
    admin ? listPendingInvitations({ workspaceId: workspace.id }) : Promise.resolve([]),
    getPublicView({ workspaceId: workspace.id }),
  ]);
  const now = Date.now();

  return (
    <div className="mx-auto max-w-6xl space-y-6 px-5 py-8">
      <div>
        <p className="text-sm text-ink-soft">{workspace.name}</p>
        <h1 className="mt-1 text-3xl font-semibold tracking-tight text-tide-900">Members</h1>
        <p className="mt-2 text-sm text-ink-soft">
          {admin
            ? "Invite people by e-mail, change their roles, or remove them. A workspace always keeps at least one admin."
            : "Only admins can invite, change roles or remove members."}
        </p>
      </div>

      <div className={admin ? "grid items-start gap-6 lg:grid-cols-[1.6fr_1fr]" : ""}>
        <Panel title={`People (${members.length})`}>
          <ul className="divide-y divide-line" aria-label="Members">
            {members.map((m) => (
              <li key={m.userId} className="flex flex-wrap items-start justify-between gap-3 py-3" data-member={m.email}>
                <span className="min-w-0">
                  <span className="flex items-center gap-2 text-sm font-medium">
                    {m.name}
                    {m.userId === user.id ? <span className="text-xs font-normal text-ink-faint">(you)</span> : null}
                  </span>
                  <span className="block truncate text-xs text-ink-faint">{m.email}</span>
                </span>
                {admin ? (
                  <span className="flex flex-wrap items-start gap-2">
                    <RowAction
                      action={changeRoleAction}
                      hidden={{ userId: m.userId }}
                      label="Change role"
                      select={{ name: "role", label: `Role of ${m.name}`, options: ROLES, value: m.role }}
                    />
                    <RowAction action={removeMemberAction} hidden={{ userId: m.userId }} label="Remove" variant="danger" confirm={`Remove ${m.name} from ${workspace.name}?`} />
                  </span>
                ) : (
                  <RoleBadge role={m.role} />
                )}
              </li>
            ))}
          </ul>
        </Panel>

        {admin ? (
          <div className="space-y-6">
            <Panel title="Invite someone">
              <InviteForm roles={ROLES} action={inviteAction} />
            </Panel>
            <Panel title={`Pending invitations (${invitations.length})`}>
              {invitations.length === 0 ? (
                <p className="text-sm text-ink-soft">No invitation is waiting for an answer.</p>
              ) : (
                <ul className="divide-y divide-line" aria-label="Pending invitations">
                  {invitations.map((i) => (
                    <li key={i.id} className="space-y-2 py-3">
                      <div className="flex items-center justify-between gap-2">
                        <span className="min-w-0 truncate text-sm font-medium">{i.email}</span>
                        <RoleBadge role={i.role} />
                      </div>
                      <p className="text-xs text-ink-faint">
                        {i.expiresAt.getTime() <= now ? (
                          <span className="font-semibold text-brick-700">Expired {day(i.expiresAt)}</span>
                        ) : (
                          <>Link works until {day(i.expiresAt)}</>
                        )}
                        {i.invitedByName ? ` · invited by ${i.invitedByName}` : ""}
                      </p>
                      <div className="flex justify-end gap-2">
                        <RowAction action={resendInvitationAction} hidden={{ invitationId: i.id }} label="Resend" />
                        <RowAction action={revokeInvitationAction} hidden={{ invitationId: i.id }} label="Revoke" variant="danger" confirm={`Revoke the invitation of ${i.email}? Its link stops working.`} />
                      </div>
                    </li>
                  ))}
                </ul>
              )}
            </Panel>
            <Panel title={`Public view: ${publicView ? "on" : "off"}`}>
              <PublicViewForm on={publicView} url={new URL(`/public/${workspace.slug}`, env.APP_URL).toString()} action={setPublicViewAction} />
            </Panel>
          </div>
        ) : null}
      </div>
    </div>
  );
}
