/**
 * Ohmstead's error vocabulary. Every entry point maps these to one HTTP status and a
 * message a user can act on; anything else is logged and reported as a plain 500.
 */
export type ErrorCode = "validation" | "unauthenticated" | "forbidden" | "not_found" | "conflict" | "rate_limited" | "unavailable";

export class AppError extends Error {
  constructor(
    public readonly code: ErrorCode,
    public readonly status: number,
    message: string,
    public readonly fields?: Record<string, string>,
  ) {
    super(message);
    this.name = "AppError";
  }
}

export const validationError = (fields: Record<string, string>, message = "Some fields need attention") =>
  new AppError("validation", 400, message, fields);
export const unauthenticated = (message = "Sign in to continue") => new AppError("unauthenticated", 401, message);
export const forbidden = (message = "Your role does not allow this") => new AppError("forbidden", 403, message);
/** Also used for another organisation's rows: they do not exist for this user. */
export const notFound = (what = "Not found") => new AppError("not_found", 404, what);
export const conflict = (message: string) => new AppError("conflict", 409, message);
export const rateLimited = (message: string) => new AppError("rate_limited", 429, message);
export const unavailable = (message = "The database is not reachable; try again shortly") => new AppError("unavailable", 503, message);

/** True for errors that mean the database cannot be reached (not query mistakes). */
export function isDatabaseDown(err: unknown): boolean {
  const seen = new Set<unknown>();
  let e: unknown = err;
  while (e && typeof e === "object" && !seen.has(e)) {
    seen.add(e);
    const code = (e as { code?: unknown }).code;
    if (typeof code === "string" && ["ECONNREFUSED", "ECONNRESET", "ETIMEDOUT", "PROTOCOL_CONNECTION_LOST", "ER_CON_COUNT_ERROR", "EPIPE", "ENOTFOUND", "ER_ACCESS_DENIED_ERROR"].includes(code))
      return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}

/** Duplicate-key violation from MariaDB (errno 1062), possibly wrapped by Drizzle. */
export function isDuplicateKey(err: unknown): boolean {
  let e: unknown = err;
  for (let i = 0; i < 5 && e && typeof e === "object"; i++) {
    if ((e as { errno?: number }).errno === 1062 || (e as { code?: string }).code === "ER_DUP_ENTRY") return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}

/** Maps any thrown value to the vocabulary; internals are logged, never sent. */
export function toAppError(err: unknown): AppError {
  if (err instanceof AppError) return err;
  if (isDatabaseDown(err)) return unavailable();
  console.error("[ohmstead] unexpected error:", err);
  return new AppError("unavailable", 500, "Something went wrong on our side; the error was logged");
}

export interface ErrorBody {
  error: { code: ErrorCode; message: string; fields?: Record<string, string> };
}

export function errorBody(e: AppError): ErrorBody {
  return { error: { code: e.code, message: e.message, ...(e.fields ? { fields: e.fields } : {}) } };
}
