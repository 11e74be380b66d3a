"use client";

import { useId, useState } from "react";
import { buttonClass } from "@/components/ui/button";
import { CounterexampleView } from "@/components/counterexample/counterexample-view";
import { ecaTable } from "@/lib/ca";
import type { Model } from "@/lib/models";
import { AtlasPartition } from "./atlas-partition";
import { browserApi, runJob, type JobSnapshot } from "./api";
import { nodeLabel, tryCanonical } from "./derivedModels";
import { Field, inputClass } from "./model-forms";
import { nodeShape, type NodeShape } from "./nodeShape";
import { moveState, partitionColumns } from "./partitionColumns";
import { blockCells, presetProjection, PRESETS, projectionIssue, type PresetName } from "./projectionPresets";
import type { MapSpec, WbAction, WbEdge, Workbench } from "./workbenchState";

/** Largest number of block states drawn as strips; larger projections are typed as a digit string. */
export const STRIPS_MAX = 64;

const KIND_TEXT: Record<MapSpec["kind"], string> = {
  projection: "Projection (blocking then coarse symbols)",
  blocking: "Blocking into block-N supercells",
  iterate: "Iterate (T steps at once)",
  lumping: "Lumping (partition of the states)",
  decimation: "Decimation (k steps at once)",
};

export const STATE_TEXT: Record<WbEdge["state"], string> = {
  proposed: "proposed — drawn, not yet checked",
  checking: "checking at the server…",
  certified: "certified — in the atlas",
  refused: "refused — checked, and the square does not commute",
};

export function defaultSpec(kind: MapSpec["kind"], shape: NodeShape | null): MapSpec {
  switch (kind) {
    case "projection":
      return { kind, block: 2, projection: shape?.kind === "ca" && shape.k !== 2 ? Array.from({ length: shape.k ** 2 }, (_, s) => (s === 0 ? 0 : 1)) : presetProjection("keep", 2, 0) };
    case "lumping":
      return { kind, partition: Array.from({ length: shape?.kind === "markov" ? shape.states : 1 }, (_, i) => i) };
    case "blocking":
      return { kind, block: 2 };
    default:
      return { kind, steps: 2 };
  }
}

export type JobProgress = { progress: number; label: string };

/** Edit one map: choose its kind, set its parameters without JSON, see its state and counterexample. */
export function MapEditor({
  workbench,
  edge,
  readOnly,
  dispatch,
  onJob,
}: {
  workbench: Workbench;
  edge: WbEdge;
  readOnly: boolean;
  dispatch: (a: WbAction) => void;
  onJob: (edgeId: string, job: JobProgress | null) => void;
}) {
  const id = useId();
  const source = workbench.nodes.find((n) => n.id === edge.source);
  const shape = nodeShape(workbench, edge.source);
  // A map taken from the atlas as it stands (no parameters here) is not re-kinded: its certificate fixes it.
  const fromAtlas = edge.state === "certified" && edge.spec === null;
  const kinds: MapSpec["kind"][] = fromAtlas ? [] : shape?.kind === "markov" ? ["lumping", "decimation"] : shape?.kind === "ca" ? ["projection", "blocking", "iterate"] : [];
  const set = (spec: MapSpec) => dispatch({ type: "set-spec", id: edge.id, spec });
  const sourceModel = tryCanonical(source?.model ?? null);

  return (
    <section aria-labelledby={`${id}-h`} className="space-y-3">
      <h3 id={`${id}-h`} className="text-sm font-semibold text-ink">
        Map {nodeLabel(workbench.nodes, edge.source)} → {nodeLabel(workbench.nodes, edge.target)}
      </h3>
      <p className="text-xs" data-edge-state={edge.state}>
        State: <strong className={STATE_CLASS[edge.state]}>{STATE_TEXT[edge.state]}</strong>
      </p>
      {edge.state === "certified" && edge.mapId ? (
        <p className="text-xs">
          <a className="font-medium text-tide-800 underline" href={`/atlas/maps/${edge.mapId}`}>
            Certificate of this map
          </a>
          {edge.certificateAddress ? <span className="block break-all font-mono text-[10px] text-ink-faint">{edge.certificateAddress}</span> : null}
        </p>
      ) : null}
      {/* An atlas edge keeps its kind only in its text (drafts store no more); its certificate has the partition. */}
      {fromAtlas && edge.atlasText?.includes("lumping") ? (
        <AtlasPartition address={edge.certificateAddress} mapId={edge.mapId} source={source?.model ?? null} />
      ) : null}
      {edge.problem ? (
        <div className="space-y-2" role="status">
          <p className="text-xs text-brick-700">{edge.problem.message}</p>
          {edge.problem.counterexample ? (
            <CounterexampleView
              counterexample={edge.problem.counterexample}
              rule={ruleOf(sourceModel)}
              steps={edge.spec && "block" in edge.spec ? edge.spec.block : undefined}
              labels={shape?.kind === "markov" ? shape.labels : undefined}
            />
          ) : null}
        </div>
      ) : null}

      {kinds.length === 0 && !fromAtlas ? <p className="text-xs text-ink-faint">Certify the map into the source node first: its model is not known yet.</p> : null}
      {kinds.length > 0 ? (
        <Field id={`${id}-kind`} label="Kind of map">
          <select
            id={`${id}-kind`}
            disabled={readOnly}
            value={edge.spec?.kind ?? ""}
            onChange={(e) => set(defaultSpec(e.target.value as MapSpec["kind"], shape))}
            className={inputClass}
          >
            <option value="" disabled>
              Choose…
            </option>
            {kinds.map((k) => (
              <option key={k} value={k}>
                {KIND_TEXT[k]}
              </option>
            ))}
          </select>
        </Field>
      ) : null}

      {edge.spec?.kind === "projection" && shape?.kind === "ca" ? (
        <ProjectionEditor spec={edge.spec} k={shape.k} readOnly={readOnly} onChange={set} sourceModel={sourceModel} edgeId={edge.id} onJob={onJob} />
      ) : null}
      {edge.spec?.kind === "lumping" && shape?.kind === "markov" ? (
        <PartitionEditor spec={edge.spec} labels={shape.labels} readOnly={readOnly} onChange={set} sourceModel={sourceModel} edgeId={edge.id} onJob={onJob} />
      ) : null}
      {edge.spec && (edge.spec.kind === "blocking" || edge.spec.kind === "iterate" || edge.spec.kind === "decimation") ? (
        <StepsField spec={edge.spec} readOnly={readOnly} onChange={set} />
      ) : null}
    </section>
  );
}

