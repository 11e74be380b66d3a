import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/components/atlas/page-header";
import { buttonClass } from "@/components/ui/button";
import { Panel } from "@/components/ui/panel";
import { distinctNames } from "@/components/ui/distinctNames";
import { listChainModels, searchChains } from "@/db/queries/chain-list";
import { listVisibleDrafts } from "@/db/queries/drafts";
import { getWorkspaceContext } from "@/server/context";
import { verificationName } from "@/components/atlas/chainVerification";

export const metadata: Metadata = { title: "Chains" };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

const PAGE_SIZE = 20;
const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v)?.trim() ?? "";

function href(params: { q: string; model: string; page: number }): string {
  const s = new URLSearchParams();
  if (params.q) s.set("q", params.q);
  if (params.model) s.set("model", params.model);
  if (params.page > 0) s.set("page", String(params.page + 1));
  const text = s.toString();
  return text ? `/chains?${text}` : "/chains";
}

export default async function ChainsPage({ searchParams }: Props) {
  const [{ workspace, user }, params] = await Promise.all([getWorkspaceContext(), searchParams]);
  const q = one(params.q).slice(0, 200);
  const model = one(params.model).slice(0, 100);
  const pageNumber = Number(one(params.page) || "1");
  const page = Number.isInteger(pageNumber) && pageNumber >= 1 && pageNumber <= 10_000 ? pageNumber - 1 : 0;
  const [result, models, drafts] = await Promise.all([
    searchChains({ workspaceId: workspace.id, q: q || undefined, modelId: model || undefined, page, pageSize: PAGE_SIZE }),
    listChainModels({ workspaceId: workspace.id }),
    listVisibleDrafts({ workspaceId: workspace.id, userId: user.id, limit: 20 }),
  ]);

  return (
    <div className="mx-auto max-w-6xl space-y-6 px-5 py-8">
      <PageHeader
        title="Chains"
        lead="Chains of certified coarse-grainings, each verified link by link and as one composite."
        actions={
          <>
            <Link href="/chains/workbench" className={buttonClass("primary")}>
              Open the workbench
            </Link>
          </>
        }
      />

      <form role="search" className="flex flex-wrap items-end gap-3" action="/chains">
        <div>
          <label htmlFor="chains-q" className="block text-xs font-medium text-ink-soft">
            Name contains
          </label>
          <input id="chains-q" name="q" defaultValue={q} maxLength={200} className="rounded border border-line-strong bg-paper-raised px-2 py-1 text-sm" />
        </div>
        <div>
          <label htmlFor="chains-model" className="block text-xs font-medium text-ink-soft">
            Passes through model
          </label>
          <select id="chains-model" name="model" defaultValue={model} className="rounded border border-line-strong bg-paper-raised px-2 py-1 text-sm">
            <option value="">any model</option>
            {distinctNames(models).map((m) => (
              <option key={m.id} value={m.id}>
                {m.label}
              </option>
            ))}
          </select>
        </div>
        <button type="submit" className={buttonClass("secondary", "py-1")}>
          Filter
        </button>
      </form>

      <Panel title={`Chains${page > 0 ? ` · page ${page + 1}` : ""}`}>
        {result.items.length === 0 ? (
          <p className="text-sm text-ink-faint">{q || model ? "No chain matches these filters." : "No chain yet: certify one in the workbench."}</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-sm">
              <thead>
                <tr className="text-left text-xs text-ink-faint">
                  <th className="py-1 pr-3 font-normal">Name</th>
                  <th className="py-1 pr-3 font-normal">From → to</th>
                  <th className="py-1 pr-3 font-normal">Links</th>
                  <th className="hidden py-1 pr-3 font-normal sm:table-cell">Verification</th>
                  <th className="hidden py-1 font-normal sm:table-cell">Stored</th>
                </tr>
              </thead>
              <tbody>
                {result.items.map((c) => (
                  <tr key={c.id} className="border-t border-line/60">
                    <td className="py-1.5 pr-3">
                      <Link href={`/chains/${c.id}`} className="font-medium text-tide-800 hover:underline">
                        {c.name}
                      </Link>
                    </td>
                    <td className="py-1.5 pr-3">
                      {c.source.name} → {c.target.name}
                    </td>
                    <td className="py-1.5 pr-3 font-mono">{c.links}</td>
                    <td className="hidden py-1.5 pr-3 text-xs sm:table-cell" title={c.verification}>{verificationName(c.verification)}</td>
                    <td className="hidden py-1.5 font-mono text-xs sm:table-cell">{c.createdAt.toISOString().slice(0, 10)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        <nav className="mt-3 flex gap-3 text-sm" aria-label="Pages">
          {page > 0 ? <Link href={href({ q, model, page: page - 1 })}>← Newer</Link> : null}
          {result.hasMore ? <Link href={href({ q, model, page: page + 1 })}>Older →</Link> : null}
        </nav>
      </Panel>

      <Panel title="Workbench drafts">
        {drafts.length === 0 ? (
          <p className="text-sm text-ink-faint">No drafts yet. The workbench saves one as soon as you add something.</p>
        ) : (
          <ul className="space-y-1 text-sm">
            {drafts.map((d) => (
              <li key={d.id} className="flex flex-wrap items-center gap-2">
                <Link href={`/chains/drafts/${d.id}`} className="font-medium text-tide-800 hover:underline">
                  {d.name}
                </Link>
                <span className="text-xs text-ink-faint">
                  {d.ownerId === user.id ? (d.shared ? "yours, shared read-only" : "yours, private") : `shared by ${d.ownerName}, read-only`} · changed{" "}
                  {d.updatedAt.toISOString().slice(0, 16).replace("T", " ")} UTC
                </span>
              </li>
            ))}
          </ul>
        )}
      </Panel>
    </div>
  );
}
