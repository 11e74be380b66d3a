/** The filters of the atlas browser, as they appear in the URL. */
export type AtlasFilters = {
  q?: string;
  rule?: number;
  class?: number;
  tag?: string;
  block?: number;
  mapKind?: string;
  kind?: string;
  /** List models (nodes) or maps (edges). */
  view?: "models" | "maps";
  /** The maps list folds the maps onto the constant rules (ECA 0, 255) unless asked to include them or list only them. */
  constant?: "include" | "only";
  cursor?: string;
};

export type FilterProblem = { field: keyof AtlasFilters; message: string };

const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v)?.trim() || undefined;

function whole(value: string | undefined, field: keyof AtlasFilters, min: number, max: number, problems: FilterProblem[]) {
  if (value === undefined) return undefined;
  if (!/^\d+$/.test(value) || Number(value) < min || Number(value) > max) {
    problems.push({ field, message: `must be a whole number from ${min} to ${max}` });
    return undefined;
  }
  return Number(value);
}

/**
 * Reads the filters from `searchParams`. A bad value is dropped and reported next to its field
 * rather than failing the page.
 */
export function parseAtlasFilters(
  params: Record<string, string | string[] | undefined>,
  allowed: { mapKinds: readonly string[]; modelKinds: readonly string[] },
): { filters: AtlasFilters; problems: FilterProblem[] } {
  const problems: FilterProblem[] = [];
  const filters: AtlasFilters = {
    q: first(params.q)?.slice(0, 200),
    rule: whole(first(params.rule), "rule", 0, 255, problems),
    class: whole(first(params.class), "class", 0, 255, problems),
    tag: first(params.tag)?.slice(0, 100),
    block: whole(first(params.block), "block", 1, 64, problems),
    cursor: first(params.cursor),
  };
  const mapKind = first(params.mapKind);
  if (mapKind !== undefined) {
    if (allowed.mapKinds.includes(mapKind)) filters.mapKind = mapKind;
    else problems.push({ field: "mapKind", message: `must be one of ${allowed.mapKinds.join(", ")}` });
  }
  const view = first(params.view);
  if (view !== undefined) {
    if (view === "models" || view === "maps") filters.view = view;
    else problems.push({ field: "view", message: "must be models or maps" });
  }
  const constant = first(params.constant);
  if (constant !== undefined) {
    if (constant === "include" || constant === "only") filters.constant = constant;
    else problems.push({ field: "constant", message: "must be include or only" });
  }
  const kind = first(params.kind);
  if (kind !== undefined) {
    if (allowed.modelKinds.includes(kind)) filters.kind = kind;
    else problems.push({ field: "kind", message: `must be one of ${allowed.modelKinds.join(", ")}` });
  }
  for (const key of Object.keys(filters) as (keyof AtlasFilters)[]) if (filters[key] === undefined) delete filters[key];
  return { filters, problems };
}

/** The URL of the atlas browser with these filters (and optionally a cursor). */
export function atlasHref(filters: AtlasFilters, base = "/atlas"): string {
  const query = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) if (value !== undefined && value !== "") query.set(key, String(value));
  const text = query.toString();
  return text ? `${base}?${text}` : base;
}
