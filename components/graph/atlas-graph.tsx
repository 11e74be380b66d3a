"use client";

import { useCallback, useMemo, useState, type FocusEvent } from "react";
import { useRouter } from "next/navigation";
import ReactFlow, {
  Background,
  BaseEdge,
  Controls,
  EdgeLabelRenderer,
  Handle,
  MarkerType,
  MiniMap,
  Position,
  useStore,
  type Edge,
  type EdgeProps,
  type Node,
  type NodeProps,
} from "reactflow";
import "reactflow/dist/style.css";
import { drawEdges, type EdgeEmphasis } from "./drawEdges";
import type { Box } from "./geometry";
import type { GraphLayout, PositionedNode } from "./types";

/** Label type: 11 px monospace (IBM Plex Mono advances 0.6 em, recalled from memory; 7 px leaves room), measured the same way by the placement. */
const LABEL_TYPE = { charWidth: 7, height: 16, padX: 4 };
/** Below this zoom the labels of unpicked edges are too small to read (under about 8 px) and are not drawn. */
const LABEL_ZOOM = 0.7;

type NodeEmphasis = "normal" | "picked" | "near" | "faded";
type NodeData = Pick<PositionedNode, "label" | "detail" | "loop" | "href" | "width" | "height"> & { emphasis: NodeEmphasis };
type EdgeData = { href?: string; path: string; labelBox: Box | null; emphasis: EdgeEmphasis };

const NODE_LOOK: Record<NodeEmphasis, string> = {
  normal: "border-line-strong",
  near: "border-tide-600",
  picked: "border-tide-700 ring-2 ring-tide-600",
  faded: "border-line-strong opacity-40",
};

function AtlasNode({ data }: NodeProps<NodeData>) {
  return (
    <div
      data-emphasis={data.emphasis}
      className={`flex flex-col justify-center rounded-md border bg-paper-raised px-2 text-center shadow-sm transition-opacity hover:border-tide-600 ${NODE_LOOK[data.emphasis]}`}
      style={{ width: data.width, height: data.height }}
    >
      <Handle type="target" position={Position.Top} className="!h-1.5 !w-1.5 !bg-ink-faint" />
      <span className="truncate font-mono text-xs font-semibold text-ink">{data.label}</span>
      {data.detail ? <span className="truncate text-[10px] text-ink-faint">{data.detail}</span> : null}
      {data.loop ? (
        <span className="truncate font-mono text-[10px] text-tide-700" title={`maps within itself: ${data.loop}`}>
          ↻ {data.loop}
        </span>
      ) : null}
      <Handle type="source" position={Position.Bottom} className="!h-1.5 !w-1.5 !bg-ink-faint" />
    </div>
  );
}

const EDGE_STROKE: Record<EdgeEmphasis, { stroke: string; strokeWidth: number; opacity: number }> = {
  normal: { stroke: "#46524f", strokeWidth: 1, opacity: 0.75 },
  picked: { stroke: "#16544f", strokeWidth: 2, opacity: 1 },
  faded: { stroke: "#46524f", strokeWidth: 1, opacity: 0.12 },
};

const readableZoom = (s: { transform: [number, number, number] }) => s.transform[2] >= LABEL_ZOOM;

/**
 * An edge drawn along the curve `drawEdges` computed, with its label in the box placed for it: the
 * box is drawn at exactly the placed size, so what the placement kept apart stays apart on the page.
 */
function AtlasEdge({ id, data, label, markerEnd, style }: EdgeProps<EdgeData>) {
  const zoomedIn = useStore(readableZoom);
  if (!data) return null;
  const box = data.labelBox;
  const shown = box && label && (data.emphasis === "picked" || (data.emphasis === "normal" && zoomedIn));
  return (
    <>
      <BaseEdge id={id} path={data.path} markerEnd={markerEnd} style={style} />
      {shown ? (
        <EdgeLabelRenderer>
          <div
            data-edge-label={id}
            className={`absolute flex items-center justify-center overflow-hidden whitespace-nowrap rounded-sm border font-mono text-[11px] leading-none ${data.emphasis === "picked" ? "border-tide-600 bg-tide-50 text-tide-800" : "border-line bg-paper-raised text-ink-soft"}`}
            // Above the picked edges, which are lifted (zIndex 1) over the faded nodes and would cross their own labels.
            style={{ transform: `translate(${box.x}px, ${box.y}px)`, width: box.width, height: box.height, zIndex: 2 }}
          >
            {label}
          </div>
        </EdgeLabelRenderer>
      ) : null}
    </>
  );
}

const nodeTypes = { atlas: AtlasNode };
const edgeTypes = { atlas: AtlasEdge };

/** The id of the drawing's node that an event happened in, if any. */
function nodeIdOf(target: EventTarget | null): string | null {
  return target instanceof Element ? (target.closest(".react-flow__node")?.getAttribute("data-id") ?? null) : null;
}

/**
 * Draws a laid-out atlas (see `layoutGraph`, `layoutLayers`); the layout is computed on the server so
 * the client only places the labels and renders. Pointing at a node or moving the keyboard focus onto
 * it picks it out: its maps are drawn strong with every label, the rest fades. With no node picked,
 * `selected` is picked. Clicking a node or an edge opens its page.
 */
