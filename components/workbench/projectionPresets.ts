/** The N cells of block state s over a k-letter alphabet, c_0 leftmost and most significant (DOMAIN §1). */
export function blockCells(s: number, k: number, N: number): number[] {
  const cells = new Array<number>(N);
  for (let i = N - 1; i >= 0; i--) {
    cells[i] = s % k;
    s = Math.floor(s / k);
  }
  return cells;
}

export type PresetName = "keep" | "majority" | "parity" | "all-ones" | "any-one";

export const PRESETS: { name: PresetName; label: string; description: string }[] = [
  { name: "keep", label: "Keep one cell", description: "the coarse symbol is the chosen cell of the block" },
  { name: "majority", label: "Majority", description: "1 when more than half the cells are 1 (a tie gives 0)" },
  { name: "parity", label: "Parity", description: "1 when an odd number of cells are 1" },
  { name: "all-ones", label: "All ones", description: "1 only for the block of all 1s" },
  { name: "any-one", label: "Any one", description: "1 when at least one cell is 1" },
];

/** A binary projection of blocks of N binary cells: proj[s] for every block state s. */
export function presetProjection(name: PresetName, N: number, keepCell = 0): number[] {
  return Array.from({ length: 2 ** N }, (_, s) => {
    const cells = blockCells(s, 2, N);
    const ones = cells.filter((c) => c === 1).length;
    switch (name) {
      case "keep":
        return cells[Math.min(Math.max(keepCell, 0), N - 1)];
      case "majority":
        return 2 * ones > N ? 1 : 0;
      case "parity":
        return ones % 2;
      case "all-ones":
        return ones === N ? 1 : 0;
      case "any-one":
        return ones > 0 ? 1 : 0;
    }
  });
}

/** Why a projection cannot be sent, or null: one entry per block state, every symbol 0..m-1 used (DOMAIN §1). */
export function projectionIssue(projection: number[], states: number): string | null {
  if (projection.length !== states) return `Give a coarse symbol for each of the ${states} block states.`;
  const m = Math.max(...projection) + 1;
  const unused = Array.from({ length: m }, (_, v) => v).filter((v) => !projection.includes(v));
  if (m < 2) return "Every block maps to the same symbol: use at least two coarse symbols.";
  if (unused.length > 0) return `Coarse symbol ${unused[0]} is not used by any block; every symbol must be.`;
  return null;
}
