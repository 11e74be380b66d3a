import type { ModelInput } from "@/lib/models";
import { layoutWorkbench } from "./layoutWorkbench";
import { emptyWorkbench, type MapSpec, type WbEdge, type WbNode, type Workbench } from "./workbenchState";

/** A certified map of the atlas with both its models, as a page hands it to the workbench. */
export type AtlasMapView = {
  id: string;
  kind: string;
  block: number | null;
  steps: number | null;
  certificateAddress: string;
  source: { id: string; name: string; model: ModelInput };
  target: { id: string; name: string; model: ModelInput };
};

/** The parameters the canvas can show for a stored map; the others stay on its certificate. */
function specOf(m: AtlasMapView): MapSpec | null {
  if ((m.kind === "decimation" || m.kind === "iterate") && m.steps !== null) return { kind: m.kind, steps: m.steps };
  if (m.kind === "blocking" && m.block !== null) return { kind: "blocking", block: m.block };
  return null;
}

/**
 * A canvas holding certified maps of the atlas (one node per model, in the order given), laid out by
 * dagre: what a link to the workbench with `?maps=` opens, e.g. from Ask's answer.
 */
export function canvasFromMaps(maps: AtlasMapView[], size: { width: number; height: number }): Workbench {
  const nodes: WbNode[] = [];
  const edges: WbEdge[] = [];
  const add = (ref: AtlasMapView["source"]) => {
    const node: WbNode = { id: `n${nodes.length + 1}`, name: ref.name, description: "", model: ref.model, modelId: ref.id, note: "", x: 0, y: 0 };
    nodes.push(node);
    return node.id;
  };
  for (const m of maps) {
    // A map continues the path it meets: its source is the node the last map ended at, when that is its model.
    const last = edges.at(-1);
    const lastTarget = last ? nodes.find((n) => n.id === last.target) : undefined;
    const source = lastTarget?.modelId === m.source.id ? lastTarget.id : (nodes.find((n) => n.modelId === m.source.id)?.id ?? add(m.source));
    // Its target is a node of its own unless one of that model has no map into it yet (a map may go from a model to itself).
    const free = nodes.find((n) => n.modelId === m.target.id && n.id !== source && !edges.some((e) => e.target === n.id));
    const target = free?.id ?? add(m.target);
    edges.push({ id: `e${edges.length + 1}`, source, target, spec: specOf(m), state: "certified", mapId: m.id, certificateAddress: m.certificateAddress, problem: null });
  }
  const w = { ...emptyWorkbench, nodes, edges };
  const at = layoutWorkbench(w, size);
  return { ...w, nodes: nodes.map((n) => ({ ...n, ...at[n.id] })) };
}
