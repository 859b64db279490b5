/**
 * Errors as HTTP answers: every failure reaches a client as
 * {"error": {code, message, details}} with the status its code has in the
 * vocabulary (lib/errors.ts), which is re-exported here for route handlers.
 */
import { AppError } from "../errors";

export * from "../errors";

/** The JSON body of an error response. */
export function errorBody(e: AppError) {
  return { error: { code: e.code, message: e.message, details: e.details ?? null } };
}

/** An error response; unknown errors become a 500 without internals. */
export function errorResponse(e: unknown): Response {
  const err =
    e instanceof AppError ? e : new AppError("internal", "Something went wrong on the server; try again, and report it if it persists.");
  if (!(e instanceof AppError)) console.error(e);
  const headers: Record<string, string> = { "content-type": "application/json", "cache-control": "no-store" };
  if (err.retryAfter !== undefined) headers["retry-after"] = String(Math.max(1, Math.ceil(err.retryAfter)));
  return new Response(JSON.stringify(errorBody(err)), { status: err.status, headers });
}
