import { CaInputError, checkProjection, ecaTable, iterateTable, supercellShape, type ProjectionCounterexample, type RuleTable } from "@/lib/ca";
import { checkExactLumping, checkLumping, formatMatrix, matrixPower, type ExactLumpingCounterexample, type LumpingCounterexample, type Matrix } from "@/lib/markov";
import { canonicalModel, modelMatrix, ruleTableModel, type Model } from "@/lib/models";
import { formatRational } from "@/lib/rational";
import { sealCertificate } from "./certificateAddress";
import { blockLabels, chainLabels } from "./chainLabels";
import { CERTIFICATE_FORMAT, CERTIFICATE_VERSION, type Certificate, type CertificateMap } from "./schema";

export type Built<C> = { ok: true; certificate: Certificate } | { ok: false; counterexample: C };

/** A CA given by its ECA rule number or by a full rule table. */
export type RuleInput = { rule?: number; table?: RuleTable | { k: number; r: number; table: ArrayLike<number> } };

function ruleTableOf({ rule, table }: RuleInput): RuleTable {
  if (rule !== undefined && table !== undefined) throw new CaInputError("rule", "give either a rule number or a table, not both");
  if (rule !== undefined) return ecaTable(rule);
  if (table === undefined) throw new CaInputError("rule", "a rule number or a rule table is required");
  return { k: table.k, r: table.r, table: Uint8Array.from(table.table) };
}

/** "0110" → [0, 1, 1, 0]: character s is the image of block state s (base-36 digits for larger coarse alphabets). */
export function parseProjectionString(text: string): number[] {
  if (!/^[0-9a-z]+$/.test(text)) throw new CaInputError("projection", "expected a string of digits such as 0110, one per block state");
  return Array.from(text, (c) => parseInt(c, 36));
}

function issue(map: CertificateMap, source: Model, target: Model): Certificate {
  return sealCertificate({ format: CERTIFICATE_FORMAT, version: CERTIFICATE_VERSION, map, source, target });
}

/** Coarse-graining of a CA at block N (blocking then projection); the coarse rule is derived by the exhaustive check. */
export function certifyProjection(input: RuleInput & { block: number; steps?: number; projection: number[] | string }): Built<ProjectionCounterexample> {
  const t = ruleTableOf(input);
  const projection = typeof input.projection === "string" ? parseProjectionString(input.projection) : [...input.projection];
  const steps = input.steps ?? input.block;
  const check = checkProjection(t, input.block, projection, { steps });
  if (!check.ok) return check;
  return { ok: true, certificate: issue({ kind: "projection", block: input.block, steps, projection }, ruleTableModel(t), ruleTableModel(check.coarse)) };
}

function chainModel(chain: unknown): Model {
  const model = canonicalModel(chain);
  if (model.kind !== "markov" && model.kind !== "decimated") throw new CaInputError("chain", `expected a Markov chain, got a ${model.kind}`);
  return model;
}

/** Strong lumping of a chain (of its s-step decimation when steps = s > 1) by a partition; the lumped chain is derived. */
export function certifyLumping(input: { chain: unknown; partition: number[]; steps?: number }): Built<LumpingCounterexample> {
  const source = chainModel(input.chain);
  const steps = input.steps ?? 1;
  const p: Matrix = matrixPower(modelMatrix(source), steps);
  const check = checkLumping(p, input.partition);
  if (!check.ok) return check;
  const target: Model = { kind: "markov", labels: blockLabels(chainLabels(source), check.partition), matrix: formatMatrix(check.lumped) };
  return { ok: true, certificate: issue({ kind: "lumping", partition: check.partition, steps }, source, target) };
}

/** Exact lumping (Buchholz 1994) of a chain (of P^s when steps = s > 1) by a partition; the lumped chain is derived. */
export function certifyExactLumping(input: { chain: unknown; partition: number[]; steps?: number }): Built<ExactLumpingCounterexample> {
  const source = chainModel(input.chain);
  const steps = input.steps ?? 1;
  const check = checkExactLumping(matrixPower(modelMatrix(source), steps), input.partition);
  if (!check.ok) return check;
  const target: Model = { kind: "markov", labels: blockLabels(chainLabels(source), check.partition), matrix: formatMatrix(check.lumped) };
  return { ok: true, certificate: issue({ kind: "exact-lumping", partition: check.partition, steps }, source, target) };
}

/** The k-step decimation P → P^k, with P^k computed exactly by repeated squaring. Always holds. */
export function certifyDecimation(input: { chain: unknown; steps: number }): Built<never> {
  const source = chainModel(input.chain);
  const power = matrixPower(modelMatrix(source), input.steps);
  const target: Model = { kind: "markov", labels: chainLabels(source), matrix: power.map((row) => row.map(formatRational)) };
  return { ok: true, certificate: issue({ kind: "decimation", steps: input.steps }, source, target) };
}

/** Supercell blocking by N with T steps; the target is the derived supercell model (DOMAIN.md §1). */
export function certifyBlocking(input: RuleInput & { block: number; steps?: number }): Built<never> {
  const t = ruleTableOf(input);
  const steps = input.steps ?? input.block;
  supercellShape(t, input.block, steps);
  const source = ruleTableModel(t);
  const target = canonicalModel({ kind: "supercell", base: source, block: input.block, steps });
  return { ok: true, certificate: issue({ kind: "blocking", block: input.block, steps }, source, target) };
}

/** CA time decimation (k, r, f) → (k, rT, f^T), the target table written out in full. */
export function certifyIterate(input: RuleInput & { steps: number }): Built<never> {
  const t = ruleTableOf(input);
  return { ok: true, certificate: issue({ kind: "iterate", steps: input.steps }, ruleTableModel(t), ruleTableModel(iterateTable(t, input.steps))) };
}
