import { z } from "zod";
import type { ModelInput } from "@/lib/models";
import { issueText, parseMatrixText } from "./matrixText";

/** Field → message; empty when the form is valid. */
export type FieldErrors = Record<string, string>;
export type FormResult = { model: ModelInput | null; errors: FieldErrors };

/** Largest table edited cell by cell; larger tables are pasted as digits. */
export const TABLE_EDITOR_MAX = 64;
/** Largest rule table the workbench accepts (k^(2r+1) entries), well inside the checker's own bound. */
export const TABLE_MAX = 4096;

const whole = (what: string, min: number, max: number) =>
  z
    .string()
    .trim()
    .regex(/^\d+$/, `${what} must be a whole number from ${min} to ${max}.`)
    .transform(Number)
    .pipe(z.number().min(min, `${what} must be a whole number from ${min} to ${max}.`).max(max, `${what} must be a whole number from ${min} to ${max}.`));

export const RuleField = whole("Rule", 0, 255);
export const AlphabetField = whole("Alphabet size k", 2, 8);
export const RadiusField = whole("Radius r", 1, 3);
export const NameField = z.string().trim().max(200, "Keep the name under 200 characters.");
export const DescriptionField = z.string().trim().max(2000, "Keep the description under 2000 characters.");

function firstError(result: z.ZodSafeParseResult<unknown>): string | null {
  return result.success ? null : (result.error.issues[0]?.message ?? "Invalid.");
}

/** ECA by Wolfram code. */
export function ecaForm({ rule }: { rule: string }): FormResult {
  const parsed = RuleField.safeParse(rule);
  if (!parsed.success) return { model: null, errors: { rule: firstError(parsed)! } };
  return { model: { kind: "eca", rule: parsed.data }, errors: {} };
}

/** The neighbourhoods of an ECA, 111 first, each with its new centre value (bit 4a+2b+c of the rule). */
export function ecaRuleTable(rule: number): { neighbourhood: string; value: number }[] {
  return Array.from({ length: 8 }, (_, i) => {
    const index = 7 - i;
    return { neighbourhood: index.toString(2).padStart(3, "0"), value: (rule >> index) & 1 };
  });
}

/** Number of table entries of a k-state radius-r rule: k^(2r+1). */
export function tableSize(k: number, r: number): number {
  return k ** (2 * r + 1);
}

/**
 * A k-state radius-r CA: the table as digits, entry i the new centre for the neighbourhood whose
 * base-k reading (leftmost cell most significant) is i (DOMAIN §1). Separators are ignored.
 */
export function caForm({ k, r, digits }: { k: string; r: string; digits: string }): FormResult {
  const errors: FieldErrors = {};
  const kp = AlphabetField.safeParse(k);
  const rp = RadiusField.safeParse(r);
  if (!kp.success) errors.k = firstError(kp)!;
  if (!rp.success) errors.r = firstError(rp)!;
  if (!kp.success || !rp.success) return { model: null, errors };
  const size = tableSize(kp.data, rp.data);
  if (size > TABLE_MAX) return { model: null, errors: { r: `k=${kp.data}, r=${rp.data} needs ${size} table entries; the workbench takes at most ${TABLE_MAX}.` } };
  const cleaned = digits.replace(/[\s,]/g, "");
  const bad = [...cleaned].findIndex((c) => !/^[0-9]$/.test(c) || Number(c) >= kp.data);
  if (bad >= 0) return { model: null, errors: { table: `Entry ${bad + 1} is "${cleaned[bad]}"; each entry is a digit from 0 to ${kp.data - 1}.` } };
  if (cleaned.length !== size) return { model: null, errors: { table: `The table has ${cleaned.length} of ${size} entries (k^(2r+1) = ${kp.data}^${2 * rp.data + 1}).` } };
  return { model: { kind: "ca", k: kp.data, r: rp.data, table: [...cleaned].map(Number) }, errors: {} };
}

/** Labels: one per line or comma-separated; blank means s0, s1, …; they must be distinct. */
export function parseLabels(text: string, n: number): { labels: string[]; error: string | null } {
  const given = text.split(/[\n,]/).map((s) => s.trim()).filter(Boolean);
  if (given.length === 0) return { labels: Array.from({ length: n }, (_, i) => `s${i}`), error: null };
  if (given.length !== n) return { labels: [], error: `Give ${n} labels, one per state (got ${given.length}).` };
  const dup = given.find((l, i) => given.indexOf(l) !== i);
  if (dup) return { labels: [], error: `The label "${dup}" is used twice.` };
  return { labels: given, error: null };
}

/** A Markov chain from typed, pasted or uploaded matrix text, with labels. */
export function markovForm({ matrix, labels }: { matrix: string; labels: string }): FormResult {
  const parsed = parseMatrixText(matrix);
  if (!parsed.ok) return { model: null, errors: { matrix: parsed.issues.slice(0, 4).map(issueText).join(" ") } };
  const l = parseLabels(labels, parsed.matrix.length);
  if (l.error) return { model: null, errors: { labels: l.error } };
  return { model: { kind: "markov", labels: l.labels, matrix: parsed.matrix }, errors: {} };
}
