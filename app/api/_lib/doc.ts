import type { RouteConfig } from "@asteasolutions/zod-to-openapi";
import type { z } from "zod";
import { ERROR_STATUS, type ErrorCode } from "@/server/errors";
import { ErrorBody } from "./schemas";

export type { RouteConfig };

const ERROR_TEXT: Partial<Record<ErrorCode, string>> = {
  bad_input: "Bad JSON, query or field; `error.field` names it.",
  unauthenticated: "No session and no valid `Authorization: Bearer <token>`.",
  forbidden: "Your role (or your token's) does not allow this.",
  not_found: "No such record in this workspace.",
  conflict: "The record is not in a state that allows this.",
  too_large: "The request or its check exceeds the configured limits.",
  does_not_commute: "The check ran and the square does not commute; `error.details` holds the counterexample.",
  too_many_jobs: "Too many jobs running.",
  too_many_requests: "Too many attempts; `Retry-After` says when to try again.",
  unsupported_media_type: "A cookie-authenticated write must send its body as `application/json`.",
};

export function jsonBody(schema: z.ZodType, description: string) {
  return { description, content: { "application/json": { schema } } };
}

/** The error responses a route can give, from the one error table. */
export function errorResponses(...codes: ErrorCode[]) {
  return Object.fromEntries(codes.map((code) => [ERROR_STATUS[code], jsonBody(ErrorBody, ERROR_TEXT[code] ?? code)]));
}

/** Every authenticated route: session cookie or personal token. */
export const SECURITY: Record<string, string[]>[] = [{ bearer: [] }, { session: [] }];
