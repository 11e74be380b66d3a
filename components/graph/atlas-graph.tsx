"use client";

import { useMemo, useState } from "react";
import { useRouter } from "next/navigation";
import ReactFlow, {
  Background,
  Controls,
  Handle,
  MarkerType,
  MiniMap,
  Position,
  type Edge,
  type Node,
  type NodeProps,
} from "reactflow";
import "reactflow/dist/style.css";
import type { GraphLayout, PositionedNode } from "./types";

type NodeData = Pick<PositionedNode, "label" | "detail" | "loop" | "href" | "width" | "height">;

function AtlasNode({ data }: NodeProps<NodeData>) {
  return (
    <div
      className="flex flex-col justify-center rounded-md border border-line-strong bg-paper-raised px-2 text-center shadow-sm hover:border-tide-600"
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

const nodeTypes = { atlas: AtlasNode };

/**
 * Draws a laid-out atlas (see `layoutGraph`); the layout is computed on the server so the client
 * only renders. Clicking a node or an edge opens its page.
 */
export function AtlasGraph({
  layout,
  height = 560,
  readableZoom = 0.1,
  minimap = false,
}: {
  layout: GraphLayout;
  height?: number;
  /** The least zoom the first view may use; a wide atlas then opens legible at its centre. */
  readableZoom?: number;
  minimap?: boolean;
}) {
  const router = useRouter();
  // The overview starts folded: open, it covers nodes of a wide drawing (it did at 1366 px).
  const [overview, setOverview] = useState(false);
  const nodes = useMemo<Node<NodeData>[]>(
    () =>
      layout.nodes.map((n) => ({
        id: n.id,
        type: "atlas",
        position: { x: n.x, y: n.y },
        data: { label: n.label, detail: n.detail, loop: n.loop, href: n.href, width: n.width, height: n.height },
        ariaLabel: n.detail ? `${n.label} (${n.detail})` : n.label,
      })),
    [layout.nodes],
  );
  const edges = useMemo<Edge<{ href?: string }>[]>(
    () =>
      layout.edges.map((e) => ({
        id: e.id,
        source: e.source,
        target: e.target,
        label: e.label,
        data: { href: e.href },
        markerEnd: { type: MarkerType.ArrowClosed, width: 16, height: 16 },
        style: e.retracted ? { strokeDasharray: "4 3", stroke: "#bdb8a9" } : { stroke: "#46524f" },
        labelStyle: { fontSize: 10, fontFamily: "var(--font-mono, monospace)" },
        labelBgPadding: [3, 1] as [number, number],
      })),
    [layout.edges],
  );

  return (
    <div className="overflow-hidden rounded-lg border border-line-strong bg-paper">
      {minimap ? (
        // The overview toggle sits above the drawing, so that neither it nor the folded overview covers a node.
        <div className="flex justify-end border-b border-line bg-paper-raised px-2 py-1.5">
          <button
            type="button"
            aria-pressed={overview}
            onClick={() => setOverview((v) => !v)}
            className="rounded-md border border-line-strong bg-paper-raised px-2.5 py-1 text-xs font-medium text-tide-800 hover:border-tide-600"
          >
            {overview ? "Hide the overview" : "Show an overview"}
          </button>
        </div>
      ) : null}
      <div style={{ height }}>
        <ReactFlow
          nodes={nodes}
          edges={edges}
          nodeTypes={nodeTypes}
          nodesDraggable={false}
          nodesConnectable={false}
          fitView
          // Room at the edges: the zoom controls in the lower left must not cover the outer nodes.
          fitViewOptions={{ padding: 0.16, minZoom: readableZoom }}
          minZoom={0.1}
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
