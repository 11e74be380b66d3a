/**
 * What a finished (or stopped) search covered, so that a negative result ("no proper coarse-graining up to
 * block N") can be stored, cited and re-run.
 */
import type { Stopped } from "./stopper";

/** Bumped whenever a search could answer differently for the same question. */
export const DISCOVERY_VERSION = "discovery-1";

export const ALGORITHMS = {
  projections: "binary projections: DPLL over projection values with the coarse rule's bits as variables, unit propagation, exact component counting; ECA symmetry transport",
  partitions: "congruences: union–find congruence closure of every principal pair Cg(x, y) with memo of total pairs, greedy extension to a maximal congruence; ECA symmetry transport",
  lumping: "coarsest strong lumping: splitter-based partition refinement (Derisavi, Hermanns & Sanders 2003; Valmari & Franceschinis 2010) with exact rational sums",
  "exact-lumping": "coarsest exact lumping (Buchholz 1994): the same splitter refinement on the transposed chain, every initial block a splitter, exact sums",
} as const;

export type SearchKind = keyof typeof ALGORITHMS;

export interface Coverage {
  kind: SearchKind;
  /** ECA rule numbers covered (null for a general rule table or a chain) */
  rules: number[] | null;
  /** block sizes fully covered */
  blocks: number[];
  algorithm: string;
  version: string;
  complete: boolean;
  stopped: Stopped;
  /** the item being searched when the search stopped */
  stoppedAt: string | null;
}

export function coverageRecord(kind: SearchKind, rules: number[] | null, blocks: number[], stopped: Stopped, stoppedAt: string | null): Coverage {
  return { kind, rules, blocks, algorithm: ALGORITHMS[kind], version: DISCOVERY_VERSION, complete: stopped === null, stopped, stoppedAt };
}
