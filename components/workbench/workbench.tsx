"use client";

import { useCallback, useEffect, useMemo, useReducer, useRef, useState } from "react";
import { getTransformForBounds, ReactFlowProvider, useReactFlow, useStoreApi } from "reactflow";
import { buttonClass } from "@/components/ui/button";
import type { Model } from "@/lib/models";
import { browserApi, newId } from "./api";
import { CounterexampleView } from "@/components/counterexample/counterexample-view";
import { canvasBounds } from "./canvasBounds";
import { certifyWorkbench, type CertifyOutcome } from "./certifyWorkbench";
import { nodeLabel } from "./derivedModels";
import { layoutWorkbench, placeNew } from "./layoutWorkbench";
import { certificatePartition, storedMapDetail, storedMapSummary } from "./mapSummary";
import { MapEditor, STATE_CLASS, STATE_TEXT, type JobProgress } from "./map-editor";
import { MapSearch, type AtlasMap } from "./map-search";
import { AddModelPanel, inputClass, type NewModel } from "./model-forms";
import { NodeInspector } from "./node-inspector";
import { edgeText, NODE_HEIGHT, NODE_WIDTH, WorkbenchCanvas } from "./workbench-canvas";
import { chainPath, edgeRefusal, initialHistory, workbenchReducer, type MapSpec, type WbEdge, type WbNode, type Workbench as Canvas } from "./workbenchState";

/** A lumping's partition from its certificate, for the edge's summary; null for other maps or when it cannot be read. */
async function atlasPartition(m: AtlasMap): Promise<number[] | null> {
  if ((m.kind !== "lumping" && m.kind !== "exact-lumping") || !m.certificateAddress) return null;
  const res = await browserApi("GET", `/api/certificates/${encodeURIComponent(m.certificateAddress)}`);
  return res.status < 300 ? certificatePartition((res.body as { certificate?: unknown }).certificate) : null;
}

export type DraftInfo = { id: string; name: string; shared: boolean; mine: boolean; ownerName: string };

type Props = {
  draft: DraftInfo | null;
  canvas: Canvas;
  /** Contributor or above, and the draft is theirs (or new). */
  canEdit: boolean;
  canCertify: boolean;
};

const DEFAULT_NAME = "Untitled workbench";

type Selected = { type: "node" | "edge"; id: string } | null;

export function Workbench(props: Props) {
  return (
    <ReactFlowProvider>
      <WorkbenchInner {...props} />
    </ReactFlowProvider>
  );
}

