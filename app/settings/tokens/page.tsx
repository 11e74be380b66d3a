import type { Metadata } from "next";
import { PageHeader } from "@/components/atlas/page-header";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/form-message";
import type { FormState } from "@/components/ui/form-state";
import { Panel } from "@/components/ui/panel";
import { ROLES, isRoleWithin } from "@/lib/policy";
import { requireAction } from "@/server/context";
import { listPersonalTokens } from "@/server/tokens";
import { revokeTokenAction } from "./actions";
import { TokenForm } from "./token-form";

export const metadata: Metadata = { title: "API tokens · Squarely" };

function when(d: Date | null): string {
  return d ? d.toISOString().slice(0, 16).replace("T", " ") + " UTC" : "never";
}

/** What the last revocation did (`?revoke=` set by the action). */
const REVOKE_STATE: Record<string, FormState> = {
  revoked: { status: "ok", message: "The token is revoked; scripts using it are refused from now on." },
  unknown: { status: "error", message: "You have no token with that id; nothing was revoked." },
};

/** Personal API tokens of the signed-in person in the current workspace: create, list, revoke. */
export default async function TokensPage({ searchParams }: { searchParams: Promise<{ revoke?: string | string[] }> }) {
  const { user, workspace, role } = await requireAction("token:manage");
  const { revoke } = await searchParams;
  const revoked = typeof revoke === "string" ? REVOKE_STATE[revoke] : undefined;
  const tokens = await listPersonalTokens({ userId: user.id, workspaceId: workspace.id });
  const roles = ROLES.filter((r) => isRoleWithin(r, role));
  return (
    <div className="mx-auto max-w-6xl space-y-8 px-5 py-8">
      <PageHeader
        eyebrow={`Settings · ${workspace.name}`}
        title="API tokens"
        lead="A token lets a script or notebook use the atlas API as you, in this workspace, with a role no higher than yours. Only a hash is stored: the token is shown once when it is created."
      />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,22rem)_1fr]">
        <Panel title="New token">
          <TokenForm roles={roles} defaultRole="viewer" />
        </Panel>
        <Panel title="Your tokens">
          {revoked ? <FormMessage state={revoked} id="revoke-message" /> : null}
          {tokens.length === 0 ? (
            <p className="text-sm text-ink-soft">No tokens yet.</p>
          ) : (
            <table className="w-full text-left text-sm">
              <caption className="sr-only">Your API tokens in {workspace.name}</caption>
              <thead>
                <tr className="text-ink-soft">
                  <th scope="col" className="py-1 pr-3 font-medium">Name</th>
                  <th scope="col" className="py-1 pr-3 font-medium">Token</th>
                  <th scope="col" className="py-1 pr-3 font-medium">Role</th>
                  <th scope="col" className="py-1 pr-3 font-medium">Last used</th>
                  <th scope="col" className="py-1 font-medium"><span className="sr-only">Action</span></th>
                </tr>
              </thead>
              <tbody>
                {tokens.map((t) => (
                  <tr key={t.id} className="border-t border-line align-middle">
                    <td className="py-2 pr-3">{t.name}</td>
                    <td className="py-2 pr-3 font-mono text-xs">{t.prefix}…</td>
                    <td className="py-2 pr-3">{t.role}</td>
                    <td className="py-2 pr-3">{when(t.lastUsedAt)}</td>
                    <td className="py-2 text-right">
                      {t.revokedAt ? (
                        <span className="text-ink-soft">revoked {when(t.revokedAt)}</span>
                      ) : (
                        <form action={revokeTokenAction.bind(null, t.id)}>
                          <Button type="submit" variant="secondary" aria-label={`Revoke token ${t.name}`}>
                            Revoke
                          </Button>
                        </form>
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </Panel>
      </div>
    </div>
  );
}
