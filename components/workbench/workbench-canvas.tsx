"use client";

import { memo, useMemo } from "react";
import ReactFlow, {
  Background,
  BaseEdge,
  Controls,
  EdgeLabelRenderer,
  getBezierPath,
  Handle,
  MarkerType,
  Position,
  type Connection,
  type Edge,
  type EdgeProps,
  type Node,
  type NodeProps,
} from "reactflow";
import "reactflow/dist/style.css";
import { CounterexampleView } from "@/components/counterexample/counterexample-view";
import { asCounterexample } from "@/components/counterexample/describeCounterexample";
import { modelName, nodeLabel, tryCanonical } from "./derivedModels";
import { ruleOf, type JobProgress } from "./map-editor";
import type { MapSpec, WbEdge, WbNode, Workbench } from "./workbenchState";

import { NODE_HEIGHT, NODE_WIDTH } from "./canvasSize";

export { NODE_HEIGHT, NODE_WIDTH };

type NodeData = { node: WbNode; selected: boolean; label: string };
type EdgeData = { edge: WbEdge; job: JobProgress | null; rule: { k: number; r: number; table: number[] } | null };

const ModelNode = memo(function ModelNode({ data }: NodeProps<NodeData>) {
  const { node, selected, label: title } = data;
  const summary = node.model ? modelName(node.model) : "determined by the map into it";
  return (
    <div
      className={`rounded-md border-2 bg-paper-raised px-2 py-1.5 text-xs shadow-sm ${selected ? "border-tide-600 ring-2 ring-tide-300" : node.model ? "border-line-strong" : "border-dashed border-line-strong"}`}
      style={{ width: NODE_WIDTH }}
      data-node-name={node.name}
    >
      <Handle type="target" position={Position.Top} className="!h-2.5 !w-2.5 !bg-ink-faint" />
      <div className="truncate font-semibold text-ink">{title}</div>
      <div className="truncate font-mono text-[10px] text-ink-faint">{summary}</div>
      {node.note ? <div className="mt-0.5 text-[10px] leading-tight text-saffron-700">{node.note}</div> : null}
      <Handle type="source" position={Position.Bottom} className="!h-2.5 !w-2.5 !bg-tide-600" />
    </div>
  );
});

const STYLE: Record<WbEdge["state"], { stroke: string; dash?: string; width: number; chip: string; word: string }> = {
  proposed: { stroke: "#c98a17", dash: "6 4", width: 2, chip: "bg-saffron-100 text-saffron-700 ring-saffron-500", word: "proposed" },
  checking: { stroke: "#2f8077", dash: "2 3", width: 2, chip: "bg-tide-50 text-tide-800 ring-tide-500", word: "checking…" },
  certified: { stroke: "#3f6b2a", width: 3, chip: "bg-moss-50 text-moss-700 ring-moss-600", word: "certified" },
  refused: { stroke: "#b3412f", dash: "1 4", width: 3, chip: "bg-brick-50 text-brick-700 ring-brick-600", word: "refused" },
};

export function specText(spec: MapSpec | null): string {
  if (!spec) return "kind not chosen";
  switch (spec.kind) {
    case "projection":
      return `projection N=${spec.block} (${spec.projection.map((v) => v.toString(36)).join("")})`;
    case "lumping":
      return `lumping into ${new Set(spec.partition).size} blocks`;
    case "blocking":
      return `blocking N=${spec.block}`;
    case "iterate":
      return `iterate T=${spec.steps}`;
    case "decimation":
      return `decimation k=${spec.steps}`;
  }
}

/** An edge in words: its parameters, or for a map taken from the atlas its kind and main parameter (its certificate has the rest). */
export function edgeText(edge: WbEdge): string {
  if (edge.state === "certified" && edge.atlasText) return edge.atlasText;
  return edge.spec === null && edge.state === "certified" ? "certified map from the atlas" : specText(edge.spec);
}

function MapEdge({ id, sourceX, sourceY, targetX, targetY, sourcePosition, targetPosition, data, markerEnd, selected }: EdgeProps<EdgeData>) {
  const [path, labelX, labelY] = getBezierPath({ sourceX, sourceY, targetX, targetY, sourcePosition, targetPosition });
  const edge = data!.edge;
  const style = STYLE[edge.state];
  const counterexample = edge.state === "refused" ? asCounterexample(edge.problem?.counterexample) : null;
  const steps = edge.spec && "block" in edge.spec ? edge.spec.block : undefined;
  return (
    <>
      <BaseEdge id={id} path={path} markerEnd={markerEnd} style={{ stroke: style.stroke, strokeWidth: selected ? style.width + 1 : style.width, strokeDasharray: style.dash }} />
      <EdgeLabelRenderer>
        <div
          className="nodrag nopan pointer-events-auto absolute w-max max-w-[250px] space-y-0.5 rounded border border-line bg-paper-raised/95 px-1.5 py-1 text-[10px] shadow-sm"
          style={{ transform: `translate(${NODE_WIDTH / 2 + 14}px, -50%) translate(${labelX}px, ${labelY}px)` }}
          data-edge-label={edge.state}
        >
          <div className="font-mono text-ink-soft">{edgeText(edge)}</div>
          <span className={`inline-block rounded-full px-1.5 font-semibold ring-1 ${style.chip}`}>{style.word}</span>
          {data!.job ? (
            <div className="space-y-0.5" role="status">
              <div className="h-1.5 w-full overflow-hidden rounded bg-line/60">
                <div className="h-full bg-tide-600" style={{ width: `${Math.round(data!.job.progress * 100)}%` }} />
              </div>
              <div className="text-tide-800">{data!.job.label}</div>
            </div>
          ) : null}
          {edge.state === "certified" && edge.mapId ? (
            <a href={`/atlas/maps/${edge.mapId}`} className="ml-1 text-tide-800 underline">
              certificate
            </a>
          ) : null}
          {edge.state === "refused" && counterexample ? (
            <div data-edge-problem>
              <CounterexampleView counterexample={counterexample} rule={data!.rule} steps={steps} compact />
            </div>
          ) : edge.state === "refused" ? (
            <p className="text-brick-700" data-edge-problem>
              {edge.problem?.message}
            </p>
          ) : null}
        </div>
      </EdgeLabelRenderer>
    </>
  );
}

