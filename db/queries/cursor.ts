import { AppError } from "@/server/errors";

/**
 * Opaque page cursors: the sort key of the last row, as base64url JSON. A client passes back the
 * string it was given; anything else is a 400 naming the `cursor` field.
 */
export function encodeCursor(key: readonly (string | number)[]): string {
  return Buffer.from(JSON.stringify(key)).toString("base64url");
}

export function decodeCursor(cursor: string, arity: number): (string | number)[] {
  try {
    const key: unknown = JSON.parse(Buffer.from(cursor, "base64url").toString("utf8"));
    if (
      Array.isArray(key) &&
      key.length === arity &&
      key.every((k) => typeof k === "string" || typeof k === "number")
    ) {
      return key;
    }
  } catch {
    // fall through to the error below
  }
  throw new AppError("bad_input", "The cursor is not one this server gave out.", { field: "cursor" });
}
