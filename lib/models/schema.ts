import { z } from "zod";
import { parseRational } from "@/lib/rational";

/** A model as written by a person or a program; canonicalModel turns it into the one canonical Model. */
export type ModelInput =
  | { kind: "markov"; labels?: string[]; matrix: string[][] }
  | { kind: "eca"; rule: number }
  | { kind: "ca"; k: number; r: number; table: number[] }
  | { kind: "supercell"; base: ModelInput; block: number; steps?: number }
  | { kind: "iterate"; base: ModelInput; steps: number }
  | { kind: "decimated"; base: ModelInput; steps: number };

/** The canonical form (DOMAIN.md §1): rationals in lowest terms, labels present, an ECA never spelled as a k=2, r=1 CA. */
export type Model =
  | { kind: "markov"; labels: string[]; matrix: string[][] }
  | { kind: "eca"; rule: number }
  | { kind: "ca"; k: number; r: number; table: number[] }
  | { kind: "supercell"; base: Model; block: number; steps: number }
  | { kind: "iterate"; base: Model; steps: number }
  | { kind: "decimated"; base: Model; steps: number };

const rationalString = z
  .string()
  .max(100_000)
  .refine(
    (s) => {
      try {
        parseRational(s);
        return true;
      } catch {
        return false;
      }
    },
    { message: 'expected an exact rational such as "1/3", "2" or "0.125"' },
  );
const positive = z.number().int().min(1).max(1_000_000_000);

export const ModelSchema: z.ZodType<ModelInput> = z.lazy(() =>
  z.discriminatedUnion("kind", [
    z.strictObject({
      kind: z.literal("markov"),
      labels: z.array(z.string().min(1).max(200)).optional(),
      matrix: z.array(z.array(rationalString).min(1)).min(1),
    }),
    z.strictObject({ kind: z.literal("eca"), rule: z.number().int().min(0).max(255) }),
    z.strictObject({
      kind: z.literal("ca"),
      k: z.number().int().min(2).max(256),
      r: z.number().int().min(1).max(64),
      table: z.array(z.number().int().min(0).max(255)),
    }),
    z.strictObject({ kind: z.literal("supercell"), base: ModelSchema, block: positive, steps: positive.optional() }),
    z.strictObject({ kind: z.literal("iterate"), base: ModelSchema, steps: positive }),
    z.strictObject({ kind: z.literal("decimated"), base: ModelSchema, steps: positive }),
  ]),
);
