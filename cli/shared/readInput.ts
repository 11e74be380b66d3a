import { readFile } from "node:fs/promises";
import { parseCsvMatrix, parseMatrixMarket, type Matrix, type ParseMatrixOptions } from "@/lib/markov";
import { CliError, describeError } from "./cliError";

const MAX_FILE_BYTES = 64 * 1024 * 1024;

export async function readTextFile(path: string): Promise<string> {
  try {
    const text = await readFile(path, "utf8");
    if (text.length > MAX_FILE_BYTES) throw new CliError(`${path}: larger than ${MAX_FILE_BYTES} bytes`);
    return text;
  } catch (e) {
    if (e instanceof CliError) throw e;
    throw new CliError(`cannot read ${path}: ${(e as NodeJS.ErrnoException).code ?? describeError(e)}`);
  }
}

export async function readJsonFile(path: string): Promise<unknown> {
  const text = await readTextFile(path);
  try {
    return JSON.parse(text);
  } catch (e) {
    throw new CliError(`${path}: not JSON: ${describeError(e)}`);
  }
}

/** A transition matrix from a Matrix Market file (".mtx", or a %%MatrixMarket header) or from CSV of rationals. */
export async function readMatrixFile(path: string, options: ParseMatrixOptions = {}): Promise<Matrix> {
  const text = await readTextFile(path);
  try {
    return path.endsWith(".mtx") || text.startsWith("%%MatrixMarket") ? parseMatrixMarket(text, options) : parseCsvMatrix(text, options);
  } catch (e) {
    throw new CliError(`${path}: ${describeError(e)}`);
  }
}