/** The node or edge a key was pressed on: React Flow marks node wrappers with data-id and edges with data-testid. */
function keyboardTarget(target: EventTarget | null): { type: "node" | "edge"; id: string } | null {
  if (!(target instanceof Element)) return null;
  const node = target.closest(".react-flow__node");
  const nodeId = node?.getAttribute("data-id");
  if (nodeId) return { type: "node", id: nodeId };
  const edgeId = target.closest(".react-flow__edge")?.getAttribute("data-testid")?.replace(/^rf__edge-/, "");
  return edgeId ? { type: "edge", id: edgeId } : null;
}

const nodeTypes = { model: ModelNode };
const edgeTypes = { map: MapEdge };

/** The canvas: models as nodes, maps as edges in three visibly different states, each named in words. */
export function WorkbenchCanvas({
  workbench,
  selected,
  jobs,
  readOnly,
  onSelect,
  onConnect,
  onMoved,
  onOpen,
}: {
  workbench: Workbench;
  selected: { type: "node" | "edge"; id: string } | null;
  jobs: Record<string, JobProgress>;
  readOnly: boolean;
  onSelect: (s: { type: "node" | "edge"; id: string } | null) => void;
  onConnect: (source: string, target: string) => void;
  onMoved: (id: string, x: number, y: number) => void;
  /** After a node or edge was chosen by keyboard: move the focus to its inspector. */
  onOpen?: () => void;
}) {
  const nodes = useMemo<Node<NodeData>[]>(
    () =>
      workbench.nodes.map((n) => ({
        id: n.id,
        type: "model",
        position: { x: n.x, y: n.y },
        data: { node: n, selected: selected?.type === "node" && selected.id === n.id, label: nodeLabel(workbench.nodes, n.id) },
        ariaLabel: `Model ${nodeLabel(workbench.nodes, n.id)}`,
      })),
    [workbench.nodes, selected],
  );
  const edges = useMemo<Edge<EdgeData>[]>(
    () =>
      workbench.edges.map((e) => ({
        id: e.id,
        source: e.source,
        target: e.target,
        type: "map",
        selected: selected?.type === "edge" && selected.id === e.id,
        markerEnd: { type: MarkerType.ArrowClosed, color: STYLE[e.state].stroke },
        data: { edge: e, job: jobs[e.id] ?? null, rule: e.state === "refused" ? ruleOf(tryCanonical(workbench.nodes.find((n) => n.id === e.source)?.model ?? null)) : null },
        ariaLabel: `Map ${edgeText(e)}, ${STYLE[e.state].word}`,
      })),
    [workbench.edges, workbench.nodes, selected, jobs],
  );
  return (
    <ReactFlow
      nodes={nodes}
      edges={edges}
      nodeTypes={nodeTypes}
      edgeTypes={edgeTypes}
      nodesDraggable={!readOnly}
      nodesConnectable={!readOnly}
      elementsSelectable
      onlyRenderVisibleElements={workbench.nodes.length > 60}
      onNodeClick={(_, n) => onSelect({ type: "node", id: n.id })}
      onEdgeClick={(_, e) => onSelect({ type: "edge", id: e.id })}
      onPaneClick={() => onSelect(null)}
      onKeyDown={(e) => {
        // Tab reaches each node and edge (React Flow makes them focusable); Enter or Space opens its inspector.
        if (e.key !== "Enter" && e.key !== " ") return;
        const hit = keyboardTarget(e.target);
        if (!hit) return;
        e.preventDefault();
        onSelect(hit);
        onOpen?.();
      }}
      onConnect={(c: Connection) => (c.source && c.target ? onConnect(c.source, c.target) : undefined)}
      onNodeDragStop={(_, n) => onMoved(n.id, n.position.x, n.position.y)}
      fitView
      fitViewOptions={{ padding: 0.3, maxZoom: 1.1 }}
      minZoom={0.1}
    >
      <Background gap={20} color="#dcd8cc" />
      <Controls showInteractive={false} />
    </ReactFlow>
  );
}
