import { curvePath, edgeCurve, type Curve } from "./edgeCurve";
import type { Box } from "./geometry";
import { placeEdgeLabels, type LabelPlacementOptions } from "./placeEdgeLabels";
import type { GraphEdge, PositionedNode } from "./types";

/** How an edge is drawn: as usual, picked out (it touches the picked node), or faded (another node is picked). */
export type EdgeEmphasis = "normal" | "picked" | "faded";

export type DrawnEdge = GraphEdge & {
  curve: Curve;
  path: string;
  /** Where its label goes; null when the label has no free place (or another node is picked). */
  labelBox: Box | null;
  emphasis: EdgeEmphasis;
};

/**
 * The edges of a laid-out drawing with their curves and label places. With no node picked, every
 * label competes for a free place (see `placeEdgeLabels`) and those that find none are left out. With
 * a node picked, its own edges are picked out: by default only their labels are placed, so all of
 * them can be read, and the other edges fade; with `others: "keep"` the other edges stay as they are
 * and their labels take what room is left after the picked node's. No two label boxes returned
 * intersect, nor does any meet a node.
 */
export function drawEdges(
  layout: { nodes: PositionedNode[]; edges: GraphEdge[] },
  picked: string | null = null,
  options: LabelPlacementOptions & { others?: "fade" | "keep" } = {},
): DrawnEdge[] {
  const { others = "fade", ...placement } = options;
  const byId = new Map(layout.nodes.map((n) => [n.id, n]));
  const known = picked !== null && byId.has(picked) ? picked : null;
  const curves = layout.edges.flatMap((e) => {
    const [source, target] = [byId.get(e.source), byId.get(e.target)];
    return source && target ? [{ edge: e, curve: edgeCurve(source, target) }] : [];
  });
  const touches = (e: GraphEdge) => known !== null && (e.source === known || e.target === known);
  const fades = (e: GraphEdge) => known !== null && others === "fade" && !touches(e);
  const requests = curves
    .filter(({ edge }) => edge.label && !fades(edge))
    .map(({ edge, curve }) => ({ id: edge.id, text: edge.label!, curve, priority: touches(edge) ? 1 : 0 }));
  const boxes = placeEdgeLabels(requests, layout.nodes, placement);
  return curves.map(({ edge, curve }) => ({
    ...edge,
    curve,
    path: curvePath(curve),
    labelBox: boxes.get(edge.id) ?? null,
    emphasis: touches(edge) ? "picked" : fades(edge) ? "faded" : "normal",
  }));
}
