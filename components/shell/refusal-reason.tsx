"use client";

import { useSearchParams } from "next/navigation";
import { ACTIONS, LEAST_ROLE, refusalReason, type Action, type Role } from "@/lib/policy";
import { RoleBadge } from "@/components/ui/role-badge";

function asAction(value: string | null): Action | null {
  return value && (ACTIONS as readonly string[]).includes(value) ? (value as Action) : null;
}

/** The sentence of the 403 page: the refused action comes from the URL, the role from the server. */
export function RefusalReason({ role, workspaceName }: { role: Role | null; workspaceName: string | null }) {
  const action = asAction(useSearchParams().get("action"));
  if (!action) return <p>Your role in this workspace does not allow that request. Nothing was changed.</p>;
  return (
    <>
      <p className="text-base font-medium">{refusalReason(role, action)}</p>
      <p className="text-ink-soft">
        Workspace: <strong className="text-ink">{workspaceName ?? "none"}</strong>
        {role ? (
          <>
            {" "}· your role <RoleBadge role={role} />
          </>
        ) : null}{" "}
        · needed <RoleBadge role={LEAST_ROLE[action]} />
      </p>
      <p className="text-ink-soft">An admin of the workspace can give you a higher role. Nothing was changed.</p>
    </>
  );
}