export const STATE_CLASS: Record<WbEdge["state"], string> = {
  proposed: "text-saffron-700",
  checking: "text-tide-700",
  certified: "text-moss-700",
  refused: "text-brick-700",
};

export function ruleOf(model: Model | null): { k: number; r: number; table: number[] } | null {
  if (model?.kind === "eca") {
    const t = ecaTable(model.rule);
    return { k: t.k, r: t.r, table: Array.from(t.table) };
  }
  if (model?.kind === "ca") return { k: model.k, r: model.r, table: model.table };
  return null;
}

function StepsField({ spec, readOnly, onChange }: { spec: Extract<MapSpec, { kind: "blocking" | "iterate" | "decimation" }>; readOnly: boolean; onChange: (s: MapSpec) => void }) {
  const id = useId();
  const value = spec.kind === "blocking" ? spec.block : spec.steps;
  const [text, setText] = useState(String(value));
  const max = spec.kind === "decimation" ? 1000 : 6;
  const n = Number(text);
  const error = /^\d+$/.test(text.trim()) && n >= 1 && n <= max ? undefined : `A whole number from 1 to ${max}.`;
  const label = spec.kind === "blocking" ? "Block size N" : spec.kind === "iterate" ? "Steps T" : "Steps k";
  return (
    <Field id={id} label={`${label} (1–${max})`} error={error}>
      <input
        id={id}
        inputMode="numeric"
        disabled={readOnly}
        value={text}
        onChange={(e) => {
          setText(e.target.value);
          const v = Number(e.target.value);
          if (/^\d+$/.test(e.target.value.trim()) && v >= 1 && v <= max) onChange(spec.kind === "blocking" ? { kind: "blocking", block: v } : { kind: spec.kind, steps: v });
        }}
        className={inputClass}
        aria-describedby={error ? `${id}-error` : undefined}
      />
    </Field>
  );
}

type Suggestion = { target: string; projection: number[] };

