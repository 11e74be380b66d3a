import type { ModelInput } from "@/lib/models";

import type { MapSpec } from "@/lib/workbench";
import { placeNew } from "./layoutWorkbench";

export type { MapSpec };

/** certified: in the atlas; proposed: drawn, not checked; checking: at the server; refused: checked and fails. */
export type EdgeState = "proposed" | "checking" | "certified" | "refused";

export type WbNode = {
  id: string;
  name: string;
  description: string;
  /** null: the model is determined by the map into this node, once certified. */
  model: ModelInput | null;
  /** The stored model, once the server knows it. */
  modelId: string | null;
  /** What a person should know about a derived model (e.g. an ECA's iterate is no longer an ECA). */
  note: string;
  x: number;
  y: number;
};

export type WbEdge = {
  id: string;
  source: string;
  target: string;
  spec: MapSpec | null;
  state: EdgeState;
  mapId: string | null;
  certificateAddress: string | null;
  /** Why the server refused it: a sentence and, for a failed square, its counterexample. */
  problem: { message: string; counterexample?: unknown } | null;
  /** A map taken from the atlas without editable parameters: its kind and main parameter in words (atlasMapText). */
  atlasText?: string;
};

export type Workbench = {
  nodes: WbNode[];
  edges: WbEdge[];
  chain: { name: string; id: string | null; address: string | null };
};

/** One end of a map from the atlas: a stored model. */
export type AtlasEnd = { modelId: string; name: string; model: ModelInput };

export type History = { past: Workbench[]; present: Workbench; future: Workbench[] };

export type WbAction =
  | { type: "add-node"; node: WbNode }
  | { type: "update-node"; id: string; patch: Partial<Omit<WbNode, "id">> }
  | { type: "remove-node"; id: string }
  | { type: "add-edge"; edge: WbEdge }
  | { type: "set-spec"; id: string; spec: MapSpec }
  | { type: "remove-edge"; id: string }
  | { type: "positions"; positions: Record<string, { x: number; y: number }> }
  | { type: "chain-name"; name: string }
  /** A certified map of the atlas dropped in: its ends resolved against the canvas as it is when applied. */
  | { type: "add-atlas-map"; map: { id: string; certificateAddress: string | null; spec: MapSpec | null; text?: string }; source: AtlasEnd; target: AtlasEnd; ids: { source: string; target: string; edge: string } }
  /** Server answers: applied to the present, not undoable (undo must not un-certify what the atlas holds). */
  | { type: "edge-result"; id: string; patch: Partial<Pick<WbEdge, "state" | "mapId" | "certificateAddress" | "problem">> }
  | { type: "node-result"; id: string; patch: Partial<Pick<WbNode, "model" | "modelId" | "name">> }
  | { type: "chain-result"; id: string; address: string }
  | { type: "undo" }
  | { type: "redo" }
  | { type: "load"; workbench: Workbench };

export const emptyWorkbench: Workbench = { nodes: [], edges: [], chain: { name: "", id: null, address: null } };
export const HISTORY_LIMIT = 100;

export function initialHistory(workbench: Workbench = emptyWorkbench): History {
  return { past: [], present: workbench, future: [] };
}

/** Edges out of or into a changed node are no longer what was checked: they go back to proposed. */
function reopen(edges: WbEdge[], nodeId: string): WbEdge[] {
  return edges.map((e) =>
    e.source === nodeId || e.target === nodeId ? { ...e, state: "proposed", mapId: null, certificateAddress: null, problem: null } : e,
  );
}

/** An edge whose parameters changed is no longer the atlas map its text described. */
function withoutAtlasText(e: WbEdge): WbEdge {
  const { atlasText: _stale, ...rest } = e;
  return rest;
}

/** Whether an edge from source to target may be drawn: no loop, no second edge between the same two nodes. */
export function edgeRefusal(w: Workbench, source: string, target: string): string | null {
  if (source === target) return "A map needs two different nodes.";
  if (!w.nodes.some((n) => n.id === source) || !w.nodes.some((n) => n.id === target)) return "Both ends must be nodes on the canvas.";
  if (w.edges.some((e) => e.source === source && e.target === target)) return "These two nodes are already joined by a map.";
  if (w.edges.some((e) => e.target === target)) return "That node already has a map into it; its model is determined by that map.";
  return null;
}

/**
 * A certified map from the atlas onto the canvas. Its source is the node of that model where a path ends
 * (no map out of it), else any node of that model, else a new one; its target is a node of that model with
 * no map into it yet, else a new one (so a map from a model to itself, or a second path, gets its own node).
 */
function addAtlasMap(w: Workbench, a: Extract<WbAction, { type: "add-atlas-map" }>): Workbench {
  const fresh = (end: AtlasEnd, id: string, at: { x: number; y: number }): WbNode => ({ id, name: end.name, description: "", model: end.model, modelId: end.modelId, note: "", ...at });
  const ofModel = w.nodes.filter((n) => n.modelId === a.source.modelId);
  const existing = ofModel.find((n) => !w.edges.some((e) => e.source === n.id)) ?? ofModel[0];
  const source = existing ?? fresh(a.source, a.ids.source, placeNew(w, null));
  const withSource = existing ? w : { ...w, nodes: [...w.nodes, source] };
  if (w.edges.some((e) => e.source === source.id && e.mapId === a.map.id)) return w;
  const free = withSource.nodes.find((n) => n.modelId === a.target.modelId && n.id !== source.id && !w.edges.some((e) => e.target === n.id));
  const target = free ?? fresh(a.target, a.ids.target, placeNew(withSource, source.id));
  const edge: WbEdge = {
    id: a.ids.edge,
    source: source.id,
    target: target.id,
    spec: a.map.spec,
    state: "certified",
    mapId: a.map.id,
    certificateAddress: a.map.certificateAddress,
    problem: null,
    ...(a.map.text ? { atlasText: a.map.text } : {}),
  };
  return {
    ...withSource,
    nodes: free ? withSource.nodes : [...withSource.nodes, target],
    edges: [...w.edges, edge],
    chain: { ...w.chain, id: null, address: null },
  };
}

