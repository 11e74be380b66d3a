/** What the model page draws for a model's canonical form. */
export type CanonicalView =
  | { type: "markov"; labels: string[]; matrix: string[][] }
  | { type: "eca"; rule: number }
  | { type: "ca"; k: number; r: number; table: number[] }
  | { type: "derived"; kind: string; base: CanonicalView; block: number | null; steps: number | null }
  | { type: "unknown" };

const isStringMatrix = (v: unknown): v is string[][] =>
  Array.isArray(v) && v.every((row) => Array.isArray(row) && row.every((x) => typeof x === "string"));
const isNat = (v: unknown): v is number => typeof v === "number" && Number.isInteger(v) && v >= 0;

function readTable(v: unknown): number[] | null {
  if (Array.isArray(v) && v.every(isNat)) return v;
  if (typeof v === "string" && /^[0-9]+$/.test(v)) return [...v].map(Number);
  return null;
}

/** Reads a parsed canonical model (the core's `Model`) into what the page can draw. */
export function viewOf(model: unknown): CanonicalView {
  if (!model || typeof model !== "object") return { type: "unknown" };
  const m = model as Record<string, unknown>;
  const kind = typeof m.kind === "string" ? m.kind : typeof m.type === "string" ? m.type : "";
  const matrix = m.matrix ?? m.P;
  if (isStringMatrix(matrix)) {
    const labels = Array.isArray(m.labels) && m.labels.every((l) => typeof l === "string") ? (m.labels as string[]) : matrix.map((_, i) => String(i));
    return { type: "markov", labels, matrix };
  }
  if (m.base !== undefined && m.base !== null && typeof m.base === "object") {
    return {
      type: "derived",
      kind,
      base: viewOf(m.base),
      block: isNat(m.block) ? m.block : null,
      steps: isNat(m.steps) ? m.steps : null,
    };
  }
  const k = m.k ?? m.alphabet;
  const r = m.r ?? m.radius;
  const table = readTable(m.table);
  if (isNat(k) && isNat(r) && table) {
    if (k === 2 && r === 1 && table.length === 8) return { type: "eca", rule: table.reduce((acc, bit, i) => acc | (bit << i), 0) };
    return { type: "ca", k, r, table };
  }
  if (isNat(m.rule) && m.rule <= 255) return { type: "eca", rule: m.rule };
  return { type: "unknown" };
}

/** Parses stored canonical JSON; a row that does not parse shows as unknown rather than failing the page. */
export function canonicalView(canonical: string): CanonicalView {
  try {
    return viewOf(JSON.parse(canonical));
  } catch {
    return { type: "unknown" };
  }
}

const isFlat = (v: unknown[]) => v.every((x) => x === null || typeof x !== "object");

function layout(value: unknown, indent: string): string {
  if (Array.isArray(value)) {
    if (isFlat(value)) return `[${value.map((x) => JSON.stringify(x)).join(", ")}]`;
    const inner = indent + "  ";
    return `[\n${value.map((x) => inner + layout(x, inner)).join(",\n")}\n${indent}]`;
  }
  if (value && typeof value === "object") {
    const entries = Object.entries(value);
    if (entries.length === 0) return "{}";
    const inner = indent + "  ";
    return `{\n${entries.map(([k, v]) => `${inner}${JSON.stringify(k)}: ${layout(v, inner)}`).join(",\n")}\n${indent}}`;
  }
  return JSON.stringify(value);
}

/**
 * Indented JSON for reading, with arrays of plain values on one line (a projection, a matrix row);
 * text that is not JSON is shown as it is.
 */
export function prettyJson(text: string): string {
  try {
    return layout(JSON.parse(text), "");
  } catch {
    return text;
  }
}
