"use client";

import { useMemo } from "react";
import ReactFlow, { Background, Handle, MarkerType, Position, type Edge, type Node, type NodeProps } from "reactflow";
import "reactflow/dist/style.css";
import type { CanvasEdge, CanvasNode } from "./chainCanvas";

function ModelNode({ data }: NodeProps<{ label: string; broken: boolean }>) {
  return (
    <div
      className={`w-40 rounded-md border-2 bg-paper-raised px-2 py-2 text-center font-mono text-xs font-semibold ${
        data.broken ? "border-brick-600 text-brick-700" : "border-line-strong text-ink"
      }`}
    >
      <Handle type="target" position={Position.Left} className="!bg-ink-faint" />
      {data.label}
      <Handle type="source" position={Position.Right} className="!bg-ink-faint" />
    </div>
  );
}

const nodeTypes = { model: ModelNode };

/** The chain as a row of models joined by its links; breaks drawn as red dashed gaps. */
export function ChainCanvas({ nodes, edges }: { nodes: CanvasNode[]; edges: CanvasEdge[] }) {
  const flowNodes = useMemo<Node[]>(
    () => nodes.map((n) => ({ id: n.id, type: "model", position: { x: n.x, y: n.y }, data: { label: n.label, broken: n.broken } })),
    [nodes],
  );
  const flowEdges = useMemo<Edge[]>(
    () =>
      edges.map((e) => {
        const colour = e.problem ? "#b3412f" : "#46524f";
        return {
          id: e.id,
          source: e.source,
          target: e.target,
          label: e.label,
          type: e.type === "gap" ? "straight" : "default",
          animated: false,
          markerEnd: e.type === "link" ? { type: MarkerType.ArrowClosed, color: colour } : undefined,
          style: { stroke: colour, strokeWidth: e.type === "gap" ? 2 : 1.5, strokeDasharray: e.type === "gap" ? "6 4" : undefined },
          labelStyle: { fontSize: 11, fill: colour, fontWeight: e.problem ? 600 : 400 },
        };
      }),
    [edges],
  );
  return (
    <div className="h-72 rounded-lg border border-line-strong bg-paper" aria-label="Chain diagram">
      {nodes.length === 0 ? (
        <p className="flex h-full items-center justify-center text-sm text-ink-faint">
          Add certified maps from the list to start a chain.
        </p>
      ) : (
        <ReactFlow
          key={nodes.map((n) => n.id).join(" ")}
          nodes={flowNodes}
          edges={flowEdges}
          nodeTypes={nodeTypes}
          nodesDraggable={false}
          nodesConnectable={false}
          fitView
          fitViewOptions={{ padding: 0.25, maxZoom: 1.2 }}
        >
          <Background gap={24} color="#dcd8cc" />
        </ReactFlow>
      )}
    </div>
  );
}
