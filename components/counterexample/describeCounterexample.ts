/**
 * Counterexamples as the checker returns them (lib/certificate Counterexample), read defensively: they
 * arrive as JSON from the API, a job result or a stored draft. One sentence each, for every page and
 * for screen readers; counterexample-view draws the same facts.
 */
export type Witness = { window: number[]; cells: string[]; image: number; imageCells: string; coarseWindow: number[]; coarse: number };

export type KnownCounterexample =
  | ({ kind: "coarse-rule-mismatch"; claimed: number } & Witness)
  | { kind: "not-a-function"; first: Witness; second: Witness }
  | { kind: "not-lumpable"; block: number; states: [number, number]; targetBlock: number; sums: [string, string] }
  | { kind: "not-exactly-lumpable"; block: number; targetBlock: number; states: [number, number]; sums: [string, string] }
  | { kind: "label-mismatch"; state: number; claimed: string; expected: string }
  | { kind: "lumped-entry-mismatch"; block: number; targetBlock: number; claimed: string; actual: string }
  | { kind: "matrix-entry-mismatch"; row: number; column: number; claimed: string; actual: string }
  | { kind: "table-entry-mismatch"; neighbourhood: number; cells: string; claimed: number; actual: number }
  | { kind: "target-mismatch"; message: string; expected: string; claimed: string };

const KINDS = new Set(["coarse-rule-mismatch", "not-a-function", "not-lumpable", "not-exactly-lumpable", "label-mismatch", "lumped-entry-mismatch", "matrix-entry-mismatch", "table-entry-mismatch", "target-mismatch"]);

export function asCounterexample(value: unknown): KnownCounterexample | null {
  if (!value || typeof value !== "object") return null;
  const kind = (value as { kind?: unknown }).kind;
  return typeof kind === "string" && KINDS.has(kind) ? (value as KnownCounterexample) : null;
}

const blocks = (w: Witness) => w.cells.join("|");
const coarse = (w: Witness) => w.coarseWindow.join(" ");

/** States are named by label when the chain has labels, else by 1-based number. */
function stateName(i: number, labels?: string[]): string {
  return labels?.[i] !== undefined ? `“${labels[i]}”` : `state ${i + 1}`;
}

export function describeCounterexample(c: KnownCounterexample, options: { steps?: number; labels?: string[] } = {}): string {
  const after = options.steps ? `after ${options.steps} step${options.steps > 1 ? "s" : ""}` : "after the fine steps";
  switch (c.kind) {
    case "not-a-function":
      return (
        `The fine windows ${blocks(c.first)} and ${blocks(c.second)} project to the same coarse neighbourhood (${coarse(c.first)}), ` +
        `but ${after} their centre blocks are ${c.first.imageCells} and ${c.second.imageCells}, which project to ${c.first.coarse} and ${c.second.coarse}: ` +
        `no coarse rule can give both, so the square does not commute.`
      );
    case "coarse-rule-mismatch":
      return (
        `The fine window ${blocks(c)} has centre block ${c.imageCells} ${after}, which projects to ${c.coarse}; ` +
        `the coarse rule applied to the projected window (${coarse(c)}) gives ${c.claimed}.`
      );
    case "not-lumpable":
      return (
        `${cap(stateName(c.states[0], options.labels))} and ${stateName(c.states[1], options.labels)} are both in block ${c.block + 1}, ` +
        `but they move into block ${c.targetBlock + 1} with probability ${c.sums[0]} and ${c.sums[1]}: the partition is not lumpable.`
      );
    case "not-exactly-lumpable":
      return (
        `${cap(stateName(c.states[0], options.labels))} and ${stateName(c.states[1], options.labels)} are both in block ${c.targetBlock + 1}, ` +
        `but block ${c.block + 1} sends them probability ${c.sums[0]} and ${c.sums[1]}: the partition is not exactly lumpable.`
      );
    case "label-mismatch":
      return `State ${c.state + 1} of the target chain is labelled “${c.claimed}”, but the map requires “${c.expected}”.`;
    case "lumped-entry-mismatch":
      return `The lumped entry from block ${c.block + 1} to block ${c.targetBlock + 1} is claimed to be ${c.claimed}; the common row sum is ${c.actual}.`;
    case "matrix-entry-mismatch":
      return `Entry (${c.row + 1}, ${c.column + 1}) is claimed to be ${c.claimed}; computed exactly it is ${c.actual}.`;
    case "table-entry-mismatch":
      return `For the neighbourhood ${c.cells} the claimed rule gives ${c.claimed}; recomputed it gives ${c.actual}.`;
    case "target-mismatch":
      return `${cap(c.message)}: expected ${c.expected}, found ${c.claimed}.`;
  }
}

function cap(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}