/** Every block state as a strip of cells with its coarse symbol, presets, and Suggest from the discovery search. */
function ProjectionEditor({
  spec,
  k,
  readOnly,
  onChange,
  sourceModel,
  edgeId,
  onJob,
}: {
  spec: Extract<MapSpec, { kind: "projection" }>;
  k: number;
  readOnly: boolean;
  onChange: (s: MapSpec) => void;
  sourceModel: Model | null;
  edgeId: string;
  onJob: (edgeId: string, job: JobProgress | null) => void;
}) {
  const id = useId();
  const [blockText, setBlockText] = useState(String(spec.block));
  const [keepCell, setKeepCell] = useState(0);
  const [suggestions, setSuggestions] = useState<Suggestion[] | null>(null);
  const [suggestError, setSuggestError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const N = spec.block;
  const states = k ** N;
  const used = Math.max(2, ...spec.projection.map((v) => v + 1));
  const [symbolsText, setSymbolsText] = useState(String(used));
  const symbols = Number(symbolsText);
  const m = Number.isInteger(symbols) && symbols >= used && symbols <= Math.min(36, k ** N) ? symbols : used;
  const issue = projectionIssue(spec.projection, states);
  const maxBlock = Math.max(1, Math.floor(Math.log(4096) / Math.log(k)));
  const blockError = /^\d+$/.test(blockText) && Number(blockText) >= 1 && Number(blockText) <= maxBlock ? undefined : `A whole number from 1 to ${maxBlock} (at most 4096 block states).`;

  function setBlock(text: string) {
    setBlockText(text);
    const n = Number(text);
    if (!/^\d+$/.test(text) || n < 1 || n > maxBlock) return;
    onChange({ kind: "projection", block: n, projection: k === 2 ? presetProjection("keep", n, 0) : Array.from({ length: k ** n }, (_, s) => (s === 0 ? 0 : 1)) });
  }
  const setSymbol = (s: number, v: number) => onChange({ ...spec, projection: spec.projection.map((x, i) => (i === s ? v : x)) });
  const preset = (name: PresetName) => onChange({ ...spec, projection: presetProjection(name, N, keepCell) });

  async function suggest() {
    if (sourceModel?.kind !== "eca") return;
    setBusy(true);
    setSuggestError(null);
    setSuggestions(null);
    try {
      await runJob("search-projection", { rule: sourceModel.rule, minBlock: Math.max(2, N), maxBlock: Math.max(2, N), search: "projections" }, (job: JobSnapshot) =>
        onJob(edgeId, { progress: job.progress, label: `searching rule ${sourceModel.rule} at block ${N}: ${Math.round(job.progress * 100)}%` }),
      );
      const stored = await browserApi("POST", "/api/models", { model: sourceModel });
      const modelId = (stored.body as { model: { id: string } }).model.id;
      const maps = await browserApi("GET", `/api/models/${modelId}/maps?kind=projection&block=${N}&limit=20`);
      const items = (maps.body as { items: { target: { name: string }; certificateAddress: string }[] }).items;
      const found: Suggestion[] = [];
      for (const item of items.slice(0, 12)) {
        const cert = await browserApi("GET", `/api/certificates/${encodeURIComponent(item.certificateAddress)}`);
        const projection = (cert.body as { certificate?: { map?: { projection?: number[] } } }).certificate?.map?.projection;
        if (Array.isArray(projection)) found.push({ target: item.target.name, projection });
      }
      setSuggestions(found);
    } catch (e) {
      setSuggestError(e instanceof Error ? e.message : String(e));
    } finally {
      onJob(edgeId, null);
      setBusy(false);
    }
  }

  return (
    <div className="space-y-2">
      <Field id={`${id}-block`} label="Block size N" error={blockError}>
        <input id={`${id}-block`} inputMode="numeric" disabled={readOnly} value={blockText} onChange={(e) => setBlock(e.target.value)} className={inputClass} />
      </Field>
      <Field id={`${id}-symbols`} label={`Coarse symbols m (2–${Math.min(36, states)})`} hint="With more than two, each block state gets a symbol picker.">
        <input id={`${id}-symbols`} inputMode="numeric" disabled={readOnly} value={symbolsText} onChange={(e) => setSymbolsText(e.target.value)} className={inputClass} />
      </Field>
      {k === 2 && m === 2 ? (
        <fieldset className="space-y-1" disabled={readOnly}>
          <legend className="text-xs font-medium text-ink-soft">Presets</legend>
          <div className="flex flex-wrap gap-1">
            {PRESETS.map((p) => (
              <button key={p.name} type="button" title={p.description} onClick={() => preset(p.name)} className={buttonClass("secondary", "px-2 py-0.5 text-xs")}>
                {p.label}
                {p.name === "keep" ? ` ${keepCell + 1}` : ""}
              </button>
            ))}
          </div>
          <label className="flex items-center gap-2 text-xs text-ink-soft">
            Cell kept by “Keep one cell”
            <select value={keepCell} onChange={(e) => setKeepCell(Number(e.target.value))} className="rounded border border-line-strong px-1 text-xs">
              {Array.from({ length: N }, (_, i) => (
                <option key={i} value={i}>
                  {i + 1}
                </option>
              ))}
            </select>
          </label>
        </fieldset>
      ) : null}
      {states <= STRIPS_MAX ? (
        <ul className="grid max-h-64 grid-cols-2 gap-1 overflow-auto pr-1" aria-label="Coarse symbol of each block state">
          {Array.from({ length: states }, (_, s) => {
            const cells = blockCells(s, k, N);
            const v = spec.projection[s] ?? 0;
            return (
              <li key={s} className="flex items-center gap-1">
                <svg width={N * 12} height={12} aria-hidden>
                  {cells.map((c, i) => (
                    <rect key={i} x={i * 12 + 0.5} y={0.5} width={11} height={11} className={`${c === 0 ? "fill-paper-raised" : c === 1 ? "fill-ink" : "fill-tide-500"} stroke-line-strong`} />
                  ))}
                </svg>
                {m <= 2 && k === 2 ? (
                  <button
                    type="button"
                    disabled={readOnly}
                    onClick={() => setSymbol(s, v === 0 ? 1 : 0)}
                    aria-label={`Block ${cells.join("")}: coarse symbol ${v}`}
                    className={`w-6 rounded font-mono text-xs font-semibold ring-1 ring-inset ${v ? "bg-tide-700 text-paper-raised ring-tide-700" : "bg-paper-raised text-ink ring-line-strong"}`}
                  >
                    {v}
                  </button>
                ) : (
                  <select
                    disabled={readOnly}
                    value={v}
                    onChange={(e) => setSymbol(s, Number(e.target.value))}
                    aria-label={`Block ${cells.join("")}: coarse symbol`}
                    className="rounded border border-line-strong px-1 font-mono text-xs"
                  >
                    {Array.from({ length: m }, (_, x) => (
                      <option key={x} value={x}>
                        {x}
                      </option>
                    ))}
                  </select>
                )}
              </li>
            );
          })}
        </ul>
      ) : (
        <Field id={`${id}-digits`} label={`Coarse symbol of each of the ${states} block states, as digits`}>
          <textarea
            id={`${id}-digits`}
            rows={3}
            disabled={readOnly}
            value={spec.projection.map((v) => v.toString(36)).join("")}
            onChange={(e) => onChange({ ...spec, projection: [...e.target.value.replace(/\s/g, "")].map((c) => parseInt(c, 36) || 0) })}
            className={`${inputClass} font-mono text-xs`}
          />
        </Field>
      )}
      <p className="text-xs text-brick-700" aria-live="polite">
        {issue ?? ""}
      </p>
      {sourceModel?.kind === "eca" && !readOnly ? (
        <div className="space-y-1">
          <button type="button" onClick={suggest} disabled={busy} className={buttonClass("secondary", "px-2 py-1 text-xs")}>
            {busy ? "Searching…" : `Suggest projections of rule ${sourceModel.rule} at block ${Math.max(2, N)}`}
          </button>
          {suggestError ? <p className="text-xs text-brick-700">{suggestError}</p> : null}
          {suggestions ? (
            suggestions.length === 0 ? (
              <p className="text-xs text-ink-faint">The search found no binary projection at this block size.</p>
            ) : (
              <ul className="space-y-1" aria-label="Suggested projections">
                {suggestions.map((s, i) => (
                  <li key={i}>
                    <button type="button" onClick={() => onChange({ kind: "projection", block: Math.log2(s.projection.length), projection: s.projection })} className="text-xs text-tide-800 underline">
                      onto {s.target}: {s.projection.join("")}
                    </button>
                  </li>
                ))}
              </ul>
            )
          ) : null}
        </div>
      ) : null}
    </div>
  );
}

/** A block number per state; Suggest coarsest lumping keeps the ticked states apart (the lump-chain job). */
function PartitionEditor({
  spec,
  labels,
  readOnly,
  onChange,
  sourceModel,
  edgeId,
  onJob,
}: {
  spec: Extract<MapSpec, { kind: "lumping" }>;
  labels: string[];
  readOnly: boolean;
  onChange: (s: MapSpec) => void;
  sourceModel: Model | null;
  edgeId: string;
  onJob: (edgeId: string, job: JobProgress | null) => void;
}) {
  const [apart, setApart] = useState<boolean[]>(() => labels.map((_, i) => i === 0));
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const blocks = new Set(spec.partition).size;

  async function suggest() {
    if (sourceModel?.kind !== "markov") return;
    setBusy(true);
    setError(null);
    try {
      const observable = labels.map((_, i) => (apart[i] ? `apart-${i}` : "rest"));
      const job = await runJob("lump-chain", { chain: sourceModel, observable }, (j) =>
        onJob(edgeId, { progress: j.progress, label: `coarsest lumping: ${Math.round(j.progress * 100)}%` }),
      );
      const partition = (job.result as { partition?: number[] })?.partition;
      if (!Array.isArray(partition)) throw new Error("The job gave no partition.");
      onChange({ kind: "lumping", partition });
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    } finally {
      onJob(edgeId, null);
      setBusy(false);
    }
  }

  return (
    <div className="space-y-2">
      <table className="w-full text-xs">
        <thead>
          <tr className="text-left text-ink-faint">
            <th className="font-normal">state</th>
            <th className="font-normal">block</th>
            <th className="font-normal">keep apart</th>
          </tr>
        </thead>
        <tbody>
          {labels.map((label, i) => (
            <tr key={i}>
              <td className="font-mono">{label}</td>
              <td>
                <input
                  type="number"
                  min={1}
                  max={labels.length}
                  disabled={readOnly}
                  aria-label={`Block of state ${label}`}
                  value={(spec.partition[i] ?? 0) + 1}
                  onChange={(e) => {
                    const v = Math.max(1, Math.min(labels.length, Number(e.target.value) || 1)) - 1;
                    onChange({ kind: "lumping", partition: spec.partition.map((b, j) => (j === i ? v : b)) });
                  }}
                  className="w-14 rounded border border-line-strong px-1"
                />
              </td>
              <td>
                <input type="checkbox" disabled={readOnly} aria-label={`Keep state ${label} apart`} checked={apart[i] ?? false} onChange={(e) => setApart(apart.map((a, j) => (j === i ? e.target.checked : a)))} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="text-xs text-ink-faint">
        {blocks} block{blocks === 1 ? "" : "s"}.{readOnly ? "" : " Drag a state onto a block, or type its block number above."}
      </p>
      <BlockColumns partition={spec.partition} labels={labels} readOnly={readOnly} onMove={(state, block) => onChange({ kind: "lumping", partition: moveState(spec.partition, state, block) })} />
      {!readOnly ? (
        <button type="button" onClick={suggest} disabled={busy || sourceModel?.kind !== "markov"} className={buttonClass("secondary", "px-2 py-1 text-xs")}>
          {busy ? "Searching…" : "Suggest coarsest lumping"}
        </button>
      ) : null}
      {error ? <p className="text-xs text-brick-700">{error}</p> : null}
    </div>
  );
}

/** The blocks as columns of state chips: a chip dragged onto a column moves that state into the block. */
function BlockColumns({ partition, labels, readOnly, onMove }: { partition: number[]; labels: string[]; readOnly: boolean; onMove: (state: number, block: number) => void }) {
  const [over, setOver] = useState<number | null>(null);
  return (
    <div className="flex flex-wrap gap-1.5" role="group" aria-label="Blocks of the lumping">
      {partitionColumns(partition).map(({ block, states }) => (
        <div
          key={block}
          data-block-column={block + 1}
          aria-label={states.length ? `Block ${block + 1}` : `New block ${block + 1}`}
          role="list"
          onDragOver={(e) => {
            if (readOnly) return;
            e.preventDefault();
            e.dataTransfer.dropEffect = "move";
            setOver(block);
          }}
          onDragLeave={() => setOver((b) => (b === block ? null : b))}
          onDrop={(e) => {
            e.preventDefault();
            setOver(null);
            const state = Number(e.dataTransfer.getData("text/plain"));
            if (!readOnly && Number.isInteger(state)) onMove(state, block);
          }}
          className={`min-h-16 w-[5.5rem] flex-none space-y-1 rounded border p-1 text-xs ${over === block ? "border-tide-600 bg-tide-50" : states.length ? "border-line-strong bg-paper" : "border-dashed border-line-strong"}`}
        >
          <div className="text-[10px] font-semibold text-ink-faint">{states.length ? `block ${block + 1}` : "new block"}</div>
          {states.map((i) => (
            <div
              key={i}
              role="listitem"
              draggable={!readOnly}
              data-state-chip={labels[i]}
              aria-label={`State ${labels[i]}, in block ${block + 1}`}
              onDragStart={(e) => {
                e.dataTransfer.setData("text/plain", String(i));
                e.dataTransfer.effectAllowed = "move";
              }}
              className={`rounded-full bg-paper-raised px-2 py-0.5 font-mono ring-1 ring-line-strong ${readOnly ? "" : "cursor-grab active:cursor-grabbing"}`}
            >
              {labels[i]}
            </div>
          ))}
        </div>
      ))}
    </div>
  );
}
