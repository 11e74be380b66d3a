import { distinctNames, type NamedModel } from "@/components/ui/distinctNames";

/** What the atlas lists of a stored map: its kind and sizes (block size N, steps T or k). */
export type StoredMapShape = { kind: string; block: number | null; steps: number | null };

/**
 * A stored map in words for its edge on the canvas: its kind and main parameter. The canvas has no
 * editable parameters for it (the certificate holds them), so this is what it shows instead.
 */
export function atlasMapText({ kind, block, steps }: StoredMapShape): string {
  const n = block !== null ? ` N=${block}` : "";
  switch (kind) {
    case "decimation":
      return steps !== null ? `decimation k=${steps}` : "decimation";
    case "iterate":
      return steps !== null ? `iterate T=${steps}` : "iterate";
    case "blocking":
      return `blocking${n}`;
    case "lumping":
    case "exact-lumping":
      return steps !== null && steps > 1 ? `${kind}, then k=${steps}` : kind;
    default:
      // projection, coarse-graining: block size, and the steps when the map says them.
      return `${kind}${n}${steps !== null ? ` T=${steps}` : ""}`;
  }
}

/**
 * The name of each model at either end of the listed maps, told apart where several models share a
 * name (components/ui/distinctNames), keyed by model id.
 */
export function mapEndLabels(maps: { source: NamedModel; target: NamedModel }[]): Map<string, string> {
  const ends = new Map<string, NamedModel>();
  for (const m of maps) for (const end of [m.source, m.target]) if (!ends.has(end.id)) ends.set(end.id, end);
  return new Map(distinctNames([...ends.values()]).map((e) => [e.id, e.label]));
}
