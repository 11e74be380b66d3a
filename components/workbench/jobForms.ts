import { markovForm } from "./modelForms";

/** The fields a job form shows, as typed (strings), and the params they give or the field at fault. */
export type JobFields = Record<string, string>;
export type JobParamsResult = { params: Record<string, unknown> | null; errors: Record<string, string> };

export const FORM_KINDS = ["search-projection", "eca-atlas", "lump-chain"] as const;
export type FormKind = (typeof FORM_KINDS)[number];

export const DEFAULT_FIELDS: Record<FormKind, JobFields> = {
  "search-projection": { rule: "110", minBlock: "2", maxBlock: "3", search: "projections" },
  "eca-atlas": { minBlock: "2", maxBlock: "3", search: "projections" },
  "lump-chain": { matrix: "", labels: "", apart: "" },
};

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

/** Params for POST /api/jobs from a job form, checked as the person types (the server checks again). */
export function jobParams(kind: FormKind, f: JobFields): JobParamsResult {
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
  const { minBlock, maxBlock } = blocks(f, kind === "eca-atlas" ? 5 : 6, errors);
  if (kind === "search-projection") {
    const rule = whole(f.rule ?? "", 0, 255);
    if (rule === null) errors.rule = "Rule must be a whole number from 0 to 255.";
    return Object.keys(errors).length ? { params: null, errors } : { params: { rule, minBlock, maxBlock, search }, errors };
  }
  return Object.keys(errors).length ? { params: null, errors } : { params: { minBlock, maxBlock, search }, errors };
}
