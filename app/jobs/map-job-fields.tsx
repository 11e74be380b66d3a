"use client";

import { buttonClass } from "@/components/ui/button";
import { atlasMapText } from "@/components/workbench/atlasMaps";
import { browserApi } from "@/components/workbench/api";
import { MapSearch, type AtlasMap } from "@/components/workbench/map-search";
import { moveLink, type MapFormKind, type PickedMap } from "@/components/workbench/mapJobForms";

type FieldRender = (name: string, label: string, control: React.ReactNode, hint?: string) => React.ReactNode;

export type MapJobState = { picks: PickedMap[]; name: string; save: boolean };
export const EMPTY_MAP_JOB: MapJobState = { picks: [], name: "", save: true };

/** A chosen map in words, as the map search shows it: its ends and its kind with sizes. */
const labelOf = (m: AtlasMap) => `${m.source.name} → ${m.target.name} (${atlasMapText(m)})`;

/** The stored certificate of a chosen map, or the sentence for its field when it cannot be read. */
async function readCertificate(m: AtlasMap): Promise<Pick<PickedMap, "certificate" | "readError">> {
  if (!m.certificateAddress) return { readError: "The atlas did not say which certificate backs this map." };
  const res = await browserApi("GET", `/api/certificates/${encodeURIComponent(m.certificateAddress)}`);
  if (res.status >= 300) return { readError: `Its certificate could not be read (${res.status}).` };
  return { certificate: (res.body as { certificate?: unknown }).certificate };
}

/**
 * The fields of the two map-check job kinds: verify-map chooses one certified map, verify-chain an
 * ordered list of them (added from the search, moved up or down, removed) with a name. The params and
 * their errors are computed by the form from this state (components/workbench/mapJobForms).
 */
export function MapJobFields({
  kind,
  id,
  state,
  onChange,
  field,
}: {
  kind: MapFormKind;
  id: string;
  state: MapJobState;
  onChange: (update: (s: MapJobState) => MapJobState) => void;
  field: FieldRender;
}) {
  async function pick(m: AtlasMap) {
    const entry: PickedMap = { id: m.id, label: labelOf(m), source: m.source, target: m.target };
    onChange((s) => ({ ...s, picks: kind === "verify-map" ? [entry] : [...s.picks, entry] }));
    const read = await readCertificate(m);
    // Every link of this map gets the certificate (a chain may pass through one map twice).
    onChange((s) => ({ ...s, picks: s.picks.map((p) => (p.id === m.id && p.certificate === undefined ? { ...p, ...read } : p)) }));
  }
  const setPicks = (update: (picks: PickedMap[]) => PickedMap[]) => onChange((s) => ({ ...s, picks: update(s.picks) }));

  if (kind === "verify-map") {
    const chosen = state.picks[0];
    return (
      <>
        {field(
          "map",
          "Map to check again",
          <div id={`${id}-map`} role="group" aria-label="Map to check again" className="mt-1 space-y-1" aria-describedby={`${id}-map-error`}>
            <p className="text-sm" data-chosen-map>
              {chosen ? <strong className="break-words">{chosen.label}</strong> : <span className="text-ink-faint">None chosen yet: pick one below.</span>}
            </p>
            <MapSearch onAdd={pick} disabled={false} action="Choose" />
          </div>,
          "The job rebuilds the map's certificate from its source and parameters and checks the square again with a job's larger bounds.",
        )}
      </>
    );
  }
  return (
    <>
      {field(
        "name",
        "Name of the chain",
        <input
          id={`${id}-name`}
          value={state.name}
          onChange={(e) => onChange((s) => ({ ...s, name: e.target.value }))}
          className="mt-1 w-full rounded-md border border-line-strong bg-paper-raised px-2 py-1.5 text-sm"
          aria-describedby={`${id}-name-error`}
        />,
      )}
      {field(
        "maps",
        "Links, in order",
        <div id={`${id}-maps`} role="group" aria-label="Links, in order" className="mt-1 space-y-2" aria-describedby={`${id}-maps-error`}>
          <ChainLinks picks={state.picks} onMove={(i, by) => setPicks((p) => moveLink(p, i, by))} onRemove={(i) => setPicks((p) => p.filter((_, j) => j !== i))} />
          <MapSearch onAdd={pick} disabled={state.picks.length >= 64} action="Add" />
        </div>,
        "Each link must start at the model where the one before it ends.",
      )}
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" checked={state.save} onChange={(e) => onChange((s) => ({ ...s, save: e.target.checked }))} />
        Store the links and the chain in the atlas when the check succeeds
      </label>
    </>
  );
}

/** The chosen links in order, each with buttons to move it up or down and to remove it. */
function ChainLinks({ picks, onMove, onRemove }: { picks: PickedMap[]; onMove: (i: number, by: -1 | 1) => void; onRemove: (i: number) => void }) {
  if (picks.length === 0) return <p className="text-sm text-ink-faint">No link yet: add maps from the search below.</p>;
  const small = buttonClass("secondary", "px-1.5 py-0 text-xs");
  return (
    <ol className="space-y-1" aria-label="Links of the chain" data-chain-links>
      {picks.map((p, i) => (
        <li key={`${i}-${p.id}`} className="flex items-center gap-1 rounded border border-line px-1.5 py-1 text-sm">
          <span className="w-5 flex-none text-right font-mono text-xs text-ink-faint">{i + 1}.</span>
          <span className="min-w-0 flex-1 break-words">{p.label}</span>
          <button type="button" className={small} disabled={i === 0} onClick={() => onMove(i, -1)} aria-label={`Move link ${i + 1} up`}>
            ↑
          </button>
          <button type="button" className={small} disabled={i === picks.length - 1} onClick={() => onMove(i, 1)} aria-label={`Move link ${i + 1} down`}>
            ↓
          </button>
          <button type="button" className={small} onClick={() => onRemove(i)} aria-label={`Remove link ${i + 1}`}>
            Remove
          </button>
        </li>
      ))}
    </ol>
  );
}
