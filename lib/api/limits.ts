/**
 * The rate limits, as one typed table. A route declares the limits it is under
 * by name (RouteSpec.limits in registry.ts); lib/api/handler.ts enforces them
 * in one place, and the next-auth sign-in route uses the same declarations.
 * No database here: the counters live in lib/api/rate-limit.ts.
 *
 * Each limit is a fixed window: at most `points` requests per `seconds`, per
 * value of the keys it names:
 * - "caller": the client's address (lib/api/rate-limit.ts#clientIp; without
 *   FANBOUND_TRUST_PROXY=1 every caller shares one);
 * - "user": the signed-in user (else the caller);
 * - "email": the e-mail address the request is about, as the route uses it
 *   (trimmed, lower-case).
 */
export type LimitKey = "caller" | "user" | "email";

export interface LimitRule {
  /** Requests allowed in one window. */
  points: number;
  /** Window length, seconds. */
  seconds: number;
  /** What the window is counted per; several keys count their combination. */
  per: readonly LimitKey[];
  /** Words for the 429 message: "Too many <what> requests". */
  what: string;
}

export const LIMITS = {
  /** Password sign-ins at one account from one caller: 10 per 10 minutes. */
  signInAccount: { points: 10, seconds: 600, per: ["caller", "email"], what: "sign-in" },
  /** Sign-ins from one caller across all accounts (password or link): 50 per 10 minutes. */
  signInCaller: { points: 50, seconds: 600, per: ["caller"], what: "sign-in" },
  /** Accounts created by one caller: 10 per hour. */
  signUp: { points: 10, seconds: 3600, per: ["caller"], what: "sign-up" },
  /** Mail sent to one address on request (sign-in links, resets, sign-up mail): 5 per hour. */
  mailAddress: { points: 5, seconds: 3600, per: ["email"], what: "mail to this address" },
  /** Mail asked for by one caller, whatever the address: 20 per hour. */
  mailCaller: { points: 20, seconds: 3600, per: ["caller"], what: "mail" },
  /** Secrets from mail spent by one caller (reset, address confirmation): 20 per 10 minutes. */
  mailSecret: { points: 20, seconds: 600, per: ["caller"], what: "link" },
  /**
   * Compilations per user, revision saves included: 180 per minute. The
   * workbench compiles after each pause in typing (350 ms), so steady typing
   * stays inside the limit while a script hammering the API does not.
   */
  compile: { points: 180, seconds: 60, per: ["user"], what: "compile" },
  /** Downloads of revision files per user: 120 per minute. */
  export: { points: 120, seconds: 60, per: ["user"], what: "export" },
  /** Review writes per user (asking, which mails each member asked; comments; decisions; withdrawals): 60 per 10 minutes. */
  review: { points: 60, seconds: 600, per: ["user"], what: "review" },
  /**
   * Invitation mail an owner sends, new or sent again, whatever the address:
   * 30 per hour per user — a team's worth at once, not a mailing list.
   */
  invitationMail: { points: 30, seconds: 3600, per: ["user"], what: "invitation" },
  /** "Sign out everywhere" per user: 10 per 10 minutes. */
  sessions: { points: 10, seconds: 600, per: ["user"], what: "sign-out" },
} as const satisfies Record<string, LimitRule>;

export type LimitName = keyof typeof LIMITS;
