import { markovForm } from "./modelForms";

/** The fields a job form shows, as typed (strings), and the params they give or the field at fault. */
export type JobFields = Record<string, string>;
export type JobParamsResult = { params: Record<string, unknown> | null; errors: Record<string, string> };

export const FORM_KINDS = ["search-projection", "eca-atlas", "lump-chain", "totalistic-atlas", "lump-large-chain"] as const;
export type FormKind = (typeof FORM_KINDS)[number];

export const DEFAULT_FIELDS: Record<FormKind, JobFields> = {
  "search-projection": { rule: "110", minBlock: "2", maxBlock: "3", search: "projections" },
  "eca-atlas": { minBlock: "2", maxBlock: "3", search: "projections" },
  "lump-chain": { matrix: "", labels: "", apart: "" },
  "totalistic-atlas": { minCode: "0", maxCode: "2186", blocks: "1,2" },
  "lump-large-chain": { groups: "1000", members: "1000", seed: "1" },
};

/** Three-state totalistic codes run 0…3^7 − 1 (README, "Three-state totalistic rules"). */
const TOTALISTIC_LAST_CODE = 2186;
/** The lump-large-chain job's bound on groups × members (server/jobs/kinds/lump-large-chain.compute.ts). */
const LARGE_CHAIN_STATES = 2_000_000;

function totalisticParams(f: JobFields): JobParamsResult {
  const errors: Record<string, string> = {};
  const minCode = whole(f.minCode ?? "", 0, TOTALISTIC_LAST_CODE);
  const maxCode = whole(f.maxCode ?? "", 0, TOTALISTIC_LAST_CODE);
  if (minCode === null) errors.minCode = `A whole number from 0 to ${TOTALISTIC_LAST_CODE}.`;
  if (maxCode === null) errors.maxCode = `A whole number from 0 to ${TOTALISTIC_LAST_CODE}.`;
  else if (minCode !== null && maxCode < minCode) errors.maxCode = "At least the first code.";
  const blocks = { "1": [1], "2": [2], "1,2": [1, 2] }[f.blocks ?? ""];
  if (!blocks) errors.blocks = "Choose block 1, block 2 or both.";
  return Object.keys(errors).length ? { params: null, errors } : { params: { minCode, maxCode, blocks }, errors };
}

function largeChainParams(f: JobFields): JobParamsResult {
  const errors: Record<string, string> = {};
  const groups = whole(f.groups ?? "", 1, LARGE_CHAIN_STATES);
  const members = whole(f.members ?? "", 1, LARGE_CHAIN_STATES);
  const seed = whole(f.seed ?? "", 0, 2 ** 31);
  if (groups === null) errors.groups = `A whole number from 1 to ${LARGE_CHAIN_STATES.toLocaleString("en")}.`;
  if (members === null) errors.members = `A whole number from 1 to ${LARGE_CHAIN_STATES.toLocaleString("en")}.`;
  else if (groups !== null && groups * members > LARGE_CHAIN_STATES) errors.members = `Groups × members must be at most ${LARGE_CHAIN_STATES.toLocaleString("en")} states.`;
  if (seed === null) errors.seed = "A whole number from 0 to 2147483648.";
  return Object.keys(errors).length ? { params: null, errors } : { params: { chain: { generator: "permutation-mixture", groups, members, seed } }, errors };
}

function whole(text: string, min: number, max: number): number | null {
  const n = Number(text.trim());
  return /^\d+$/.test(text.trim()) && n >= min && n <= max ? n : null;
}

function blocks(f: JobFields, max: number, errors: Record<string, string>) {
  const minBlock = whole(f.minBlock ?? "", 2, max);
  const maxBlock = whole(f.maxBlock ?? "", 2, max);
  if (minBlock === null) errors.minBlock = `A whole number from 2 to ${max}.`;
  if (maxBlock === null) errors.maxBlock = `A whole number from 2 to ${max}.`;
  else if (minBlock !== null && maxBlock < minBlock) errors.maxBlock = "At least the smallest block size.";
  return { minBlock, maxBlock };
}

/** As the job kinds' schemas: the ECA atlas takes projections to 5 and the partition sweep alone to 9 (the N = 9 table). */
function maxBlockOf(kind: FormKind, search: string): number {
  if (kind !== "eca-atlas") return 6;
  return search === "partitions" ? 9 : 5;
}

/** Steps T apart from the block size, as the search-projection job takes them: blank for T = N, else 1…2N and blocks up to 4. */
function stepsField(text: string, minBlock: number | null, maxBlock: number | null, errors: Record<string, string>): number | undefined {
  if (text.trim() === "") return undefined;
  const top = 2 * (minBlock ?? 2);
  const steps = whole(text, 1, top);
  if (steps === null) errors.steps = `Blank for T = N, or a whole number from 1 to ${top} (2N for the smallest block size).`;
  else if (maxBlock !== null && maxBlock > 4) errors.maxBlock = "At most 4 when the steps are given.";
  return steps ?? undefined;
}

/** Params for POST /api/jobs from a job form, checked as the person types (the server checks again). */
export function jobParams(kind: FormKind, f: JobFields): JobParamsResult {
  if (kind === "totalistic-atlas") return totalisticParams(f);
  if (kind === "lump-large-chain") return largeChainParams(f);
  const errors: Record<string, string> = {};
  if (kind === "lump-chain") {
    const chain = markovForm({ matrix: f.matrix ?? "", labels: f.labels ?? "" });
    if (!chain.model || chain.model.kind !== "markov") return { params: null, errors: chain.errors };
    const labels = chain.model.labels ?? [];
    const unknown = (f.apart ?? "").trim() === "" ? [] : (f.apart ?? "").split(",").map((s) => s.trim()).filter((s) => s && !labels.includes(s));
    if (unknown.length > 0) return { params: null, errors: { apart: `No state is labelled “${unknown[0]}”.` } };
    const observable = labels.map((l) => ((f.apart ?? "").split(",").map((s) => s.trim()).includes(l) ? `apart:${l}` : "rest"));
    return { params: { chain: chain.model, observable }, errors: {} };
  }
  const search = f.search ?? "projections";
  if (!["projections", "partitions", "both"].includes(search)) errors.search = "Choose projections, partitions or both.";
  const { minBlock, maxBlock } = blocks(f, maxBlockOf(kind, search), errors);
  if (kind === "search-projection") {
    const rule = whole(f.rule ?? "", 0, 255);
    if (rule === null) errors.rule = "Rule must be a whole number from 0 to 255.";
    const steps = stepsField(f.steps ?? "", minBlock, maxBlock, errors);
    return Object.keys(errors).length ? { params: null, errors } : { params: { rule, minBlock, maxBlock, search, ...(steps !== undefined ? { steps } : {}) }, errors };
  }
  return Object.keys(errors).length ? { params: null, errors } : { params: { minBlock, maxBlock, search }, errors };
}
