import { CaInputError, parseRow, randomRow, singleCellRow } from "@/lib/ca";

export type StartKind = "random" | "single" | "typed";

/** What a person typed into the diagram's controls, as strings. */
export type DiagramForm = { width: string; steps: string; start: StartKind; seed: string; typed: string };

export type DiagramFields = "width" | "steps" | "seed" | "typed";

export type DiagramRequest =
  | { ok: true; initial: Uint8Array; steps: number }
  | { ok: false; errors: Partial<Record<DiagramFields, string>> };

export const MAX_WIDTH = 1000;
export const MAX_STEPS = 1000;

function wholeNumber(text: string, min: number, max: number, what: string): number | string {
  const n = Number(text.trim());
  if (!/^\d+$/.test(text.trim()) || n < min || n > max) return `${what} is a whole number from ${min} to ${max}`;
  return n;
}

/** Reads the controls into an initial row and a number of steps, or an error per field. */
export function readDiagramForm(form: DiagramForm, k: number): DiagramRequest {
  const errors: Partial<Record<DiagramFields, string>> = {};
  const steps = wholeNumber(form.steps, 1, MAX_STEPS, "The number of steps");
  if (typeof steps === "string") errors.steps = steps;
  let initial: Uint8Array | null = null;
  if (form.start === "typed") {
    try {
      initial = parseRow(form.typed, k);
      if (initial.length > MAX_WIDTH) errors.typed = `at most ${MAX_WIDTH} cells`;
    } catch (e) {
      errors.typed = e instanceof CaInputError ? e.message.replace(/^initial: /, "") : String(e);
    }
  } else {
    const width = wholeNumber(form.width, 3, MAX_WIDTH, "The width");
    if (typeof width === "string") errors.width = width;
    else if (form.start === "single") initial = singleCellRow(width);
    else {
      const seed = wholeNumber(form.seed, 0, 0xffffffff, "The seed");
      if (typeof seed === "string") errors.seed = seed;
      else initial = randomRow({ k, width, seed });
    }
  }
  if (Object.keys(errors).length > 0 || !initial || typeof steps === "string") return { ok: false, errors };
  return { ok: true, initial, steps };
}
