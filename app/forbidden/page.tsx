import type { Metadata } from "next";
import Link from "next/link";
import { buttonClass } from "@/components/ui/button";
import { RoleBadge } from "@/components/ui/role-badge";
import { LEAST_ROLE, refusalReason, type Action, ACTIONS } from "@/lib/policy";
import { getSessionUser, listMyWorkspaces } from "@/server/context";
import { cookies } from "next/headers";
import { WORKSPACE_COOKIE } from "@/server/context";

export const metadata: Metadata = { title: "Not allowed" };

function asAction(value: unknown): Action | null {
  return typeof value === "string" && (ACTIONS as readonly string[]).includes(value) ? (value as Action) : null;
}

/**
 * Where a refused request lands (403 status, set by the proxy). It names the action, the role it
 * needs and the role the person has, so they know whom to ask.
 */
export default async function ForbiddenPage({ searchParams }: { searchParams: Promise<{ action?: string | string[] }> }) {
  const action = asAction((await searchParams).action);
  const user = await getSessionUser();
  const mine = user ? await listMyWorkspaces() : [];
  const chosen = (await cookies()).get(WORKSPACE_COOKIE)?.value;
  const current = mine.find((w) => w.id === chosen) ?? mine[0] ?? null;

  return (
    <div className="mx-auto max-w-xl px-5 py-16">
      <p className="font-mono text-sm font-medium text-brick-600">403 · not allowed</p>
      <h1 className="mt-2 text-3xl font-semibold tracking-tight text-tide-900">You cannot do that here</h1>
      <div className="mt-6 space-y-3 rounded-[var(--radius-card)] border border-brick-600/30 bg-brick-50 p-5 text-sm text-brick-700">
        {!user ? (
          <p>You are not signed in. Sign in first; then your role in the workspace decides what you may do.</p>
        ) : action ? (
          <>
            <p className="text-base font-medium">{refusalReason(current?.role, action)}</p>
            <p className="text-ink-soft">
              Workspace: <strong className="text-ink">{current?.name ?? "none"}</strong>
              {current ? (
                <>
                  {" "}· your role <RoleBadge role={current.role} />
                </>
              ) : null}{" "}
              · needed <RoleBadge role={LEAST_ROLE[action]} />
            </p>
            <p className="text-ink-soft">An admin of the workspace can give you a higher role. Nothing was changed.</p>
          </>
        ) : (
          <p>Your role in this workspace does not allow that request. Nothing was changed.</p>
        )}
      </div>
      <div className="mt-8 flex gap-3">
        {user ? (
          <Link href="/dashboard" className={buttonClass("primary")}>
            Back to the dashboard
          </Link>
        ) : (
          <Link href="/sign-in" className={buttonClass("primary")}>
            Sign in
          </Link>
        )}
      </div>
    </div>
  );
}
