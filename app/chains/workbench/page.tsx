import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/components/atlas/page-header";
import { canvasFromMaps, type AtlasMapView } from "@/components/workbench/canvasFromMaps";
import { certificatePartition } from "@/components/workbench/mapSummary";
import { LeftOutMaps } from "@/components/workbench/left-out-maps";
import { leftOutMaps, mapIdsOf, type LeftOutMap, type MapLookup } from "@/components/workbench/requestedMaps";
import { Workbench } from "@/components/workbench/workbench";
import { NODE_HEIGHT, NODE_WIDTH } from "@/components/workbench/canvasSize";
import { emptyWorkbench } from "@/components/workbench/workbenchState";
import { getMap, getModel, getWorkspaceCertificate } from "@/db/queries/atlas";
import type { ModelInput } from "@/lib/models";
import { can } from "@/lib/policy";
import { getWorkspaceContext } from "@/server/context";

export const metadata: Metadata = { title: "Workbench" };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

/** A lumping's partition from its certificate, for the edge's summary (the map row keeps only kind and sizes). */
async function partitionOf(workspaceId: string, address: string): Promise<number[] | null> {
  const row = await getWorkspaceCertificate({ workspaceId, address });
  return row ? certificatePartition(JSON.parse(row.body)) : null;
}

/** One id of `?maps=`: the map and its models when it is certified here, and what the notice needs otherwise. */
async function lookUpMap(workspaceId: string, mapId: string): Promise<{ lookup: MapLookup; view: AtlasMapView | null }> {
  const map = await getMap({ workspaceId, mapId });
  if (!map) return { lookup: { id: mapId, map: null }, view: null };
  const lookup: MapLookup = { id: mapId, map };
  if (map.status !== "certified") return { lookup, view: null };
  const [source, target] = await Promise.all([getModel({ workspaceId, idOrAddress: map.source.id }), getModel({ workspaceId, idOrAddress: map.target.id })]);
  // The models of a stored map are always there (foreign keys); a gap is answered as "not found", never a 500.
  if (!source || !target) return { lookup: { id: mapId, map: null }, view: null };
  const partition = map.kind === "lumping" || map.kind === "exact-lumping" ? await partitionOf(workspaceId, map.certificateAddress) : null;
  return {
    lookup,
    view: {
      partition,
      id: map.id,
      kind: map.kind,
      block: map.block,
      steps: map.steps,
      certificateAddress: map.certificateAddress,
      source: { id: source.id, name: source.name, model: JSON.parse(source.canonical) as ModelInput },
      target: { id: target.id, name: target.name, model: JSON.parse(target.canonical) as ModelInput },
    },
  };
}

/** The certified maps named in `?maps=a,b,…` (e.g. Ask's answer), with their models, and those left out with why. */
async function mapsOf(workspaceId: string, param: string | string[] | undefined): Promise<{ views: AtlasMapView[]; leftOut: LeftOutMap[] }> {
  const { ids, extra } = mapIdsOf(param);
  const found = await Promise.all(ids.map((mapId) => lookUpMap(workspaceId, mapId)));
  return {
    views: found.map((f) => f.view).filter((v): v is AtlasMapView => v !== null),
    leftOut: leftOutMaps(found.map((f) => f.lookup), extra),
  };
}

export default async function WorkbenchPage({ searchParams }: Props) {
  const [{ role, workspace }, params] = await Promise.all([getWorkspaceContext(), searchParams]);
  const canCertify = can(role, "chain:submit");
  const { views: maps, leftOut } = await mapsOf(workspace.id, params.maps);
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
      <LeftOutMaps maps={leftOut} />
      <Workbench draft={null} canvas={canvas} canEdit={canCertify} canCertify={canCertify} />
    </div>
  );
}
