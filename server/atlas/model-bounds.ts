import type { Model } from "@/lib/models";
import { chainSize } from "@/lib/models";
import type { Limits } from "@/lib/verify";

/**
 * The first of the checker's limits a model exceeds, or null: a model the atlas stores must be one
 * it could verify a map of (one bound everywhere). Sizes only; runs before anything is built.
 */
export function modelExceeds(model: Model, limits: Limits): { bound: keyof Limits; limit: number; asked: number } | null {
  const over = (bound: keyof Limits, asked: number) => {
    const limit = limits[bound] ?? Number.POSITIVE_INFINITY;
    return asked > limit ? { bound, limit, asked } : null;
  };
  switch (model.kind) {
    case "markov":
      return over("maxStates", chainSize(model));
    case "eca":
      return null;
    case "ca":
      return over("maxAlphabet", model.k) ?? over("maxWindows", model.k ** (2 * model.r + 1));
    case "decimated":
      return over("maxSteps", model.steps) ?? modelExceeds(model.base, limits);
    case "iterate":
      return over("maxSteps", model.steps) ?? modelExceeds(model.base, limits);
    case "supercell":
      return over("maxBlock", model.block) ?? over("maxSteps", model.steps) ?? modelExceeds(model.base, limits);
  }
}
