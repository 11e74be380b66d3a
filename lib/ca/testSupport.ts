/**
 * An independent evaluator for tests: ECA evolution on strings of '0'/'1', written directly from the
 * Wolfram-code definition without touching the core's tables, so counterexamples can be re-checked.
 */
export function stepString(rule: number, cells: string): string {
  let out = "";
  for (let i = 1; i + 1 < cells.length; i++) {
    const hood = Number(cells[i - 1]) * 4 + Number(cells[i]) * 2 + Number(cells[i + 1]);
    out += (rule >> hood) & 1 ? "1" : "0";
  }
  return out;
}

/** The centre block after T steps of the window given as its blocks of N cells (radius-1 rule). */
export function centreAfter(rule: number, blocks: string[], T: number): string {
  let row = blocks.join("");
  for (let s = 0; s < T; s++) row = stepString(rule, row);
  const N = blocks[0].length;
  const R = (blocks.length - 1) / 2;
  const offset = R * N - T;
  return row.slice(offset, offset + N);
}

export function parity(N: number): number[] {
  return Array.from({ length: 2 ** N }, (_, s) => s.toString(2).split("").filter((c) => c === "1").length % 2);
}

export function allOnes(N: number): number[] {
  return Array.from({ length: 2 ** N }, (_, s) => (s === 2 ** N - 1 ? 1 : 0));
}
