import { formatRational, parseRational } from "@/lib/rational";
import { stochasticIssue } from "@/lib/markov";
import { ModelSchema, type Model, type ModelInput } from "./schema";
import { ModelInputError, joinPath, type Issue } from "./modelIssue";

const MAX_DEPTH = 16;

/**
 * The canonical form of a model, so that equal models compare equal whatever their input spelling:
 * rationals reduced ("0.5" → "1/2"), default labels "0".."n-1", a k = 2, r = 1 CA becomes its ECA rule,
 * nested iterates and decimations multiply out, a block-1 supercell is the T-step iterate and a 1-step
 * iterate or decimation is its base. Throws ModelInputError listing every issue with its path.
 */
export function canonicalModel(input: unknown): Model {
  const parsed = ModelSchema.safeParse(input);
  if (!parsed.success) throw new ModelInputError(parsed.error.issues.map((i) => ({ path: joinPath(i.path), message: i.message })));
  const issues: Issue[] = [];
  const model = canonical(parsed.data, [], issues, 0);
  if (issues.length > 0) throw new ModelInputError(issues);
  return model;
}

function canonical(m: ModelInput, path: string[], issues: Issue[], depth: number): Model {
  const at = (...more: (string | number)[]) => [...path, ...more.map(String)].join(".");
  if (depth > MAX_DEPTH) {
    issues.push({ path: at(), message: `models nest deeper than ${MAX_DEPTH} levels` });
    return { kind: "eca", rule: 0 };
  }
  switch (m.kind) {
    case "eca":
      return { kind: "eca", rule: m.rule };
    case "ca": {
      const size = m.k ** (2 * m.r + 1);
      if (m.table.length !== size) issues.push({ path: at("table"), message: `expected k^(2r+1) = ${size} entries, got ${m.table.length}` });
      const bad = m.table.findIndex((v) => v >= m.k);
      if (bad >= 0) issues.push({ path: at("table", bad), message: `${m.table[bad]} is outside the alphabet 0..${m.k - 1}` });
      if (m.k === 2 && m.r === 1 && m.table.length === 8) return { kind: "eca", rule: m.table.reduce((rule, v, i) => rule | (v << i), 0) };
      return { kind: "ca", k: m.k, r: m.r, table: [...m.table] };
    }
    case "markov": {
      const n = m.matrix.length;
      const matrix = m.matrix.map((row) => row.map((x) => parseRational(x)));
      const problem = stochasticIssue(matrix);
      if (problem) issues.push({ path: at("matrix"), message: problem });
      const labels = m.labels ?? Array.from({ length: n }, (_, i) => String(i));
      if (labels.length !== n) issues.push({ path: at("labels"), message: `${labels.length} labels for ${n} states` });
      if (new Set(labels).size !== labels.length) issues.push({ path: at("labels"), message: "labels must be distinct" });
      return { kind: "markov", labels: [...labels], matrix: matrix.map((row) => row.map(formatRational)) };
    }
    case "iterate":
    case "supercell": {
      const base = canonical(m.base, [...path, "base"], issues, depth + 1);
      if (!isCaLike(base)) issues.push({ path: at("base"), message: `a ${m.kind} needs a cellular automaton as its base, not a ${base.kind}` });
      const steps = m.steps ?? (m.kind === "supercell" ? m.block : 1);
      // T steps of the S-step iterate are TS steps of its base, with the same radius ceil(rST / N).
      if (m.kind === "supercell" && m.block > 1)
        return base.kind === "iterate"
          ? { kind: "supercell", base: base.base, block: m.block, steps: base.steps * steps }
          : { kind: "supercell", base, block: m.block, steps };
      if (steps === 1) return base;
      if (base.kind === "iterate") return { kind: "iterate", base: base.base, steps: base.steps * steps };
      return { kind: "iterate", base, steps };
    }
    case "decimated": {
      const base = canonical(m.base, [...path, "base"], issues, depth + 1);
      if (!isChainLike(base)) issues.push({ path: at("base"), message: `a decimation needs a Markov chain as its base, not a ${base.kind}` });
      if (m.steps === 1) return base;
      if (base.kind === "decimated") return { kind: "decimated", base: base.base, steps: base.steps * m.steps };
      return { kind: "decimated", base, steps: m.steps };
    }
  }
}

export function isCaLike(m: Model): boolean {
  return m.kind === "eca" || m.kind === "ca" || m.kind === "supercell" || m.kind === "iterate";
}

export function isChainLike(m: Model): boolean {
  return m.kind === "markov" || m.kind === "decimated";
}
