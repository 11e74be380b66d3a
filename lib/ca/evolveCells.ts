import type { RuleTable } from "./ruleTable";

/**
 * Plain evaluation: applies the rule `steps` times to a finite row of cells; each step drops r cells
 * at either end (their neighbourhood leaves the row). The reference every fast table is tested against.
 */
export function evolveCells(t: RuleTable, cells: ArrayLike<number>, steps: number): Uint8Array {
  let row = Uint8Array.from(cells);
  const width = 2 * t.r + 1;
  for (let s = 0; s < steps; s++) {
    const next = new Uint8Array(Math.max(0, row.length - 2 * t.r));
    for (let i = 0; i < next.length; i++) {
      let index = 0;
      for (let j = 0; j < width; j++) index = index * t.k + row[i + j];
      next[i] = t.table[index];
    }
    row = next;
  }
  return row;
}

/** Digits of `value` in base k, most significant first, padded to `length`. */
export function toDigits(value: number, k: number, length: number): Uint8Array {
  const digits = new Uint8Array(length);
  for (let i = length - 1; i >= 0; i--) {
    digits[i] = value % k;
    value = Math.floor(value / k);
  }
  return digits;
}

export function fromDigits(digits: ArrayLike<number>, k: number, start = 0, end = digits.length): number {
  let value = 0;
  for (let i = start; i < end; i++) value = value * k + digits[i];
  return value;
}
