/** Where a command writes; tests pass a capturing implementation. */
export interface CliIo {
  out(text: string): void;
  err(text: string): void;
}

export const processIo: CliIo = {
  out: (text) => process.stdout.write(text),
  err: (text) => process.stderr.write(text),
};

/** An in-memory CliIo for tests. */
export function captureIo(): CliIo & { stdout: () => string; stderr: () => string } {
  let out = "";
  let err = "";
  return {
    out: (t) => void (out += t),
    err: (t) => void (err += t),
    stdout: () => out,
    stderr: () => err,
  };
}
