/**
 * The one error type of the server. Every refusal a route handler, action or query can give is an
 * `AppError` with a code; the code alone decides the HTTP status, so the API answers consistently.
 */
export const ERROR_STATUS = {
  bad_input: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  too_large: 413,
  unsupported_media_type: 415,
  does_not_commute: 422,
  too_many_jobs: 429,
  too_many_requests: 429,
  database: 500,
  internal: 500,
} as const satisfies Record<string, number>;

export type ErrorCode = keyof typeof ERROR_STATUS;

export type ErrorOptions = {
  /** The input field at fault ("body.certificate.block", "query.maxDepth"). */
  field?: string;
  /** Machine-readable detail: a counterexample, a list of issues, a bound. */
  details?: unknown;
  cause?: unknown;
};

export class AppError extends Error {
  readonly code: ErrorCode;
  readonly field?: string;
  readonly details?: unknown;

  constructor(code: ErrorCode, message: string, options: ErrorOptions = {}) {
    super(message, { cause: options.cause });
    this.name = "AppError";
    this.code = code;
    this.field = options.field;
    this.details = options.details;
  }

  get status(): number {
    return ERROR_STATUS[this.code];
  }

  /** The JSON body the API answers with; internal failures never show their cause. */
  toJSON(): { error: { code: ErrorCode; message: string; field?: string; details?: unknown } } {
    const error: { code: ErrorCode; message: string; field?: string; details?: unknown } = {
      code: this.code,
      message: this.message,
    };
    if (this.field !== undefined) error.field = this.field;
    if (this.details !== undefined) error.details = this.details;
    return { error };
  }

  toResponse(): Response {
    return Response.json(this.toJSON(), { status: this.status });
  }
}

export function isAppError(value: unknown): value is AppError {
  return value instanceof AppError;
}

/**
 * Turns anything thrown into an `AppError`: app errors pass through; anything else is logged with
 * its cause and answered with a generic message (a stack trace never reaches a client).
 */
export function toAppError(err: unknown): AppError {
  if (isAppError(err)) return err;
  console.error("unexpected server error:", err);
  return new AppError("internal", "Something went wrong on the server; the request changed nothing.", { cause: err });
}

export function toResponse(err: unknown): Response {
  return toAppError(err).toResponse();
}
