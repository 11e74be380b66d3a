import { atlasMapText, type StoredMapShape } from "./atlasMaps";

/** More ids than this in `?maps=` are not opened: a link from Ask names a handful, and each costs three reads. */
export const MAPS_PARAM_LIMIT = 32;

/** What the page found for one id of `?maps=`: the map (with its ends' names) or null when this workspace has none. */
export type MapLookup = {
  id: string;
  map: (StoredMapShape & { status: string; retractedReason: string | null; source: { name: string }; target: { name: string } }) | null;
};

export type LeftOutReason = "retracted" | "not-found" | "too-many";

/** A map named in the address that is not on the canvas, and why; `href` is its page when it exists. */
export type LeftOutMap = { id: string; label: string; reason: LeftOutReason; why: string; href: string | null };

/** The distinct ids of `?maps=a,b,…` in order, split into those opened and those past the limit. */
export function mapIdsOf(param: string | string[] | undefined): { ids: string[]; extra: string[] } {
  const text = Array.isArray(param) ? param[0] : param;
  const all = [...new Set((text ?? "").split(",").map((s) => s.trim()).filter(Boolean))];
  return { ids: all.slice(0, MAPS_PARAM_LIMIT), extra: all.slice(MAPS_PARAM_LIMIT) };
}

// An id a person typed is echoed back; a very long one is cut so that it cannot widen the notice.
const shownId = (id: string) => (id.length > 40 ? `${id.slice(0, 39)}…` : id);

function leftOut(lookup: MapLookup): LeftOutMap | null {
  const { id, map } = lookup;
  if (map === null) {
    return { id, label: `map ${shownId(id)}`, reason: "not-found", why: "not found: this workspace has no such map, or it is not visible to you", href: null };
  }
  if (map.status === "certified") return null;
  const label = `${map.source.name} → ${map.target.name} (${atlasMapText(map)})`;
  const why = map.retractedReason ? `retracted by a curator: “${map.retractedReason}”` : "retracted by a curator";
  return { id, label, reason: "retracted", why, href: `/atlas/maps/${encodeURIComponent(id)}` };
}

/**
 * The maps of `?maps=` that the workbench does not open, in the order given: a retracted map (its
 * certificate no longer stands, so it must not become a link of a new chain), an id this workspace
 * does not have (another workspace's map is answered the same way, so that ids leak nothing), and
 * ids past the limit.
 */
export function leftOutMaps(lookups: MapLookup[], extra: string[] = []): LeftOutMap[] {
  const skipped = lookups.map(leftOut).filter((m): m is LeftOutMap => m !== null);
  const tooMany = extra.map((id): LeftOutMap => ({ id, label: `map ${shownId(id)}`, reason: "too-many", why: `not opened: an address opens at most ${MAPS_PARAM_LIMIT} maps`, href: null }));
  return [...skipped, ...tooMany];
}
