/** A usage or input problem: the command prints the message and exits with `code` (2 unless said otherwise). */
export class CliError extends Error {
  constructor(
    message: string,
    readonly code = 2,
  ) {
    super(message);
    this.name = "CliError";
  }
}

/** Errors that carry a field or a list of issues (core input errors) become one readable message. */
export function describeError(e: unknown): string {
  if (!(e instanceof Error)) return String(e);
  const issues = (e as { issues?: { path: string; message: string }[] }).issues;
  if (Array.isArray(issues)) return issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join("\n");
  return e.message;
}
