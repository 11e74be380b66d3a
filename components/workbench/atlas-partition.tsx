"use client";

import useSWR from "swr";
import { chainLabels } from "@/lib/certificate";
import type { ModelInput } from "@/lib/models";
import { tryCanonical } from "./derivedModels";
import { certificatePartition, partitionBlocks } from "./mapSummary";

/** The certificate's partition of a map taken from the atlas (its address, else read from the map). */
async function fetchPartition([, address, mapId]: [string, string | null, string | null]): Promise<number[] | null> {
  let at = address;
  if (!at && mapId) {
    const map = await fetch(`/api/maps/${encodeURIComponent(mapId)}`);
    if (!map.ok) throw new Error(`the map could not be read (${map.status})`);
    at = ((await map.json()) as { certificateAddress: string }).certificateAddress;
  }
  if (!at) return null;
  const res = await fetch(`/api/certificates/${encodeURIComponent(at)}`);
  if (!res.ok) throw new Error(`the certificate could not be read (${res.status})`);
  return certificatePartition(((await res.json()) as { certificate?: unknown }).certificate);
}

/**
 * The full partition of a lumping taken from the atlas, block by block with the source chain's labels:
 * the edge on the canvas shows a cut summary, the inspector shows every state.
 */
export function AtlasPartition({ address, mapId, source }: { address: string | null; mapId: string | null; source: ModelInput | null }) {
  const { data: partition, error } = useSWR(address || mapId ? ["atlas-partition", address, mapId] : null, fetchPartition);
  if (error) return <p className="text-xs text-brick-700">The partition could not be read: {error instanceof Error ? error.message : String(error)}.</p>;
  if (!partition) return null;
  const model = tryCanonical(source);
  const blocks = partitionBlocks(model ? chainLabels(model) : [], partition);
  return (
    <section className="space-y-1" aria-label="Partition of the lumping" data-atlas-partition>
      <h4 className="text-xs font-semibold text-ink-soft">
        Partition: {partition.length} states into {blocks.length} block{blocks.length === 1 ? "" : "s"}
      </h4>
      <ol className="max-h-64 space-y-0.5 overflow-auto pr-1 text-xs">
        {blocks.map((states, b) => (
          <li key={b} className="break-words">
            <span className="text-ink-faint">block {b + 1}: </span>
            <span className="font-mono">{`{${states.join(", ")}}`}</span>
          </li>
        ))}
      </ol>
    </section>
  );
}
