import { cookies } from "next/headers";
import Link from "next/link";
import { Suspense } from "react";
import { RefusalReason } from "@/components/shell/refusal-reason";
import { buttonClass } from "@/components/ui/button";
import { WORKSPACE_COOKIE, getSessionUser, listMyWorkspaces } from "@/server/context";

/**
 * Rendered with HTTP status 403 wherever `forbidden()` is called, including /forbidden?action=…
 * where `requireAction` sends refused requests. It names the action, the role it needs and the
 * role the person has, so they know whom to ask.
 */
export default async function Forbidden() {
  const user = await getSessionUser();
  const mine = user ? await listMyWorkspaces() : [];
  const chosen = (await cookies()).get(WORKSPACE_COOKIE)?.value;
  const current = mine.find((w) => w.id === chosen) ?? mine[0] ?? null;

  return (
    <div className="mx-auto max-w-xl px-5 py-16">
      <p className="font-mono text-sm font-medium text-brick-600">403 · not allowed</p>
      <h1 className="mt-2 text-3xl font-semibold tracking-tight text-tide-900">You cannot do that here</h1>
      <div className="mt-6 space-y-3 rounded-[var(--radius-card)] border border-brick-600/30 bg-brick-50 p-5 text-sm text-brick-700">
        {user ? (
          <Suspense fallback={<p>Your role in this workspace does not allow that request.</p>}>
            <RefusalReason role={current?.role ?? null} workspaceName={current?.name ?? null} />
          </Suspense>
        ) : (
          <p>You are not signed in. Sign in first; then your role in the workspace decides what you may do.</p>
        )}
      </div>
      <div className="mt-8 flex gap-3">
        <Link href={user ? "/dashboard" : "/sign-in"} className={buttonClass("primary")}>
          {user ? "Back to the dashboard" : "Sign in"}
        </Link>
      </div>
    </div>
  );
}
