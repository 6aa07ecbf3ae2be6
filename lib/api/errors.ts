import { ZodError } from "zod";

/** The codes Rootbank's API answers with, and the HTTP status of each. */
export const ERROR_STATUS = {
  bad_request: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  method_not_allowed: 405,
  conflict: 409,
  gone: 410,
  payload_too_large: 413,
  invalid: 422,
  rate_limited: 429,
  internal: 500,
  unavailable: 503,
} as const;

export type ErrorCode = keyof typeof ERROR_STATUS;

export interface ErrorBody {
  error: { code: ErrorCode; message: string; fields?: Record<string, string> };
}

export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly fields?: Record<string, string>,
    readonly headers?: Record<string, string>,
  ) {
    super(message);
    this.name = "AppError";
  }

  get status(): number {
    return ERROR_STATUS[this.code];
  }
}

interface PgError {
  code: string;
  constraint?: string;
  detail?: string;
  column?: string;
}

function isPgError(err: unknown): err is PgError {
  return typeof err === "object" && err !== null && typeof (err as { code?: unknown }).code === "string" &&
    /^[0-9A-Z]{5}$/.test((err as { code: string }).code);
}

/** The `fields` map of a zod error: dotted path to the first message for that path. */
export function zodFields(err: ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of err.issues) {
    const key = issue.path.length ? issue.path.join(".") : "_";
    fields[key] ??= issue.message;
  }
  return fields;
}

/** Turns anything thrown into the one error shape. Unknown errors become a 500 that reveals nothing. */
export function toAppError(err: unknown): AppError {
  if (err instanceof AppError) return err;
  if (err instanceof ZodError) return new AppError("invalid", "Some values are not valid.", zodFields(err));
  if (err instanceof SyntaxError) return new AppError("bad_request", "The request body is not valid JSON.");
  if (isPgError(err)) {
    switch (err.code) {
      case "23505":
        return new AppError("conflict", "That already exists.", err.constraint ? { _: err.constraint } : undefined);
      case "23514":
        return new AppError("invalid", "A value is outside its physical range.", err.constraint ? { _: err.constraint } : undefined);
      case "23503":
        return new AppError("invalid", "A referenced record does not exist.");
      case "23502":
        return new AppError("invalid", "A required value is missing.", err.column ? { [err.column]: "Required" } : undefined);
      case "22P02":
      case "22007":
      case "22008":
        return new AppError("invalid", "A value has the wrong format.");
    }
  }
  return new AppError("internal", "Something went wrong on our side. It has been logged.");
}

export function handleApiError(err: unknown): Response {
  const appError = toAppError(err);
  if (appError.code === "internal") console.error(err);
  const body: ErrorBody = {
    error: { code: appError.code, message: appError.message, ...(appError.fields ? { fields: appError.fields } : {}) },
  };
  return Response.json(body, { status: appError.status, headers: appError.headers });
}
