import type { Issue } from "@/lib/models";
import type { Bound } from "./limits";

/** A verdict given before any arithmetic: the input is not a certificate, or its check would exceed a bound. */
export type Refusal = { status: "malformed"; issues: Issue[] } | { status: "too-large"; bound: Bound; limit: number; asked: number };

export const malformed = (path: string, message: string): Refusal => ({ status: "malformed", issues: [{ path, message }] });

export const tooLarge = (bound: Bound, limit: number, asked: number): Refusal => ({
  status: "too-large",
  bound,
  limit,
  asked: Number.isFinite(asked) ? asked : Number.MAX_VALUE,
});