/** One edit of the canvas; returns the same object when nothing changes. */
export function applyEdit(w: Workbench, action: WbAction): Workbench {
  switch (action.type) {
    case "add-node":
      return w.nodes.some((n) => n.id === action.node.id) ? w : { ...w, nodes: [...w.nodes, action.node] };
    case "update-node": {
      if (!w.nodes.some((n) => n.id === action.id)) return w;
      const modelChanged = "model" in action.patch;
      return {
        ...w,
        nodes: w.nodes.map((n) => (n.id === action.id ? { ...n, ...action.patch, ...(modelChanged ? { modelId: null } : {}) } : n)),
        edges: modelChanged ? reopen(w.edges, action.id) : w.edges,
        chain: modelChanged ? { ...w.chain, id: null, address: null } : w.chain,
      };
    }
    case "remove-node":
      if (!w.nodes.some((n) => n.id === action.id)) return w;
      return {
        ...w,
        nodes: w.nodes.filter((n) => n.id !== action.id),
        edges: w.edges.filter((e) => e.source !== action.id && e.target !== action.id),
        chain: { ...w.chain, id: null, address: null },
      };
    case "add-edge":
      if (edgeRefusal(w, action.edge.source, action.edge.target) !== null) return w;
      return { ...w, edges: [...w.edges, action.edge], chain: { ...w.chain, id: null, address: null } };
    case "set-spec":
      if (!w.edges.some((e) => e.id === action.id)) return w;
      return {
        ...w,
        edges: w.edges.map((e) =>
          e.id === action.id ? { ...withoutAtlasText(e), spec: action.spec, state: "proposed", mapId: null, certificateAddress: null, problem: null } : e,
        ),
        chain: { ...w.chain, id: null, address: null },
      };
    case "remove-edge":
      if (!w.edges.some((e) => e.id === action.id)) return w;
      return { ...w, edges: w.edges.filter((e) => e.id !== action.id), chain: { ...w.chain, id: null, address: null } };
    case "positions":
      return { ...w, nodes: w.nodes.map((n) => (action.positions[n.id] ? { ...n, ...action.positions[n.id] } : n)) };
    case "chain-name":
      return { ...w, chain: { ...w.chain, name: action.name } };
    case "add-atlas-map":
      return addAtlasMap(w, action);
    case "edge-result":
      return { ...w, edges: w.edges.map((e) => (e.id === action.id ? { ...e, ...action.patch } : e)) };
    case "node-result":
      return { ...w, nodes: w.nodes.map((n) => (n.id === action.id ? { ...n, ...action.patch } : n)) };
    case "chain-result":
      return { ...w, chain: { ...w.chain, id: action.id, address: action.address } };
    case "undo":
    case "redo":
    case "load":
      return w;
  }
}

const UNDOABLE = new Set<WbAction["type"]>(["add-atlas-map", "add-node", "update-node", "remove-node", "add-edge", "set-spec", "remove-edge", "positions", "chain-name"]);

/** The canvas with undo and redo: each undoable edit pushes the state before it; server answers do not. */
export function workbenchReducer(h: History, action: WbAction): History {
  if (action.type === "load") return initialHistory(action.workbench);
  if (action.type === "undo") {
    if (h.past.length === 0) return h;
    return { past: h.past.slice(0, -1), present: h.past[h.past.length - 1], future: [h.present, ...h.future] };
  }
  if (action.type === "redo") {
    if (h.future.length === 0) return h;
    return { past: [...h.past, h.present], present: h.future[0], future: h.future.slice(1) };
  }
  const next = applyEdit(h.present, action);
  if (next === h.present) return h;
  if (!UNDOABLE.has(action.type)) return { ...h, present: next };
  return { past: [...h.past, h.present].slice(-HISTORY_LIMIT), present: next, future: [] };
}

/**
 * The chain the canvas draws: its edges in order, when they form one path (each node with at most one
 * map in and one out, all joined); otherwise why not.
 */
export function chainPath(w: Workbench): { ok: true; edges: WbEdge[] } | { ok: false; reason: string } {
  if (w.edges.length === 0) return { ok: false, reason: "Draw at least one map." };
  const out = new Map<string, WbEdge>();
  const into = new Set<string>();
  for (const e of w.edges) {
    if (out.has(e.source)) return { ok: false, reason: "A node has two maps out of it: a chain is one path." };
    out.set(e.source, e);
    into.add(e.target);
  }
  const starts = w.edges.filter((e) => !into.has(e.source));
  if (starts.length !== 1) return { ok: false, reason: starts.length === 0 ? "The maps form a loop." : "The maps form more than one path." };
  const path: WbEdge[] = [];
  for (let e: WbEdge | undefined = starts[0]; e && path.length <= w.edges.length; e = out.get(e.target)) path.push(e);
  if (path.length !== w.edges.length) return { ok: false, reason: "The maps form more than one path." };
  return { ok: true, edges: path };
}