export function AtlasGraph({
  layout,
  height = 560,
  readableZoom: firstZoom = 0.1,
  minimap = false,
  selected = null,
}: {
  layout: GraphLayout;
  height?: number;
  /** The least zoom the first view may use; a wide atlas then opens legible at its centre. */
  readableZoom?: number;
  minimap?: boolean;
  /** The node picked out while no other is pointed at or focused (e.g. the class in focus). */
  selected?: string | null;
}) {
  const router = useRouter();
  // The overview starts folded: open, it covers nodes of a wide drawing (it did at 1366 px).
  const [overview, setOverview] = useState(false);
  const [hovered, setHovered] = useState<string | null>(null);
  const [focused, setFocused] = useState<string | null>(null);
  const pointed = hovered ?? focused;
  const picked = pointed ?? selected;

  // A class pointed at is read alone; the selected class stands out among the rest, which keep their labels.
  const drawn = useMemo(() => drawEdges(layout, picked, { ...LABEL_TYPE, others: pointed ? "fade" : "keep" }), [layout, picked, pointed]);
  const pickedNode = layout.nodes.find((n) => n.id === picked);
  const near = useMemo(() => new Set(drawn.filter((e) => e.emphasis === "picked").flatMap((e) => [e.source, e.target])), [drawn]);
  const nodes = useMemo<Node<NodeData>[]>(
    () =>
      layout.nodes.map((n) => ({
        id: n.id,
        type: "atlas",
        position: { x: n.x, y: n.y },
        data: {
          label: n.label,
          detail: n.detail,
          loop: n.loop,
          href: n.href,
          width: n.width,
          height: n.height,
          emphasis: !pickedNode ? "normal" : n.id === picked ? "picked" : near.has(n.id) ? "near" : pointed ? "faded" : "normal",
        },
        ariaLabel: n.detail ? `${n.label} (${n.detail})` : n.label,
      })),
    [layout.nodes, picked, pointed, pickedNode, near],
  );
  const edges = useMemo<Edge<EdgeData>[]>(
    () =>
      drawn.map((e) => ({
        id: e.id,
        source: e.source,
        target: e.target,
        type: "atlas",
        label: e.label,
        ariaLabel: e.label ? `${e.source.replace("class-", "class ")} onto ${e.target.replace("class-", "class ")}: ${e.label}` : undefined,
        data: { href: e.href, path: e.path, labelBox: e.labelBox, emphasis: e.emphasis },
        zIndex: e.emphasis === "picked" ? 1 : 0,
        markerEnd: { type: MarkerType.ArrowClosed, width: 16, height: 16, color: EDGE_STROKE[e.emphasis].stroke },
        style: e.retracted ? { ...EDGE_STROKE[e.emphasis], strokeDasharray: "4 3", stroke: "#bdb8a9" } : EDGE_STROKE[e.emphasis],
      })),
    [drawn],
  );
  // What the toolbar says is counted on the drawing with nothing picked, so that it does not change (nor move the drawing) on pointing.
  const resting = useMemo(() => (picked === null ? drawn : drawEdges(layout, null, LABEL_TYPE)), [layout, picked, drawn]);
  const labelled = resting.filter((e) => e.label).length;
  const unplaced = resting.filter((e) => e.label && !e.labelBox).length;

  const onFocus = useCallback((event: FocusEvent) => setFocused(nodeIdOf(event.target)), []);
  const onBlur = useCallback((event: FocusEvent) => {
    if (!nodeIdOf(event.relatedTarget)) setFocused(null);
  }, []);

  return (
    <div className="overflow-hidden rounded-lg border border-line-strong bg-paper">
      {/* The toolbar sits above the drawing, so that neither it nor the folded overview covers a node. */}
      <div className="flex flex-wrap items-center justify-between gap-2 border-b border-line bg-paper-raised px-3 py-1.5">
        <p className="text-xs text-ink-soft">
          Labels give the block sizes N and the number of maps.{" "}
          {unplaced > 0 ? `${unplaced} of ${labelled} are left out where they would overlap; point` : "Point"} at or tab to a class to pick out its maps and
          read all of their labels.
        </p>
        <p className="sr-only" aria-live="polite">
          {pickedNode ? `${pickedNode.label}: ${drawn.filter((e) => e.emphasis === "picked").length} class-to-class edges picked out with their labels.` : ""}
        </p>
        {minimap ? (
          <button
            type="button"
            aria-pressed={overview}
            onClick={() => setOverview((v) => !v)}
            className="shrink-0 rounded-md border border-line-strong bg-paper-raised px-2.5 py-1 text-xs font-medium text-tide-800 hover:border-tide-600"
          >
            {overview ? "Hide the overview" : "Show an overview"}
          </button>
        ) : null}
      </div>
      <div style={{ height }} onFocus={onFocus} onBlur={onBlur}>
        <ReactFlow
          nodes={nodes}
          edges={edges}
          nodeTypes={nodeTypes}
          edgeTypes={edgeTypes}
          nodesDraggable={false}
          nodesConnectable={false}
          fitView
          // Room at the edges: the zoom controls in the lower left must not cover the outer nodes.
          fitViewOptions={{ padding: 0.16, minZoom: firstZoom }}
          minZoom={0.1}
          onNodeMouseEnter={(_, node) => setHovered(node.id)}
          onNodeMouseLeave={() => setHovered(null)}
          onNodeClick={(_, node) => node.data.href && router.push(node.data.href)}
          onEdgeClick={(_, edge) => edge.data?.href && router.push(edge.data.href)}
        >
          <Background gap={24} color="#dcd8cc" />
          <Controls showInteractive={false} />
          {minimap && overview ? (
            <MiniMap
              position="top-right"
              pannable
              zoomable
              ariaLabel="Overview of the whole drawing"
              nodeColor="#7fb9b0"
              maskColor="rgba(246,244,238,0.7)"
              style={{ width: 160, height: 110 }}
              className="!border !border-line-strong"
            />
          ) : null}
        </ReactFlow>
      </div>
    </div>
  );
}
