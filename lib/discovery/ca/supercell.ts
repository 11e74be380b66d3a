/**
 * Fast supercell tables for the search (the checker computes its own). The supercell of a radius-1 CA with block N
 * and T = N steps is a radius-1 CA on k^N block states (DOMAIN.md §2); its table is indexed by
 * window = (left · n + centre) · n + right with n = k^N.
 */

/**
 * Search-side view of a CA on n states with radius R (1 for T ≤ N with a radius-1 source): out[w] for the window
 * w = X_{-R} … X_R read as a base-n number, X_{-R} most significant; for R = 1, out[(a·n + b)·n + c].
 */
export interface Supercell {
  readonly n: number;
  readonly radius: number;
  readonly out: Uint8Array | Uint16Array | Uint32Array;
}

/** An output table for n states over `size` windows, in the narrowest integer type that holds a state. */
export function tableArray(n: number, size: number = n * n * n): Uint8Array | Uint16Array | Uint32Array {
  if (n <= 256) return new Uint8Array(size);
  if (n <= 65536) return new Uint16Array(size);
  return new Uint32Array(size);
}

/** One step of an ECA on a word of `width` cells, all at once with bitwise operations; returns width − 2 cells. */
function ecaStepWord(rule: number, x: number, width: number): number {
  const l = x >>> 2;
  const c = x >>> 1;
  const r = x;
  let out = 0;
  for (let m = 0; m < 8; m++) {
    if ((rule >> m) & 1) out |= (m & 4 ? l : ~l) & (m & 2 ? c : ~c) & (m & 1 ? r : ~r);
  }
  return out & ((1 << (width - 2)) - 1);
}

/**
 * Supercell table of ECA `rule` at block N (T = N). Each output cell depends on a light cone of 2N + 1 cells,
 * so one table of f^N on 2N + 1 cells gives every output cell by a lookup.
 */
export function ecaSupercell(rule: number, block: number): Supercell {
  const N = block;
  if (!Number.isInteger(N) || N < 1 || N > 9) throw new RangeError(`block must be an integer from 1 to 9, got ${block}`);
  const coneWidth = 2 * N + 1;
  const cone = new Uint8Array(1 << coneWidth);
  for (let x = 0; x < cone.length; x++) {
    let w = x;
    for (let s = 0, width = coneWidth; s < N; s++, width -= 2) w = ecaStepWord(rule, w, width);
    cone[x] = w & 1;
  }
  const n = 1 << N;
  const out = tableArray(n);
  const coneMask = (1 << coneWidth) - 1;
  const windows = n * n * n;
  for (let w = 0; w < windows; w++) {
    let v = 0;
    // output cell j (0 = leftmost) sits at window cell N + j; its cone spans window cells j … j + 2N
    for (let j = 0; j < N; j++) v = (v << 1) | cone[(w >>> (N - 1 - j)) & coneMask];
    out[w] = v;
  }
  return { n, radius: 1, out };
}

/** Supercell table of a general radius-1 CA on k symbols (table indexed as in DOMAIN.md §1), block N, T = N. */
export function generalSupercell(k: number, table: ArrayLike<number>, block: number): Supercell {
  const N = block;
  const n = k ** N;
  if (n > 1 << 12) throw new RangeError(`k^N = ${n} block states is beyond the search's table size`);
  const out = tableArray(n);
  const cells = new Int32Array(3 * N);
  for (let w = 0; w < n * n * n; w++) {
    let rest = w;
    for (let i = 3 * N - 1; i >= 0; i--) {
      cells[i] = rest % k;
      rest = Math.floor(rest / k);
    }
    let width = 3 * N;
    for (let s = 0; s < N; s++) {
      for (let i = 0; i + 2 < width; i++) cells[i] = table[(cells[i] * k + cells[i + 1]) * k + cells[i + 2]];
      width -= 2;
    }
    let v = 0;
    for (let i = 0; i < N; i++) v = v * k + cells[i];
    out[w] = v;
  }
  return { n, radius: 1, out };
}
