/** A node of an atlas drawing: a model, or a symmetry class of models. */
export type GraphNode = {
  id: string;
  label: string;
  /** A second, smaller line (e.g. the other rules of a symmetry class). */
  detail?: string;
  /** Maps from the node onto itself (e.g. "N=2"), shown on the node instead of as a loop edge. */
  loop?: string;
  href?: string;
};

/** An edge of an atlas drawing: one or more certified maps between two nodes. */
export type GraphEdge = {
  id: string;
  source: string;
  target: string;
  label?: string;
  href?: string;
  retracted?: boolean;
};

export type PositionedNode = GraphNode & { x: number; y: number; width: number; height: number };

export type GraphLayout = {
  nodes: PositionedNode[];
  edges: GraphEdge[];
  width: number;
  height: number;
};
