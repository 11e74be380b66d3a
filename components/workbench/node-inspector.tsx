"use client";

import { useId, useState } from "react";
import { buttonClass } from "@/components/ui/button";
import { derivedModel, modelName, nodeLabel, tryCanonical } from "./derivedModels";
import { defaultSpec } from "./map-editor";
import { Field, inputClass } from "./model-forms";
import { nodeShape } from "./nodeShape";
import type { MapSpec, WbNode, Workbench } from "./workbenchState";

const DERIVED_KINDS = new Set<MapSpec["kind"]>(["blocking", "iterate", "decimation"]);
const KIND_WORD: Record<MapSpec["kind"], string> = {
  projection: "Projection",
  blocking: "Block-N supercell",
  iterate: "T-step iterate",
  lumping: "Lumping",
  decimation: "k-step decimation",
};

/** A node: its name and description, and new maps from it (to a new node, or to one on the canvas). */
export function NodeInspector({
  workbench,
  node,
  readOnly,
  onRename,
  onPropose,
  onRemove,
}: {
  workbench: Workbench;
  node: WbNode;
  readOnly: boolean;
  onRename: (patch: { name?: string; description?: string }) => void;
  onPropose: (spec: MapSpec, to: string | { name: string; note: string; derived: WbNode["model"] }) => void;
  onRemove: () => void;
}) {
  const id = useId();
  const shape = nodeShape(workbench, node.id);
  const kinds: MapSpec["kind"][] = shape?.kind === "markov" ? ["lumping", "decimation"] : shape?.kind === "ca" ? ["projection", "blocking", "iterate"] : [];
  const [kind, setKind] = useState<MapSpec["kind"] | "">("");
  const [nText, setNText] = useState("2");
  const [target, setTarget] = useState("");
  const chosen = kind && kinds.includes(kind) ? kind : kinds[0];
  const n = Number(nText);
  const nOk = /^\d+$/.test(nText) && n >= 1 && n <= (chosen === "decimation" ? 1000 : 6);
  const canonical = tryCanonical(node.model);
  const others = workbench.nodes.filter((o) => o.id !== node.id && !workbench.edges.some((e) => e.target === o.id));

  function spec(): MapSpec {
    const base = defaultSpec(chosen!, shape);
    if (base.kind === "blocking") return { kind: "blocking", block: n };
    if (base.kind === "iterate" || base.kind === "decimation") return { kind: base.kind, steps: n };
    return base;
  }

  function toNew() {
    if (!chosen) return;
    if (DERIVED_KINDS.has(chosen) && node.model) {
      const d = derivedModel(node.model, chosen as "blocking" | "iterate" | "decimation", n);
      onPropose(spec(), { name: d.name, note: d.note, derived: null });
    } else onPropose(spec(), { name: "", note: "", derived: null });
  }

  return (
    <section aria-labelledby={`${id}-h`} className="space-y-3">
      <h3 id={`${id}-h`} className="text-sm font-semibold text-ink">
        {nodeLabel(workbench.nodes, node.id)}
      </h3>
      <p className="font-mono text-xs text-ink-soft">{canonical ? modelName(canonical) : "Its model is determined by the map into it, once certified."}</p>
      {node.note ? <p className="rounded bg-saffron-50 px-2 py-1 text-xs text-saffron-700">{node.note}</p> : null}
      {node.modelId ? (
        <a href={`/atlas/models/${node.modelId}`} className="text-xs text-tide-800 underline">
          This model in the atlas
        </a>
      ) : null}
      <Field id={`${id}-name`} label="Name">
        <input id={`${id}-name`} disabled={readOnly} value={node.name} onChange={(e) => onRename({ name: e.target.value.slice(0, 200) })} className={inputClass} />
      </Field>
      <Field id={`${id}-description`} label="Description">
        <input id={`${id}-description`} disabled={readOnly} value={node.description} onChange={(e) => onRename({ description: e.target.value.slice(0, 2000) })} className={inputClass} />
      </Field>
      {!readOnly && kinds.length > 0 ? (
        <fieldset className="space-y-2 rounded border border-line p-2">
          <legend className="px-1 text-xs font-semibold text-ink-soft">New map from this node</legend>
          <Field id={`${id}-kind`} label="Kind">
            <select id={`${id}-kind`} value={chosen} onChange={(e) => setKind(e.target.value as MapSpec["kind"])} className={inputClass}>
              {kinds.map((k) => (
                <option key={k} value={k}>
                  {KIND_WORD[k]}
                </option>
              ))}
            </select>
          </Field>
          {chosen && DERIVED_KINDS.has(chosen) ? (
            <Field id={`${id}-n`} label={chosen === "blocking" ? "Block size N (1–6)" : chosen === "iterate" ? "Steps T (1–6)" : "Steps k (1–1000)"} error={nOk ? undefined : "Give a whole number in the range."}>
              <input id={`${id}-n`} inputMode="numeric" value={nText} onChange={(e) => setNText(e.target.value)} className={inputClass} />
            </Field>
          ) : null}
          <button type="button" disabled={!nOk} onClick={toNew} className={buttonClass("secondary", "w-full py-1 text-xs")}>
            {chosen && DERIVED_KINDS.has(chosen) ? "Derive a new node" : "Map to a new node"}
          </button>
          {others.length > 0 ? (
            <div className="flex gap-1">
              <select aria-label="Map to a node on the canvas" value={target} onChange={(e) => setTarget(e.target.value)} className={`${inputClass} text-xs`}>
                <option value="">…or to a node on the canvas</option>
                {others.map((o) => (
                  <option key={o.id} value={o.id}>
                    {nodeLabel(workbench.nodes, o.id)}
                  </option>
                ))}
              </select>
              <button type="button" disabled={!target || !nOk} onClick={() => onPropose(spec(), target)} className={buttonClass("secondary", "px-2 py-1 text-xs")}>
                Map
              </button>
            </div>
          ) : null}
        </fieldset>
      ) : null}
      {!readOnly ? (
        <button type="button" onClick={onRemove} className={buttonClass("quiet", "px-2 py-1 text-xs text-brick-700")}>
          Remove this node and its maps
        </button>
      ) : null}
    </section>
  );
}
