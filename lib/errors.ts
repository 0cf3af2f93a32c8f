// Typed errors that map to an HTTP status and a message safe to show.
export type ErrorCode =
  | "unauthenticated"
  | "forbidden"
  | "not_found"
  | "invalid_input"
  | "conflict"
  | "rate_limited"
  | "unprocessable"
  | "internal";

const STATUS: Record<ErrorCode, number> = {
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  invalid_input: 422,
  conflict: 409,
  rate_limited: 429,
  unprocessable: 422,
  internal: 500,
};

export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
    this.name = "AppError";
  }
  get status(): number {
    return STATUS[this.code];
  }
}

export const notFound = (what = "That record") => new AppError("not_found", `${what} was not found.`);
export const forbidden = (message = "Your role does not allow this.") => new AppError("forbidden", message);
export const unauthenticated = () => new AppError("unauthenticated", "Sign in to continue.");
export const staleVersion = () =>
  new AppError("conflict", "This application changed while you were working on it. Reload to see the latest and try again.");

export interface ErrorBody {
  error: { code: ErrorCode; message: string; fields?: Record<string, string> };
}

export function toErrorBody(e: AppError): ErrorBody {
  return { error: { code: e.code, message: e.message, ...(e.fields ? { fields: e.fields } : {}) } };
}
