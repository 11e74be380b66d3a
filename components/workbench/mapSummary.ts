import { chainLabels } from "@/lib/certificate";
import { canonicalModel, chainSize, isChainLike, type ModelInput } from "@/lib/models";
import { atlasMapText, type StoredMapShape } from "./atlasMaps";

/** What a stored map's certificate and source add to its kind: a lumping's partition, the source's labels and size. */
export type StoredMapDetail = { partition?: readonly number[] | null; labels?: readonly string[]; states?: number | null };

export type SummaryOptions = {
  /** Characters of blocks shown after the first one; the rest is counted, not listed. @default 48 */
  maxChars?: number;
  /** Labels shown per block; the others are counted. @default 4 */
  members?: number;
  /** Characters shown per label (a label may be 200 long). @default 10 */
  labelChars?: number;
};

/**
 * The blocks of a partition as lists of state labels, blocks in order of first appearance (the
 * canonical numbering of DOMAIN.md §1), states in the source's order. A state without a label is s<i>.
 */
export function partitionBlocks(labels: readonly string[], partition: readonly number[]): string[][] {
  const order = new Map<number, string[]>();
  partition.forEach((b, i) => {
    if (!order.has(b)) order.set(b, []);
    order.get(b)!.push(labels[i] ?? `s${i}`);
  });
  return [...order.values()];
}

const cut = (text: string, max: number) => (text.length > max ? `${text.slice(0, max - 1)}…` : text);

function blockText(members: string[], shown: number, labelChars: number): string {
  const listed = members.slice(0, shown).map((l) => cut(l, labelChars));
  const more = members.length - listed.length;
  return `{${listed.join(",")}${more > 0 ? `,… +${more}` : ""}}`;
}

/**
 * A partition in a line, "{a,b} {c,d} {e,f}", short enough for an edge's label on the canvas: long
 * labels and big blocks are cut, and blocks past `maxChars` are counted ("… +12 blocks"). The first
 * block is always shown.
 */
export function partitionSummary(labels: readonly string[], partition: readonly number[], options: SummaryOptions = {}): string {
  const { maxChars = 48, members = 4, labelChars = 10 } = options;
  const blocks = partitionBlocks(labels, partition).map((b) => blockText(b, members, labelChars));
  let text = blocks[0] ?? "";
  let shown = Math.min(1, blocks.length);
  while (shown < blocks.length && text.length + 1 + blocks[shown].length <= maxChars) text += ` ${blocks[shown++]}`;
  const rest = blocks.length - shown;
  return rest > 0 ? `${text} … +${rest} block${rest === 1 ? "" : "s"}` : text;
}

/**
 * A stored map in words for its edge on the canvas, with what its certificate says beyond the kind:
 * a lumping as "lumping 6 → 3: {a,b} {c,d} {e,f}" (of P^k: "lumping k=2, 6 → 3: …"), a decimation with
 * its steps and states. Without the detail it is atlasMapText's kind and sizes.
 */
export function storedMapSummary(shape: StoredMapShape, detail: StoredMapDetail = {}): string {
  const { partition, labels = [], states } = detail;
  if ((shape.kind === "lumping" || shape.kind === "exact-lumping") && partition && partition.length > 0) {
    const blocks = new Set(partition).size;
    const steps = shape.steps !== null && shape.steps > 1 ? ` k=${shape.steps},` : "";
    return `${shape.kind}${steps} ${partition.length} → ${blocks}: ${partitionSummary(labels, partition)}`;
  }
  if (shape.kind === "decimation" && shape.steps !== null && states) return `decimation k=${shape.steps}, ${states} states`;
  return atlasMapText(shape);
}

/** The detail for storedMapSummary from a map's source model (as stored, canonical) and its certificate's partition. */
export function storedMapDetail(source: ModelInput, partition: readonly number[] | null = null): StoredMapDetail {
  let model;
  try {
    model = canonicalModel(source);
  } catch {
    return { partition };
  }
  if (!isChainLike(model)) return { partition };
  return { partition, labels: chainLabels(model), states: chainSize(model) };
}

/** A lumping's partition as its certificate states it (`map.partition`), or null for any other map or body. */
export function certificatePartition(certificate: unknown): number[] | null {
  const partition = (certificate as { map?: { partition?: unknown } } | null)?.map?.partition;
  return Array.isArray(partition) && partition.every((b) => Number.isInteger(b)) ? (partition as number[]) : null;
}
