import type { Metadata } from "next";
import Link from "next/link";
import { NoteForm } from "@/components/dashboard/note-form";
import { ActivityList } from "@/components/dashboard/activity-list";
import { Panel } from "@/components/ui/panel";
import { RoleBadge } from "@/components/ui/role-badge";
import { listMembers } from "@/db/queries/memberships";
import { listActivity } from "@/db/queries/notes";
import { getWorkspaceSummary } from "@/db/queries/workspaces";
import { ACTIONS, LEAST_ROLE, can, refusalReason } from "@/lib/policy";
import { getWorkspaceContext } from "@/server/context";

export const metadata: Metadata = { title: "Dashboard" };

const COUNTS = [
  { key: "models", label: "Models", href: "/atlas" },
  { key: "maps", label: "Certified maps", href: "/atlas" },
  { key: "chains", label: "Chains", href: "/chains" },
  { key: "jobs", label: "Jobs", href: "/jobs" },
] as const;

export default async function DashboardPage() {
  const { user, workspace, role } = await getWorkspaceContext();
  const [summary, members, activity] = await Promise.all([
    getWorkspaceSummary({ workspaceId: workspace.id }),
    listMembers({ workspaceId: workspace.id }),
    listActivity({ workspaceId: workspace.id, limit: 15 }),
  ]);
  const allowed = ACTIONS.filter((a) => can(role, a));
  const refused = ACTIONS.filter((a) => !can(role, a));

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
        <Panel title="Workspace log">
          {can(role, "note:post") ? (
            <NoteForm />
          ) : (
            <p className="rounded-md bg-paper px-3 py-2 text-sm text-ink-soft">{refusalReason(role, "note:post")} You can read the log.</p>
          )}
          <div className="mt-5 border-t border-line pt-4">
            <ActivityList items={activity} />
          </div>
        </Panel>

        <div className="space-y-6">
          <Panel title={`Members (${summary.members})`}>
            <ul className="divide-y divide-line">
              {members.map((m) => (
                <li key={m.userId} className="flex items-center justify-between gap-3 py-2">
                  <span className="min-w-0">
                    <span className="block truncate text-sm font-medium">{m.name}</span>
                    <span className="block truncate text-xs text-ink-faint">{m.email}</span>
                  </span>
                  <RoleBadge role={m.role} />
                </li>
              ))}
            </ul>
          </Panel>
          <Panel title="What your role allows">
            <ul className="flex flex-wrap gap-1.5">
              {allowed.map((a) => (
                <li key={a} className="rounded bg-moss-50 px-2 py-0.5 font-mono text-xs text-moss-700">
                  {a}
                </li>
              ))}
            </ul>
            {refused.length > 0 ? (
              <>
                <p className="mb-2 mt-4 text-xs text-ink-faint">Needs a higher role:</p>
                <ul className="flex flex-wrap gap-1.5">
                  {refused.map((a) => (
                    <li key={a} className="rounded bg-paper px-2 py-0.5 font-mono text-xs text-ink-faint" title={`needs ${LEAST_ROLE[a]}`}>
                      {a}
                    </li>
                  ))}
                </ul>
              </>
            ) : null}
          </Panel>
        </div>
      </div>
    </div>
  );
}
