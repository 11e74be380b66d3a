import { ONE, ZERO, add, equals, formatRational, mul, type Rational } from "@/lib/rational";

/** A square matrix of exact rationals, row-major. */
export type Matrix = Rational[][];

export class MatrixInputError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(`${field}: ${message}`);
    this.name = "MatrixInputError";
  }
}

/** The plain product A·B over reduced rationals; the reference the fast matrixPower is tested against. */
export function matrixProduct(a: Matrix, b: Matrix): Matrix {
  return a.map((row) =>
    b[0].map((_, j) => {
      let sum = ZERO;
      for (let l = 0; l < row.length; l++) if (row[l].num !== 0n && b[l][j].num !== 0n) sum = add(sum, mul(row[l], b[l][j]));
      return sum;
    }),
  );
}

export function identityMatrix(n: number): Matrix {
  return Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? ONE : ZERO)));
}

export function matricesEqual(a: Matrix, b: Matrix): boolean {
  return a.length === b.length && a.every((row, i) => row.length === b[i].length && row.every((x, j) => equals(x, b[i][j])));
}

export function formatMatrix(m: Matrix): string[][] {
  return m.map((row) => row.map(formatRational));
}