function WorkbenchInner({ draft: initialDraft, canvas, canEdit, canCertify }: Props) {
  const [history, dispatch] = useReducer(workbenchReducer, canvas, initialHistory);
  const w = history.present;
  const [selected, setSelected] = useState<Selected>(null);
  const [jobs, setJobs] = useState<Record<string, JobProgress>>({});
  const [draft, setDraft] = useState<DraftInfo | null>(initialDraft);
  const [draftName, setDraftName] = useState(initialDraft?.name ?? DEFAULT_NAME);
  const [saveState, setSaveState] = useState<"saved" | "saving" | "unsaved" | "error">("saved");
  const [certifying, setCertifying] = useState(false);
  const [outcome, setOutcome] = useState<CertifyOutcome | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const flow = useReactFlow();
  const flowStore = useStoreApi();
  const inspectorRef = useRef<HTMLElement>(null);
  const readOnly = !canEdit;

  // Autosave: the canvas as it stands, a moment after the last edit (a new draft on the first one).
  const lastSaved = useRef(JSON.stringify(canvas));
  const creating = useRef<Promise<string> | null>(null);
  useEffect(() => {
    if (readOnly) return;
    const text = JSON.stringify(w);
    if (text === lastSaved.current) return;
    setSaveState("unsaved");
    const timer = setTimeout(async () => {
      setSaveState("saving");
      try {
        let id = draft?.id;
        if (!id) {
          // A draft nobody named yet is told apart in the lists by when it was begun.
          const name = draftName === DEFAULT_NAME ? `${DEFAULT_NAME} ${new Date().toISOString().slice(0, 16).replace("T", " ")}` : draftName;
          creating.current ??= browserApi("POST", "/api/drafts", { name, canvas: w }).then((res) => {
            if (res.status >= 300) throw new Error("not saved");
            return (res.body as { id: string }).id;
          });
          id = await creating.current;
          setDraft({ id, name, shared: false, mine: true, ownerName: "" });
          setDraftName(name);
          window.history.replaceState(null, "", `/chains/drafts/${id}`);
        } else {
          const res = await browserApi("PATCH", `/api/drafts/${id}`, { canvas: w });
          if (res.status >= 300) throw new Error("not saved");
        }
        lastSaved.current = text;
        setSaveState("saved");
      } catch {
        setSaveState("error");
      }
    }, 800);
    return () => clearTimeout(timer);
  }, [w, readOnly, draft?.id, draftName]);

  const patchDraft = useCallback(
    async (patch: { name?: string; shared?: boolean }) => {
      if (!draft) return;
      setDraft({ ...draft, ...patch });
      const res = await browserApi("PATCH", `/api/drafts/${draft.id}`, patch);
      if (res.status >= 300) {
        setDraft(draft);
        setNotice((res.body as { error?: { message?: string } })?.error?.message ?? "The draft was not changed.");
      }
    },
    [draft],
  );

  function addModel(m: NewModel) {
    const node: WbNode = { id: newId("n"), name: m.name, description: m.description, model: m.model, modelId: null, note: "", ...placeNew(w, null) };
    dispatch({ type: "add-node", node });
    setSelected({ type: "node", id: node.id });
  }

  function propose(from: WbNode, spec: MapSpec, to: string | { name: string; note: string; derived: WbNode["model"] }) {
    let target = typeof to === "string" ? to : null;
    if (typeof to !== "string") {
      const node: WbNode = { id: newId("n"), name: to.name, description: "", model: to.derived, modelId: null, note: to.note, ...placeNew(w, from.id) };
      dispatch({ type: "add-node", node });
      target = node.id;
    }
    const refusal = typeof to === "string" ? edgeRefusal(w, from.id, to) : null;
    if (refusal) {
      setNotice(refusal);
      return;
    }
    const id = newId("e");
    dispatch({ type: "add-edge", edge: { id, source: from.id, target: target!, spec, state: "proposed", mapId: null, certificateAddress: null, problem: null } });
    setSelected({ type: "edge", id });
  }

  function connect(source: string, target: string) {
    const refusal = edgeRefusal(w, source, target);
    if (refusal) {
      setNotice(refusal);
      return;
    }
    const id = newId("e");
    dispatch({ type: "add-edge", edge: { id, source, target, spec: null, state: "proposed", mapId: null, certificateAddress: null, problem: null } });
    setSelected({ type: "edge", id });
    setNotice("Choose the kind of map in the panel.");
  }

  async function addAtlasMap(m: AtlasMap) {
    const [s, t] = await Promise.all([browserApi("GET", `/api/models/${m.source.id}`), browserApi("GET", `/api/models/${m.target.id}`)]);
    if (s.status >= 300 || t.status >= 300) {
      setNotice("The models of that map could not be read.");
      return;
    }
    const sourceModel = (s.body as { model: Model }).model;
    dispatch({
      type: "add-atlas-map",
      map: { id: m.id, certificateAddress: m.certificateAddress ?? null, spec: null, text: storedMapSummary(m, storedMapDetail(sourceModel, await atlasPartition(m))) },
      source: { modelId: m.source.id, name: m.source.name, model: sourceModel },
      target: { modelId: m.target.id, name: m.target.name, model: (t.body as { model: Model }).model },
      ids: { source: newId("n"), target: newId("n"), edge: newId("e") },
    });
  }

  function relayout() {
    dispatch({ type: "positions", positions: layoutWorkbench(w, { width: NODE_WIDTH, height: NODE_HEIGHT + 30 }) });
    setTimeout(() => fitCanvas(200), 50);
  }

  /** Fit to view with the edge labels (React Flow's fitView counts only nodes, so a label could be cut off on a phone). */
  function fitCanvas(duration: number) {
    const nodes = flow.getNodes().map((n) => ({ id: n.id, x: n.position.x, y: n.position.y }));
    const edges = flow.getEdges().map((e) => {
      const edge = (e.data as { edge?: WbEdge } | undefined)?.edge;
      return { source: e.source, target: e.target, text: edge ? edgeText(edge) : "", refused: edge?.state === "refused" && Boolean(edge.problem?.counterexample) };
    });
    const bounds = canvasBounds(nodes, edges);
    const { width, height } = flowStore.getState();
    if (!bounds || !width || !height) return;
    const [x, y, zoom] = getTransformForBounds(bounds, width, height, 0.1, 1.1, 0.08);
    flow.setViewport({ x, y, zoom }, { duration });
  }

  async function certify() {
    setCertifying(true);
    setOutcome(null);
    try {
      const jobs = {
        pollMs: 700,
        wait: (ms: number) => new Promise<void>((r) => setTimeout(r, ms)),
        onProgress: (progress: number, item: string | null, edgeIds: string[]) => {
          const what = edgeIds.length > 1 ? "composite check" : "map check";
          for (const id of edgeIds) onJob(id, progress >= 1 ? null : { progress, label: `${what} (job): ${Math.round(progress * 100)}%${item ? ` · ${item}` : ""}` });
        },
      };
      const result = await certifyWorkbench(w, browserApi, dispatch, { jobs });
      setOutcome(result);
      // A refused map's counterexample is drawn to the right of its edge: widen the view to show it.
      if (!result.ok && w.nodes.length > 0) setTimeout(() => fitCanvas(150), 100);
    } finally {
      setCertifying(false);
    }
  }

  async function duplicate() {
    if (!draft) return;
    const res = await browserApi("POST", `/api/drafts/${draft.id}/duplicate`);
    if (res.status < 300) window.location.assign(`/chains/drafts/${(res.body as { id: string }).id}`);
    else setNotice((res.body as { error?: { message?: string } })?.error?.message ?? "Not duplicated.");
  }

  async function remove() {
    if (!draft || !window.confirm(`Delete the draft “${draft.name}”? Certified maps and chains stay in the atlas.`)) return;
    const res = await fetch(`/api/drafts/${draft.id}`, { method: "DELETE" });
    if (res.ok) window.location.assign("/chains");
    else setNotice("The draft was not deleted.");
  }

  const onJob = useCallback((edgeId: string, job: JobProgress | null) => {
    setJobs((all) => {
      const next = { ...all };
      if (job) next[edgeId] = job;
      else delete next[edgeId];
      return next;
    });
  }, []);

  // The latest fitCanvas for the effect below (it reads React Flow's own state, so it need not re-run on every render).
  const fitCanvasRef = useRef(fitCanvas);
  useEffect(() => {
    fitCanvasRef.current = fitCanvas;
  });
  // A node added or removed: bring the whole canvas into view once React Flow has measured it.
  const nodeCount = w.nodes.length;
  useEffect(() => {
    if (nodeCount === 0) return;
    const timer = setTimeout(() => fitCanvasRef.current(150), 80);
    return () => clearTimeout(timer);
  }, [nodeCount]);

  const path = useMemo(() => chainPath(w), [w]);
  const selectedNode = selected?.type === "node" ? w.nodes.find((n) => n.id === selected.id) : undefined;
  const selectedEdge = selected?.type === "edge" ? w.edges.find((e) => e.id === selected.id) : undefined;
  const pending = w.edges.filter((e) => e.state !== "certified").length;

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-2 rounded-md border border-line bg-paper-raised p-2" role="toolbar" aria-label="Workbench">
        <label className="sr-only" htmlFor="draft-name">
          Draft name
        </label>
        <input
          id="draft-name"
          value={draftName}
          disabled={readOnly}
          onChange={(e) => setDraftName(e.target.value.slice(0, 200))}
          onBlur={() => draftName.trim() && draftName !== draft?.name && patchDraft({ name: draftName.trim() })}
          className="min-w-0 flex-1 rounded border border-line-strong px-2 py-1 text-sm font-semibold sm:max-w-xs"
        />
        <span className="text-xs text-ink-faint" aria-live="polite" data-save-state={readOnly ? "read-only" : saveState}>
          {readOnly ? `Read-only${draft && !draft.mine ? ` · shared by ${draft.ownerName}` : ""}` : { saved: draft ? "Saved" : "Not saved yet", saving: "Saving…", unsaved: "Unsaved changes", error: "Not saved — retrying on the next edit" }[saveState]}
        </span>
        <div className="ml-auto flex flex-wrap gap-1">
          {readOnly ? null : (
            <>
          <button type="button" className={buttonClass("secondary", "px-2 py-1 text-xs")} disabled={readOnly || history.past.length === 0} onClick={() => dispatch({ type: "undo" })}>
            Undo
          </button>
          <button type="button" className={buttonClass("secondary", "px-2 py-1 text-xs")} disabled={readOnly || history.future.length === 0} onClick={() => dispatch({ type: "redo" })}>
            Redo
          </button>
          <button type="button" className={buttonClass("secondary", "px-2 py-1 text-xs")} disabled={readOnly || w.nodes.length === 0} onClick={relayout}>
            Re-layout
          </button>
            </>
          )}
          <button type="button" className={buttonClass("secondary", "px-2 py-1 text-xs")} onClick={() => fitCanvas(200)}>
            Fit to view
          </button>
          {draft && canEdit ? (
            <label className="flex items-center gap-1 px-1 text-xs text-ink-soft">
              <input type="checkbox" checked={draft.shared} onChange={(e) => patchDraft({ shared: e.target.checked })} />
              Shared read-only with the workspace
            </label>
          ) : null}
          {draft ? (
            <button type="button" className={buttonClass("secondary", "px-2 py-1 text-xs")} onClick={duplicate} disabled={!canCertify && !canEdit}>
              Duplicate
            </button>
          ) : null}
          {draft && canEdit ? (
            <button type="button" className={buttonClass("quiet", "px-2 py-1 text-xs text-brick-700")} onClick={remove}>
              Delete
            </button>
          ) : null}
        </div>
      </div>
      {notice ? (
        <p className="flex items-center gap-2 rounded bg-saffron-50 px-2 py-1 text-xs text-saffron-700" role="status">
          {notice}
          <button type="button" className="ml-auto underline" onClick={() => setNotice(null)}>
            dismiss
          </button>
        </p>
      ) : null}

      <div className="grid grid-cols-[minmax(0,1fr)] gap-3 lg:grid-cols-[17rem_minmax(0,1fr)_20rem]">
        {!readOnly ? (
          <aside className="order-2 space-y-4 lg:order-1" aria-label="Add to the canvas">
            <section className="space-y-2 rounded-md border border-line bg-paper-raised p-2">
              <h2 className="text-sm font-semibold text-ink-soft">Make a model</h2>
              <AddModelPanel onAdd={addModel} />
            </section>
            <section className="space-y-2 rounded-md border border-line bg-paper-raised p-2">
              <h2 className="text-sm font-semibold text-ink-soft">Certified maps from the atlas</h2>
              <MapSearch onAdd={addAtlasMap} disabled={readOnly} />
            </section>
          </aside>
        ) : null}

        <div className={`order-1 h-[460px] rounded-lg border border-line-strong bg-paper lg:order-2 lg:h-[640px] ${readOnly ? "lg:col-span-2" : ""}`} aria-label="Canvas" data-testid="workbench-canvas">
          {w.nodes.length === 0 ? (
            <p className="flex h-full items-center justify-center p-6 text-center text-sm text-ink-faint">
              {readOnly ? "This draft is empty." : "Make a model, or add a certified map from the atlas (beside the canvas; below it on a narrow screen). Then select a node to map it onto a new one."}
            </p>
          ) : (
            <WorkbenchCanvas
              workbench={w}
              selected={selected}
              jobs={jobs}
              readOnly={readOnly}
              onSelect={setSelected}
              onConnect={connect}
              onMoved={(id, x, y) => dispatch({ type: "positions", positions: { [id]: { x, y } } })}
              onOpen={() => requestAnimationFrame(() => inspectorRef.current?.focus())}
            />
          )}
        </div>

        <aside className="order-3 space-y-3" aria-label="Selection and certify">
          <section ref={inspectorRef} tabIndex={-1} aria-label="Inspector" className="space-y-2 rounded-md border border-line bg-paper-raised p-2 outline-none focus-visible:ring-2 focus-visible:ring-tide-500" data-inspector>
            {selectedNode ? (
              <NodeInspector
                key={selectedNode.id}
                workbench={w}
                node={selectedNode}
                readOnly={readOnly}
                onRename={(patch) => dispatch({ type: "update-node", id: selectedNode.id, patch })}
                onPropose={(spec, to) => propose(selectedNode, spec, to)}
                onRemove={() => {
                  dispatch({ type: "remove-node", id: selectedNode.id });
                  setSelected(null);
                }}
              />
            ) : selectedEdge ? (
              <>
                <MapEditor key={selectedEdge.id} workbench={w} edge={selectedEdge} readOnly={readOnly} dispatch={dispatch} onJob={onJob} />
                {!readOnly ? (
                  <button
                    type="button"
                    className={buttonClass("quiet", "px-2 py-1 text-xs text-brick-700")}
                    onClick={() => {
                      dispatch({ type: "remove-edge", id: selectedEdge.id });
                      setSelected(null);
                    }}
                  >
                    Remove this map
                  </button>
                ) : null}
              </>
            ) : (
              <p className="text-xs text-ink-faint">Select a node or a map on the canvas or in the list below.</p>
            )}
          </section>

          <nav className="space-y-1 rounded-md border border-line bg-paper-raised p-2" aria-label="Nodes and maps">
            <h2 className="text-sm font-semibold text-ink-soft">Nodes and maps</h2>
            <ul className="space-y-0.5 text-xs">
              {w.nodes.map((n) => (
                <li key={n.id}>
                  <button type="button" onClick={() => setSelected({ type: "node", id: n.id })} className="text-left text-tide-800 hover:underline" aria-current={selected?.id === n.id ? "true" : undefined}>
                    {nodeLabel(w.nodes, n.id)}
                  </button>
                </li>
              ))}
              {w.edges.map((e) => {
                return (
                  <li key={e.id}>
                    <button type="button" onClick={() => setSelected({ type: "edge", id: e.id })} className="text-left hover:underline" aria-current={selected?.id === e.id ? "true" : undefined}>
                      {nodeLabel(w.nodes, e.source)} → {nodeLabel(w.nodes, e.target)}: {edgeText(e)} · <span className={STATE_CLASS[e.state]}>{STATE_TEXT[e.state].split(" —")[0]}</span>
                    </button>
                  </li>
                );
              })}
            </ul>
          </nav>

          <section className="space-y-2 rounded-md border border-line bg-paper-raised p-2" aria-labelledby="certify-heading">
            <h2 id="certify-heading" className="text-sm font-semibold text-ink-soft">
              Certify
            </h2>
            <p className="text-xs text-ink-faint">
              {path.ok ? `The maps form one chain of ${path.edges.length} link${path.edges.length > 1 ? "s" : ""}.` : path.reason} {pending} map{pending === 1 ? "" : "s"} not yet certified.
            </p>
            {canCertify && !readOnly ? (
              <>
                <label htmlFor="chain-name" className="block text-xs font-medium text-ink-soft">
                  Name of the chain
                </label>
                <input id="chain-name" value={w.chain.name} onChange={(e) => dispatch({ type: "chain-name", name: e.target.value.slice(0, 200) })} className={inputClass} placeholder="e.g. rule 105 to rule 150, twice" />
                <button type="button" onClick={certify} disabled={certifying || w.edges.length === 0} className={buttonClass("primary", "w-full")}>
                  {certifying ? "Certifying…" : "Certify maps and chain"}
                </button>
              </>
            ) : (
              <p className="text-xs text-ink-faint">{canCertify ? "Duplicate this draft to change and certify it." : "Your role may not certify maps or store chains (contributor or higher)."}</p>
            )}
            {outcome ? (
              <p className={`text-xs ${outcome.ok ? "text-moss-700" : "text-brick-700"}`} role="status" data-certify-outcome={outcome.ok ? "ok" : "failed"}>
                {outcome.message}
              </p>
            ) : null}
            {outcome?.counterexample ? (
              <div data-chain-counterexample>
                <CounterexampleView counterexample={outcome.counterexample} compact />
              </div>
            ) : null}
            {w.chain.id ? (
              <p className="text-xs">
                <a href={`/chains/${w.chain.id}`} className="font-semibold text-tide-800 underline" data-chain-link>
                  The certified chain and its composite
                </a>
              </p>
            ) : null}
          </section>
        </aside>
      </div>
    </div>
  );
}
