import type { ModelInput } from "@/lib/models";
import { storedMapDetail, storedMapSummary } from "./mapSummary";
import { layoutWorkbench } from "./layoutWorkbench";
import { applyEdit, emptyWorkbench, type MapSpec, type Workbench } from "./workbenchState";

/** A certified map of the atlas with both its models, as a page hands it to the workbench. */
export type AtlasMapView = {
  id: string;
  kind: string;
  block: number | null;
  steps: number | null;
  certificateAddress: string;
  source: { id: string; name: string; model: ModelInput };
  target: { id: string; name: string; model: ModelInput };
  /** A lumping's partition, read from its certificate (the map row keeps only kind and sizes). */
  partition?: number[] | null;
};

/** The parameters the canvas can show for a stored map; the others stay on its certificate. */
function specOf(m: AtlasMapView): MapSpec | null {
  if ((m.kind === "decimation" || m.kind === "iterate") && m.steps !== null) return { kind: m.kind, steps: m.steps };
  if (m.kind === "blocking" && m.block !== null) return { kind: "blocking", block: m.block };
  return null;
}

/**
 * A canvas holding certified maps of the atlas, added in the order given as the search panel adds them
 * (see `add-atlas-map`), laid out by dagre: what a link to the workbench with `?maps=` opens, e.g. from Ask.
 */
export function canvasFromMaps(maps: AtlasMapView[], size: { width: number; height: number }): Workbench {
  let w: Workbench = emptyWorkbench;
  for (const m of maps) {
    const n = w.nodes.length;
    w = applyEdit(w, {
      type: "add-atlas-map",
      map: { id: m.id, certificateAddress: m.certificateAddress, spec: specOf(m), text: storedMapSummary(m, storedMapDetail(m.source.model, m.partition ?? null)) },
      source: { modelId: m.source.id, name: m.source.name, model: m.source.model },
      target: { modelId: m.target.id, name: m.target.name, model: m.target.model },
      ids: { source: `n${n + 1}`, target: `n${n + (w.nodes.some((x) => x.modelId === m.source.id) ? 1 : 2)}`, edge: `e${w.edges.length + 1}` },
    });
  }
  const at = layoutWorkbench(w, size);
  return { ...w, nodes: w.nodes.map((n) => ({ ...n, ...at[n.id] })) };
}
