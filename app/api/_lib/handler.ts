import "server-only";
import type { z } from "zod";
import { AppError, toResponse } from "@/server/errors";
import { MAX_BODY_BYTES } from "./handler-limits";
import { requireSameOriginWrite } from "./same-origin";

export { MAX_BODY_BYTES };

type RouteContext<P> = { params: Promise<P> };

/**
 * Wraps a route handler so that anything it throws becomes the JSON error of the one error
 * table: an `AppError` keeps its status; anything else is logged and answered with a 500.
 */
export function route<P = Record<string, never>>(
  handle: (request: Request, context: RouteContext<P>) => Promise<Response>,
): (request: Request, context: RouteContext<P>) => Promise<Response> {
  return async (request, context) => {
    try {
      return await handle(request, context);
    } catch (err) {
      return toResponse(err);
    }
  };
}

function fieldOf(path: readonly PropertyKey[], where: string): string {
  return path.length === 0 ? where : path.map(String).join(".");
}

/** A zod failure as a 400 that names the first field at fault and lists every issue. */
export function badInput(error: z.ZodError, where: string): AppError {
  const issues = error.issues.map((i) => ({ field: fieldOf(i.path, where), message: i.message }));
  const first = issues[0];
  return new AppError("bad_input", `${first.field}: ${first.message}`, { field: first.field, details: { issues } });
}

/**
 * Reads and validates a JSON body: 413 when too large, 400 for bad JSON or fields. A body without a
 * Bearer token may ride on the session cookie, so it must first pass the same-origin JSON guard.
 */
export async function parseBody<S extends z.ZodType>(request: Request, schema: S): Promise<z.output<S>> {
  if (!request.headers.has("authorization")) requireSameOriginWrite(request);
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > MAX_BODY_BYTES) throw tooLarge(declared);
  const bytes = new Uint8Array(await request.arrayBuffer());
  if (bytes.byteLength > MAX_BODY_BYTES) throw tooLarge(bytes.byteLength);
  let text: string;
  try {
    // JSON text is UTF-8 (RFC 8259 §8.1); a byte sequence that is not must not be silently replaced.
    text = UTF8.decode(bytes);
  } catch {
    throw new AppError("bad_input", "The request body is not valid UTF-8.", { field: "body" });
  }
  let json: unknown;
  try {
    json = text.length === 0 ? {} : JSON.parse(text);
  } catch {
    throw new AppError("bad_input", "The request body is not valid JSON.", { field: "body" });
  }
  const parsed = schema.safeParse(json);
  if (!parsed.success) throw badInput(parsed.error, "body");
  return parsed.data;
}

const UTF8 = new TextDecoder("utf-8", { fatal: true });

function tooLarge(size: number): AppError {
  return new AppError("too_large", `The request body has ${size} bytes; the limit is ${MAX_BODY_BYTES}.`, {
    field: "body",
    details: { bound: "body bytes", limit: MAX_BODY_BYTES, asked: size },
  });
}

/** Validates the query string (each key once; repeated keys keep the last value). */
export function parseQuery<S extends z.ZodType>(request: Request, schema: S): z.output<S> {
  const params = Object.fromEntries(new URL(request.url).searchParams);
  const parsed = schema.safeParse(params);
  if (!parsed.success) throw badInput(parsed.error, "query");
  return parsed.data;
}

/** Validates path parameters (Next passes them as a promise). */
export async function parseParams<S extends z.ZodType>(params: Promise<unknown>, schema: S): Promise<z.output<S>> {
  const parsed = schema.safeParse(await params);
  if (!parsed.success) throw badInput(parsed.error, "path");
  return parsed.data;
}
