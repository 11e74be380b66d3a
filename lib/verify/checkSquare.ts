import { checkProjection, coarseAlphabet, iterateTable, supercellTable, toDigits, type RuleTable } from "@/lib/ca";
import { checkExactLumping, checkLumping, matrixPower, type Matrix } from "@/lib/markov";
import { caShape, canonicalModel, describeModel, modelMatrix, modelRuleTable, modelsEqual, type Issue, type Model } from "@/lib/models";
import { equals, formatRational } from "@/lib/rational";
import { blockLabels, chainLabels, type Certificate, type Counterexample } from "@/lib/certificate";

/**
 * What the check evaluated, read from the values it passed to the computation (not from the drawing):
 * `steps` is the power of the source dynamics, `block` the block size of B_N (projection, blocking).
 */
export type Equation = { kind: Certificate["map"]["kind"]; steps: number; block: number | null; source: Model; target: Model };

export type SquareResult = { holds: true; equation: Equation } | { holds: false; counterexample: Counterexample } | { holds: null; issues: Issue[] };

const fails = (counterexample: Counterexample): SquareResult => ({ holds: false, counterexample });
/** A target written in another encoding than the one the map produces: no counterexample exists, so not "fails". */
const wrongEncoding = (message: string): SquareResult => ({ holds: null, issues: [{ path: "target", message }] });

/**
 * The commuting-square check of DOMAIN.md §2 for one canonical certificate whose structure and limits
 * were already checked. Every claim is recomputed from the source; nothing is taken from the certificate.
 */
export function checkSquare(cert: Certificate): SquareResult {
  const { map, source, target } = cert;
  const holds = (steps: number, block: number | null): SquareResult => ({ holds: true, equation: { kind: map.kind, steps, block, source, target } });
  switch (map.kind) {
    case "projection": {
      const t = modelRuleTable(source);
      const m = coarseAlphabet(map.projection, t.k ** map.block);
      const R = Math.ceil((t.r * map.steps) / map.block);
      const shape = caShape(target);
      if (shape.k !== m || shape.r !== R)
        return wrongEncoding(
          `the claimed target is ${describeModel(target)} (k=${shape.k}, r=${shape.r}); this projection gives a coarse rule on ${m} symbols of radius ceil(rT/N) = ceil(${t.r}·${map.steps}/${map.block}) = ${R}: write the target as a CA with k=${m}, r=${R}`,
        );
      const check = checkProjection(t, map.block, map.projection, { steps: map.steps, target: modelRuleTable(target) });
      return check.ok ? holds(map.steps, map.block) : fails(check.counterexample);
    }
    case "blocking":
      return sameTable(target, canonicalModel({ kind: "supercell", base: source, block: map.block, steps: map.steps }), () => supercellTable(modelRuleTable(source), map.block, map.steps), holds(map.steps, map.block));
    case "iterate":
      return sameTable(target, canonicalModel({ kind: "iterate", base: source, steps: map.steps }), () => iterateTable(modelRuleTable(source), map.steps), holds(map.steps, null));
    case "decimation": {
      const labels = sameLabels(target, chainLabels(source));
      if (labels) return labels;
      if (modelsEqual(target, canonicalModel({ kind: "decimated", base: source, steps: map.steps }))) return holds(map.steps, null);
      return compareMatrices(matrixPower(modelMatrix(source), map.steps), target, "matrix-entry-mismatch", holds(map.steps, null));
    }
    case "lumping": {
      const check = checkLumping(matrixPower(modelMatrix(source), map.steps), map.partition);
      if (!check.ok) return fails(check.counterexample);
      return compareMatrices(check.lumped, target, "lumped-entry-mismatch", holds(map.steps, null), blockLabels(chainLabels(source), check.partition));
    }
    case "exact-lumping": {
      const check = checkExactLumping(matrixPower(modelMatrix(source), map.steps), map.partition);
      if (!check.ok) return fails(check.counterexample);
      return compareMatrices(check.lumped, target, "lumped-entry-mismatch", holds(map.steps, null), blockLabels(chainLabels(source), check.partition));
    }
  }
}

/**
 * The target of a blocking or an iterate, compared by value: the derived model itself, or any model
 * (explicit table, another derived model) whose table equals the recomputed one entry by entry.
 */
function sameTable(target: Model, derived: Model, build: () => RuleTable, ok: SquareResult): SquareResult {
  if (modelsEqual(target, derived)) return ok;
  const expected = caShape(derived);
  const shape = caShape(target);
  if (shape.k !== expected.k || shape.r !== expected.r)
    return wrongEncoding(`the claimed target is ${describeModel(target)} (k=${shape.k}, r=${shape.r}); the map gives ${describeModel(derived)}: write the target with k=${expected.k}, r=${expected.r}`);
  const actual = build();
  const claimed = modelRuleTable(target);
  for (let i = 0; i < actual.table.length; i++)
    if (claimed.table[i] !== actual.table[i]) {
      const cells = Array.from(toDigits(i, actual.k, 2 * actual.r + 1), (d) => d.toString(36)).join(",");
      return fails({ kind: "table-entry-mismatch", neighbourhood: i, cells, claimed: claimed.table[i], actual: actual.table[i] });
    }
  return ok;
}

/** A target chain's labels must be `expected` (FORMAT.md): the first state whose label differs is the counterexample. */
function sameLabels(target: Model, expected: string[]): SquareResult | null {
  const claimed = chainLabels(target);
  if (claimed.length !== expected.length) return null;
  const state = claimed.findIndex((label, i) => label !== expected[i]);
  return state < 0 ? null : fails({ kind: "label-mismatch", state, claimed: claimed[state], expected: expected[state] });
}

function compareMatrices(actual: Matrix, target: Model, kind: "matrix-entry-mismatch" | "lumped-entry-mismatch", ok: SquareResult, labels?: string[]): SquareResult {
  const claimed = modelMatrix(target);
  if (claimed.length !== actual.length) return wrongEncoding(`the claimed target is ${describeModel(target)}; the map gives a ${actual.length}-state Markov chain`);
  const wrongLabel = labels ? sameLabels(target, labels) : null;
  if (wrongLabel) return wrongLabel;
  for (let i = 0; i < actual.length; i++)
    for (let j = 0; j < actual.length; j++)
      if (!equals(claimed[i][j], actual[i][j])) {
        const [c, a] = [formatRational(claimed[i][j]), formatRational(actual[i][j])];
        return fails(kind === "lumped-entry-mismatch" ? { kind, block: i, targetBlock: j, claimed: c, actual: a } : { kind, row: i, column: j, claimed: c, actual: a });
      }
  return ok;
}
