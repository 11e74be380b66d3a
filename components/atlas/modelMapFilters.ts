/** Which of a model page's two map lists: "o" coarse-grains onto (maps from the model), "f" coarse-grained from (maps to it). */
export type ListSide = "o" | "f";

/** One list's filters as they appear in the URL, each key prefixed by its side (okind, fblock, …). */
export type SideFilters = { kind?: string; block?: number; cls?: number; cursor?: string; constants?: boolean };
export type ModelMapFilters = Record<ListSide, SideFilters>;

const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v)?.trim() || undefined;

function whole(v: string | undefined, max: number): number | undefined {
  return v !== undefined && /^\d{1,4}$/.test(v) && Number(v) <= max ? Number(v) : undefined;
}

/** Reads both lists' filters; a value that is not valid is ignored (the list then shows unfiltered). */
export function parseModelMapFilters(params: Record<string, string | string[] | undefined>, mapKinds: readonly string[]): ModelMapFilters {
  const side = (s: ListSide): SideFilters => {
    const kind = first(params[`${s}kind`]);
    return {
      kind: kind && mapKinds.includes(kind) ? kind : undefined,
      block: whole(first(params[`${s}block`]), 64),
      cls: whole(first(params[`${s}class`]), 255),
      cursor: first(params[`${s}cursor`])?.slice(0, 500),
      constants: first(params[`${s}const`]) === "1",
    };
  };
  return { o: side("o"), f: side("f") };
}

/** The model page's URL with one side's filters changed; the other side's filters are kept. */
export function modelMapsHref(path: string, filters: ModelMapFilters, side: ListSide, change: SideFilters): string {
  const next: ModelMapFilters = { ...filters, [side]: change };
  const q = new URLSearchParams();
  for (const s of ["o", "f"] as const) {
    const f = next[s];
    if (f.kind) q.set(`${s}kind`, f.kind);
    if (f.block !== undefined) q.set(`${s}block`, String(f.block));
    if (f.cls !== undefined) q.set(`${s}class`, String(f.cls));
    if (f.constants) q.set(`${s}const`, "1");
    if (f.cursor) q.set(`${s}cursor`, f.cursor);
  }
  const text = q.toString();
  return `${path}${text ? `?${text}` : ""}#maps-${side}`;
}
