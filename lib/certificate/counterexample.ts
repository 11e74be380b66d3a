import type { ProjectionCounterexample } from "@/lib/ca";
import type { ExactLumpingCounterexample, LumpingCounterexample } from "@/lib/markov";

/** Why a certificate's square does not commute, in terms a person can read and a test can re-check. */
export type Counterexample =
  | ProjectionCounterexample
  | LumpingCounterexample
  | ExactLumpingCounterexample
  /** The chain lumps, but the claimed lumped entry Q[block][targetBlock] is not the common sum. */
  | { kind: "lumped-entry-mismatch"; block: number; targetBlock: number; claimed: string; actual: string }
  /** Claimed P^k (or lumped matrix) differs from the recomputed one at (row, column), 0-based. */
  | { kind: "matrix-entry-mismatch"; row: number; column: number; claimed: string; actual: string }
  /** Claimed rule table differs from the recomputed one at a neighbourhood (its cells leftmost first). */
  | { kind: "table-entry-mismatch"; neighbourhood: number; cells: string; claimed: number; actual: number }
  /** A target chain's state carries another label than FORMAT.md requires (the source's, or the block's). */
  | { kind: "label-mismatch"; state: number; claimed: string; expected: string }
  /** The claimed target is not even of the right kind or shape (alphabet, radius, number of states). */
  | { kind: "target-mismatch"; message: string; expected: string; claimed: string };
