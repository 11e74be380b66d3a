"use client";

import { useDeferredValue, useMemo, useState } from "react";
import useSWR from "swr";
import { atlasMapText, mapEndLabels } from "./atlasMaps";
import { inputClass } from "./model-forms";

type End = { id: string; name: string; kind?: string; address?: string };
export type AtlasMap = { id: string; kind: string; block: number | null; steps: number | null; source: End; target: End; status: string; certificateAddress?: string };

async function fetchMaps(url: string): Promise<AtlasMap[]> {
  const response = await fetch(url);
  if (!response.ok) throw new Error(`search failed (${response.status})`);
  return ((await response.json()) as { items: AtlasMap[] }).items;
}

/**
 * Certified maps of the atlas, searched as the person types: dropped onto the canvas with their models,
 * or chosen on a job form (`action` names the button, "Add" by default).
 */
export function MapSearch({ onAdd, disabled, action = "Add" }: { onAdd: (m: AtlasMap) => void; disabled: boolean; action?: string }) {
  const [q, setQ] = useState("");
  const query = useDeferredValue(q.trim());
  const { data, error } = useSWR(`/api/search?target=maps&limit=30${query ? `&q=${encodeURIComponent(query)}` : ""}`, fetchMaps, { keepPreviousData: true });
  const items = useMemo(() => (data ?? []).filter((m) => m.status === "certified"), [data]);
  // Two models of one name are told apart (kind and address), as every other picker does.
  const names = useMemo(() => mapEndLabels(items), [items]);
  return (
    <div className="space-y-1">
      <input type="search" value={q} onChange={(e) => setQ(e.target.value)} placeholder="Search by model, e.g. ECA 146" aria-label="Search certified maps" className={inputClass} />
      {error ? <p className="text-xs text-brick-700">The atlas search did not answer.</p> : null}
      <ul className="max-h-56 space-y-1 overflow-auto pr-1" aria-label={`Certified maps to ${action.toLowerCase()}`}>
        {items.length === 0 ? <li className="text-xs text-ink-faint">No certified map matches.</li> : null}
        {items.map((m) => {
          const from = names.get(m.source.id) ?? m.source.name;
          const to = names.get(m.target.id) ?? m.target.name;
          return (
            <li key={m.id} className="flex items-center gap-1 rounded border border-line px-1.5 py-0.5">
              {/* Wrapped, not cut: the names that tell two models apart are at their end. */}
              <span className="min-w-0 flex-1 text-xs leading-snug break-words">
                {from} → {to} <span className="block font-mono text-ink-faint">{atlasMapText(m)}</span>
              </span>
              <button type="button" disabled={disabled} onClick={() => onAdd(m)} className="rounded px-1 text-xs font-semibold text-tide-800 ring-1 ring-line-strong disabled:opacity-40" aria-label={`${action} ${from} → ${to} (${atlasMapText(m)})`}>
                {action}
              </button>
            </li>
          );
        })}
      </ul>
    </div>
  );
}
