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

/**
 * How a command names the core's input fields to its user: field → the flag (or file) that carried it,
 * so that "block: …" from lib/ reads "--block: …" on the command line.
 */
export type FieldFlags = Record<string, string>;

function named(field: string, message: string, flags: FieldFlags): string {
  const last = field.split(".").pop() ?? field;
  const flag = flags[field] ?? flags[last];
  return flag ? `${flag}: ${message}` : `${field}: ${message}`;
}

/** Errors that carry a field or a list of issues (core input errors) become one readable line. */
export function describeError(e: unknown, flags: FieldFlags = {}): string {
  if (!(e instanceof Error)) return String(e);
  const issues = (e as { issues?: { path: string; message: string }[] }).issues;
  if (Array.isArray(issues)) return issues.map((i) => (i.path ? named(String(i.path), i.message, flags) : i.message)).join("; ");
  const field = (e as { field?: unknown }).field;
  const prefix = typeof field === "string" ? `${field}: ` : null;
  if (prefix && e.message.startsWith(prefix)) return named(field as string, e.message.slice(prefix.length), flags);
  return e.message;
}
