import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/components/atlas/page-header";
import { canvasFromMaps, type AtlasMapView } from "@/components/workbench/canvasFromMaps";
import { Workbench } from "@/components/workbench/workbench";
import { NODE_HEIGHT, NODE_WIDTH } from "@/components/workbench/canvasSize";
import { emptyWorkbench } from "@/components/workbench/workbenchState";
import { getMap, getModel } from "@/db/queries/atlas";
import type { ModelInput } from "@/lib/models";
import { can } from "@/lib/policy";
import { getWorkspaceContext } from "@/server/context";

export const metadata: Metadata = { title: "Workbench" };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

/** The certified maps named in `?maps=a,b,…` (e.g. Ask's answer), with their models; unknown ids are left out. */
async function mapsOf(workspaceId: string, param: string | string[] | undefined): Promise<AtlasMapView[]> {
  const ids = (Array.isArray(param) ? param[0] : param)?.split(",").filter(Boolean).slice(0, 32) ?? [];
  const views = await Promise.all(
    ids.map(async (mapId): Promise<AtlasMapView | null> => {
      const map = await getMap({ workspaceId, mapId });
      if (!map || map.status !== "certified") return null;
      const [source, target] = await Promise.all([getModel({ workspaceId, idOrAddress: map.source.id }), getModel({ workspaceId, idOrAddress: map.target.id })]);
      if (!source || !target) return null;
      return {
        id: map.id,
        kind: map.kind,
        block: map.block,
        steps: map.steps,
        certificateAddress: map.certificateAddress,
        source: { id: source.id, name: source.name, model: JSON.parse(source.canonical) as ModelInput },
        target: { id: target.id, name: target.name, model: JSON.parse(target.canonical) as ModelInput },
      };
    }),
  );
  return views.filter((v): v is AtlasMapView => v !== null);
}

export default async function WorkbenchPage({ searchParams }: Props) {
  const [{ role, workspace }, params] = await Promise.all([getWorkspaceContext(), searchParams]);
  const canCertify = can(role, "chain:submit");
  const maps = await mapsOf(workspace.id, params.maps);
  const canvas = maps.length > 0 ? canvasFromMaps(maps, { width: NODE_WIDTH, height: NODE_HEIGHT + 30 }) : emptyWorkbench;
  return (
    <div className="mx-auto max-w-[96rem] space-y-4 px-4 py-6">
      <PageHeader
        eyebrow={
          <Link href="/chains" className="underline-offset-2 hover:underline">
            Chains
          </Link>
        }
        title="Workbench"
        lead="Make models, draw the coarse-grainings you believe in, and certify them: the server checks every new map and then the whole chain. The canvas saves itself as a draft."
      />
      <Workbench draft={null} canvas={canvas} canEdit={canCertify} canCertify={canCertify} />
    </div>
  );
}
