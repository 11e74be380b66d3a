/** An RGB colour, 0–255 per channel. */
export type Rgb = readonly [number, number, number];

const hex = (h: string): Rgb => [parseInt(h.slice(1, 3), 16), parseInt(h.slice(3, 5), 16), parseInt(h.slice(5, 7), 16)];

// The house palette (app/globals.css): paper for the quiescent state, tide for "on", saffron between.
const PAPER = hex("#fffdf8");
const SAFFRON = hex("#e0a93a");
const TIDE = hex("#16544f");
const TIDE_DARK = hex("#0c2e2b");
/** The colour of a differing cell in the difference panel (house brick). */
export const DIFFERENCE: Rgb = hex("#cc5a46");
export const EMPTY: Rgb = hex("#f6f4ee");

function mix(a: Rgb, b: Rgb, t: number): Rgb {
  return [Math.round(a[0] + (b[0] - a[0]) * t), Math.round(a[1] + (b[1] - a[1]) * t), Math.round(a[2] + (b[2] - a[2]) * t)];
}

/**
 * One colour per symbol 0..k−1: symbol 0 is paper, the last symbol dark tide, the ones between
 * pass through saffron so that neighbouring symbols stay apart.
 */
export function cellPalette(k: number): Rgb[] {
  if (k === 2) return [PAPER, TIDE];
  const out: Rgb[] = [];
  for (let s = 0; s < k; s++) {
    const t = s / (k - 1);
    out.push(t <= 0.5 ? mix(PAPER, SAFFRON, t * 2) : mix(SAFFRON, TIDE_DARK, (t - 0.5) * 2));
  }
  return out;
}

export const cssColour = (c: Rgb) => `rgb(${c[0]} ${c[1]} ${c[2]})`;
