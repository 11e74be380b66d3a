import { checkProjection, coarseAlphabet, iterateTable, supercellTable, toDigits, type RuleTable } from "@/lib/ca";
import { checkExactLumping, checkLumping, matrixPower, type Matrix } from "@/lib/markov";
import { caShape, canonicalModel, describeModel, modelMatrix, modelRuleTable, modelsEqual, type Model } from "@/lib/models";
import { equals, formatRational } from "@/lib/rational";
import type { Certificate, Counterexample } from "@/lib/certificate";

export type SquareResult = { holds: true } | { holds: false; counterexample: Counterexample };

const HOLDS: SquareResult = { holds: true };
const fails = (counterexample: Counterexample): SquareResult => ({ holds: false, counterexample });

/**
 * The commuting-square check of DOMAIN.md §2 for one canonical certificate whose structure and limits
 * were already checked. Every claim is recomputed from the source; nothing is taken from the certificate.
 */
export function checkSquare(cert: Certificate): SquareResult {
  const { map, source, target } = cert;
  switch (map.kind) {
    case "projection": {
      const t = modelRuleTable(source);
      const m = coarseAlphabet(map.projection, t.k ** map.block);
      const R = Math.ceil((t.r * map.steps) / map.block);
      const shape = caShape(target);
      if (shape.k !== m || shape.r !== R) return fails(shapeMismatch(`a CA with k=${m}, r=${R}`, target));
      const check = checkProjection(t, map.block, map.projection, { steps: map.steps, target: modelRuleTable(target) });
      return check.ok ? HOLDS : fails(check.counterexample);
    }
    case "blocking":
      return sameDerivedOrTable(target, { kind: "supercell", base: source, block: map.block, steps: map.steps }, () =>
        supercellTable(modelRuleTable(source), map.block, map.steps),
      );
    case "iterate":
      return sameDerivedOrTable(target, { kind: "iterate", base: source, steps: map.steps }, () => iterateTable(modelRuleTable(source), map.steps));
    case "decimation": {
      if (modelsEqual(target, canonicalModel({ kind: "decimated", base: source, steps: map.steps }))) return HOLDS;
      return compareMatrices(matrixPower(modelMatrix(source), map.steps), target, "matrix-entry-mismatch");
    }
    case "lumping": {
      const check = checkLumping(matrixPower(modelMatrix(source), map.steps), map.partition);
      return check.ok ? compareMatrices(check.lumped, target, "lumped-entry-mismatch") : fails(check.counterexample);
    }
    case "exact-lumping": {
      const check = checkExactLumping(matrixPower(modelMatrix(source), map.steps), map.partition);
      return check.ok ? compareMatrices(check.lumped, target, "lumped-entry-mismatch") : fails(check.counterexample);
    }
  }
}

function shapeMismatch(expected: string, target: Model): Counterexample {
  return { kind: "target-mismatch", message: `the claimed target is ${describeModel(target)}; the map gives ${expected}`, expected, claimed: describeModel(target) };
}

/** A derived target must be exactly the derived model; an explicit table must equal the recomputed one entry by entry. */
function sameDerivedOrTable(target: Model, derived: unknown, build: () => RuleTable): SquareResult {
  const expected = canonicalModel(derived);
  if (modelsEqual(target, expected)) return HOLDS;
  if (target.kind !== "ca" && target.kind !== "eca") return fails(shapeMismatch(describeModel(expected), target));
  const actual = build();
  const claimed = modelRuleTable(target);
  if (claimed.k !== actual.k || claimed.r !== actual.r) return fails(shapeMismatch(`a CA with k=${actual.k}, r=${actual.r}`, target));
  for (let i = 0; i < actual.table.length; i++)
    if (claimed.table[i] !== actual.table[i]) {
      const cells = Array.from(toDigits(i, actual.k, 2 * actual.r + 1), (d) => d.toString(36)).join(",");
      return fails({ kind: "table-entry-mismatch", neighbourhood: i, cells, claimed: claimed.table[i], actual: actual.table[i] });
    }
  return HOLDS;
}

function compareMatrices(actual: Matrix, target: Model, kind: "matrix-entry-mismatch" | "lumped-entry-mismatch"): SquareResult {
  if (target.kind !== "markov" && target.kind !== "decimated") return fails(shapeMismatch(`a ${actual.length}-state Markov chain`, target));
  const claimed = modelMatrix(target);
  if (claimed.length !== actual.length) return fails(shapeMismatch(`a ${actual.length}-state Markov chain`, target));
  for (let i = 0; i < actual.length; i++)
    for (let j = 0; j < actual.length; j++)
      if (!equals(claimed[i][j], actual[i][j])) {
        const [c, a] = [formatRational(claimed[i][j]), formatRational(actual[i][j])];
        return fails(kind === "lumped-entry-mismatch" ? { kind, block: i, targetBlock: j, claimed: c, actual: a } : { kind, row: i, column: j, claimed: c, actual: a });
      }
  return HOLDS;
}
