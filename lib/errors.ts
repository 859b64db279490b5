/**
 * The error vocabulary of the data layer, the runtime and the API. Each code has one HTTP
 * status; every failure reaches a client as {"error": {code, message, details}}.
 */
export const ERROR_STATUS = {
  invalid_input: 400,
  malformed_json: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  payload_too_large: 413,
  unsupported_media_type: 415,
  compile_errors: 422,
  compile_limit: 422,
  import_refused: 422,
  rate_limited: 429,
  internal: 500,
} as const;
export type ErrorCode = keyof typeof ERROR_STATUS;

/** A failure meant for the caller: its message says what to change. */
export class AppError extends Error {
  readonly code: ErrorCode;
  readonly details: unknown;
  /** Seconds until a retry may succeed (rate limits only). */
  readonly retryAfter?: number;
  constructor(code: ErrorCode, message: string, details: unknown = null, retryAfter?: number) {
    super(message);
    this.name = "AppError";
    this.code = code;
    this.details = details;
    this.retryAfter = retryAfter;
  }
  get status(): number {
    return ERROR_STATUS[this.code];
  }
}

export const unauthenticated = () =>
  new AppError("unauthenticated", "Sign in, or send a personal API token as `Authorization: Bearer <token>`.");
/** Records of other workspaces are reported as missing, so their existence is not revealed. */
export const notFound = (what: string) => new AppError("not_found", `No ${what} here with that identifier.`);
export const forbidden = (action: string) =>
  new AppError("forbidden", `Your role in this workspace does not allow ${action}; ask an owner.`);
export const conflict = (message: string, details: unknown = null) => new AppError("conflict", message, details);
export const invalid = (message: string, details: unknown = null) => new AppError("invalid_input", message, details);
