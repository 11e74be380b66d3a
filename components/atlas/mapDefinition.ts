/**
 * What a map is, in a few symbols: a projection as the coarse symbol of each block state (block
 * states 0…0 to 1…1 in order, DOMAIN.md §1), named when it is one of the familiar ones; a partition
 * as its blocks of state indices.
 */
export type MapDefinition = { symbols: string; name: string | null; title: string };

const bits = (s: number, N: number) => s.toString(2).padStart(N, "0");
const ones = (s: number) => s.toString(2).split("").filter((c) => c === "1").length;

/** Familiar binary projections of a block of N cells, each as a rule on the block state. */
function familiar(N: number): [string, (s: number) => number][] {
  const all = (1 << N) - 1;
  const named: [string, (s: number) => number][] = [
    ["parity", (s) => ones(s) % 2],
    ["first cell", (s) => (s >> (N - 1)) & 1],
    ["last cell", (s) => s & 1],
    [`all ${N} cells 1`, (s) => (s === all ? 1 : 0)],
    ["any cell 1", (s) => (s !== 0 ? 1 : 0)],
    [`all ${N} cells 0`, (s) => (s === 0 ? 1 : 0)],
    ["some cell 0", (s) => (s !== all ? 1 : 0)],
    ["count of 1s", (s) => ones(s)],
  ];
  if (N % 2 === 1) named.push(["majority", (s) => (ones(s) > N / 2 ? 1 : 0)]);
  return named;
}

export function describeProjection(projection: number[], N: number | null): MapDefinition {
  const symbols = projection.map((v) => v.toString(36)).join("");
  const binary = N !== null && projection.length === 2 ** N;
  const name = binary ? (familiar(N).find(([, f]) => projection.every((v, s) => v === f(s)))?.[0] ?? null) : null;
  const title = binary
    ? `projection: ${projection.map((v, s) => `${bits(s, N)}→${v}`).join(", ")}`
    : `projection: block state s goes to symbol ${symbols.split("").map((c, s) => `${s}→${c}`).join(", ")}`;
  return { symbols, name, title };
}

export function describePartition(partition: number[], labels?: string[]): MapDefinition {
  const blocks: number[][] = [];
  partition.forEach((b, i) => (blocks[b] ??= []).push(i));
  const show = (i: number) => labels?.[i] ?? String(i);
  const symbols = blocks.map((b) => `{${b.map(show).join(", ")}}`).join(" ");
  return { symbols, name: null, title: `partition into ${blocks.length} blocks: ${symbols}` };
}

/** A map's definition from the JSON text of its certificate's projection or partition. */
export function describeDefinition(kind: string, definition: string | null, block: number | null, labels?: string[]): MapDefinition | null {
  if (!definition) return null;
  let value: unknown;
  try {
    value = JSON.parse(definition);
  } catch {
    return null;
  }
  if (!Array.isArray(value) || !value.every((v) => Number.isInteger(v))) return null;
  if (kind === "lumping") return describePartition(value as number[], labels);
  return describeProjection(value as number[], block);
}
