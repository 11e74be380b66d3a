import type { Metadata } from "next";
import Link from "next/link";
import { NoteForm } from "@/components/dashboard/note-form";
import { ActivityList } from "@/components/dashboard/activity-list";
import { RecentCertified } from "@/components/dashboard/recent-certified";
import { Panel } from "@/components/ui/panel";
import { RoleBadge } from "@/components/ui/role-badge";
import { listMembers } from "@/db/queries/memberships";
import { describeWatch, listWorkspaceWatches } from "@/db/queries/watches";
import { countConstantTargetMaps, getWorkspaceSummary, listActiveJobs, listRecentChains, listRecentMaps } from "@/db/queries/workspaces";
import { can, refusalReason } from "@/lib/policy";
import { getWorkspaceContext } from "@/server/context";
import { getJobKind } from "@/server/jobs";
import { readableLog } from "@/server/team/log";

export const metadata: Metadata = { title: "Workspace home" };

const COUNTS = [
  { key: "models", label: "Models", href: "/atlas" },
  { key: "maps", label: "Certified maps", href: "/atlas?view=maps" },
  { key: "chains", label: "Chains", href: "/chains" },
  { key: "jobs", label: "Jobs", href: "/jobs" },
] as const;

export default async function DashboardPage() {
  const { user, workspace, role } = await getWorkspaceContext();
  const [summary, members, log, recent, constantRecent, constantCount, chains, running, watches] = await Promise.all([
    getWorkspaceSummary({ workspaceId: workspace.id }),
    listMembers({ workspaceId: workspace.id }),
    readableLog({ workspaceId: workspace.id, limit: 15 }),
    listRecentMaps({ workspaceId: workspace.id, limit: 6, constantTargets: "exclude" }),
    listRecentMaps({ workspaceId: workspace.id, limit: 5, constantTargets: "only" }),
    countConstantTargetMaps({ workspaceId: workspace.id }),
    listRecentChains({ workspaceId: workspace.id, limit: 4 }),
    listActiveJobs({ workspaceId: workspace.id, limit: 5 }),
    listWorkspaceWatches({ workspaceId: workspace.id }),
  ]);

  return (
    <div className="mx-auto max-w-6xl space-y-6 px-5 py-8">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <p className="text-sm text-ink-soft">Signed in as {user.name}</p>
          <h1 className="mt-1 text-3xl font-semibold tracking-tight text-tide-900">{workspace.name}</h1>
          <p className="mt-2 flex items-center gap-2 text-sm text-ink-soft">
            Your role here: <RoleBadge role={role} />
            <span className="font-mono text-xs text-ink-faint">/{workspace.slug}</span>
          </p>
        </div>
        <Link href="/atlas" className="rounded-md bg-tide-700 px-4 py-2 text-sm font-semibold text-paper-raised hover:bg-tide-800">
          Open the atlas
        </Link>
      </div>

      <dl className="grid grid-cols-2 gap-4 md:grid-cols-4">
        {COUNTS.map((c) => (
          <Link key={c.key} href={c.href} className="group rounded-[var(--radius-card)] border border-line bg-paper-raised p-4 hover:border-tide-300">
            <dt className="text-sm text-ink-soft group-hover:text-tide-700">{c.label}</dt>
            <dd className="mt-1 font-mono text-3xl font-medium text-tide-900">{summary[c.key]}</dd>
          </Link>
        ))}
      </dl>

      <div className="grid gap-6 lg:grid-cols-[1.6fr_1fr]">
        <div className="min-w-0 space-y-6">
          <Panel title="Recently certified">
            <RecentCertified maps={recent} constant={{ count: constantCount, recent: constantRecent }} chains={chains} />
          </Panel>
          <Panel title="Workspace log">
            {can(role, "note:post") ? (
              <NoteForm />
            ) : (
              <p className="rounded-md bg-paper px-3 py-2 text-sm text-ink-soft">{refusalReason(role, "note:post")} You can read the log.</p>
            )}
            <div className="mt-5 border-t border-line pt-4">
              <ActivityList items={log} />
            </div>
            {can(role, "audit:browse") ? (
              <p className="mt-4 text-right text-sm">
                <Link href="/audit" className="text-tide-700 underline">
                  Browse the full audit log
                </Link>
              </p>
            ) : null}
          </Panel>
        </div>

        <div className="min-w-0 space-y-6">
          <Panel title={`Running jobs (${running.length})`}>
            {running.length === 0 ? (
              <p className="text-sm text-ink-soft">No job is queued or running.</p>
            ) : (
              <ul className="divide-y divide-line">
                {running.map((j) => (
                  <li key={j.id} className="flex items-center justify-between gap-2 py-2 text-sm">
                    <Link href={`/jobs/${j.id}`} className="truncate text-tide-800 hover:underline" title={j.kind}>
                      {getJobKind(j.kind)?.title ?? j.kind}
                    </Link>
                    <span className="text-xs text-ink-faint">
                      {j.ownerName ?? "someone"} · {j.status} {Math.round(j.progress * 100)}%
                    </span>
                  </li>
                ))}
              </ul>
            )}
          </Panel>
          <Panel title="Who watches what">
            {watches.length === 0 ? (
              <p className="text-sm text-ink-soft">Nobody watches anything yet.</p>
            ) : (
              <ul className="space-y-1.5">
                {watches.map((w) => (
                  <li key={w.id} className="text-sm">
                    <span className="font-medium">{w.userName}</span> <span className="text-ink-soft">watches {describeWatch(w)}</span>
                  </li>
                ))}
              </ul>
            )}
            <p className="mt-3 text-right text-sm">
              <Link href="/notifications" className="text-tide-700 underline">
                Your watches and notifications
              </Link>
            </p>
          </Panel>
          <Panel title={`Members (${summary.members})`} action={<Link href="/members" className="text-sm text-tide-700 underline">{can(role, "member:invite") ? "Invite" : "All"}</Link>}>
            <ul className="divide-y divide-line">
              {members.map((m) => (
                <li key={m.userId} className="flex items-center justify-between gap-3 py-2">
                  <span className="min-w-0 truncate text-sm font-medium">{m.name}</span>
                  <RoleBadge role={m.role} />
                </li>
              ))}
            </ul>
          </Panel>
        </div>
      </div>
    </div>
  );
}
