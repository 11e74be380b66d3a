import Link from "next/link";
import { isMailOperator } from "@/server/mail/operators";
import { switchWorkspace } from "@/app/actions";
import { signOutAction } from "@/app/(auth)/actions";
import { getSessionUser, getWorkspaceContext, listMyWorkspaces } from "@/server/context";
import { BrandMark } from "./brand-mark";
import { NavLinks, type NavLink } from "./nav-links";
import { WorkspaceSwitcher } from "./workspace-switcher";
import { NotificationsBadge } from "./notifications-badge";
import { countUnreadNotifications } from "@/db/queries/notifications";
import { can } from "@/lib/policy";

const SIGNED_IN_LINKS: NavLink[] = [
  { href: "/dashboard", label: "Dashboard" },
  { href: "/atlas", label: "Atlas" },
  { href: "/atlas/hierarchy", label: "Hierarchy" },
  { href: "/atlas/ask", label: "Ask" },
  { href: "/chains", label: "Chains" },
  { href: "/jobs", label: "Jobs" },
  { href: "/members", label: "Members" },
  { href: "/settings/tokens", label: "API tokens" },
  { href: "/api-docs", label: "API" },
];

export async function SiteHeader() {
  const user = await getSessionUser();
  const workspaces = user ? await listMyWorkspaces() : [];
  const context = user && workspaces.length > 0 ? await getWorkspaceContext() : null;
  const unread = context ? await countUnreadNotifications({ workspaceId: context.workspace.id, userId: context.user.id }).catch(() => 0) : 0;
  const adminLinks = context && can(context.role, "audit:browse") ? [{ href: "/audit", label: "Audit log" }, { href: "/outbox", label: "Outbox" }] : [];
  const withAdmin = [...SIGNED_IN_LINKS, ...adminLinks];
  const links = user && isMailOperator(user.email) ? [...withAdmin, { href: "/dev/mail", label: "Mail" }] : withAdmin;

  return (
    <header className="bg-tide-900 text-paper-raised">
      <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-5 pt-3 pb-3">
        <Link href={user ? "/dashboard" : "/"} className="flex items-center gap-2.5 font-semibold tracking-tight">
          <BrandMark />
          <span className="text-lg">Squarely</span>
        </Link>
        {user ? (
          <div className="ml-auto flex flex-wrap items-center justify-end gap-2 sm:gap-3">
            {context ? (
              <WorkspaceSwitcher
                options={workspaces.map((w) => ({ id: w.id, name: w.name, role: w.role }))}
                currentId={context.workspace.id}
                action={switchWorkspace}
              />
            ) : null}
            <Link href="/workspaces/new" className="hidden rounded-md px-2 py-1.5 text-sm text-tide-100 hover:text-paper-raised sm:inline">
              + Workspace
            </Link>
            {context ? <NotificationsBadge unread={unread} /> : null}
            <span className="hidden text-sm text-tide-100 md:inline" title={user.email}>
              {user.name}
            </span>
            <form action={signOutAction}>
              <button type="submit" className="rounded-md px-2.5 py-1.5 text-sm text-tide-100 ring-1 ring-inset ring-tide-700 hover:bg-tide-800 hover:text-paper-raised">
                Sign out
              </button>
            </form>
          </div>
        ) : (
          <nav aria-label="Account" className="ml-auto flex items-center gap-2">
            <Link href="/sign-in" className="rounded-md px-3 py-1.5 text-sm text-tide-100 hover:text-paper-raised">
              Sign in
            </Link>
            <Link href="/sign-up" className="rounded-md bg-saffron-300 px-3 py-1.5 text-sm font-semibold text-tide-900 hover:bg-saffron-100">
              Create an account
            </Link>
          </nav>
        )}
      </div>
      {user ? (
        <nav aria-label="Main" className="border-t border-tide-800">
          <div className="mx-auto max-w-6xl px-4 py-1.5">
            <NavLinks links={links} />
          </div>
        </nav>
      ) : null}
    </header>
  );
}
