import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/components/atlas/page-header";
import { ChainEditor } from "@/components/chain-editor/chain-editor";
import { toEditorLink } from "@/components/chain-editor/fromMapView";
import { getMap, searchAtlas, type MapView } from "@/db/queries/atlas";
import { can } from "@/lib/policy";
import { getWorkspaceContext } from "@/server/context";
import { submitChainAction } from "../actions";

export const metadata: Metadata = { title: "New chain" };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

export default async function NewChainPage({ searchParams }: Props) {
  const [{ workspace, role }, params] = await Promise.all([getWorkspaceContext(), searchParams]);
  const wanted = (Array.isArray(params.maps) ? params.maps[0] : params.maps)?.split(",").filter(Boolean).slice(0, 32) ?? [];
  const [pool, initial] = await Promise.all([
    searchAtlas({ workspaceId: workspace.id, target: "maps", limit: 300 }),
    Promise.all(wanted.map((mapId) => getMap({ workspaceId: workspace.id, mapId }))),
  ]);
  const byName = (a: MapView, b: MapView) =>
    a.source.name.localeCompare(b.source.name, "en", { numeric: true }) || a.target.name.localeCompare(b.target.name, "en", { numeric: true });
  const maps = pool.target === "maps" ? [...pool.items].sort(byName) : [];
  const start = initial.filter((m): m is MapView => m !== null).map(toEditorLink);

  return (
    <div className="mx-auto max-w-6xl space-y-5 px-5 py-8">
      <PageHeader
        eyebrow={
          <Link href="/atlas" className="underline-offset-2 hover:underline">
            Atlas
          </Link>
        }
        title="New chain"
        lead="Pick certified maps and put them in order. The server verifies every link again, checks that each link ends where the next begins, composes the chain and checks the composite directly when it fits the limits — only then is the chain stored."
      />
      <ChainEditor pool={maps.map(toEditorLink)} initial={start} action={submitChainAction} canSubmit={can(role, "chain:submit")} />
    </div>
  );
}
