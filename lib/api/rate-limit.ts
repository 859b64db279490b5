import "server-only";
/**
 * The counters behind lib/api/limits.ts, kept in PostgreSQL (the table
 * rate_limits, made by a migration) through rate-limiter-flexible, so every
 * server process counts against the same windows. Keys are stored as SHA-256
 * hashes: the table holds no addresses.
 */
import { createHash } from "node:crypto";
import { RateLimiterPostgres, RateLimiterRes } from "rate-limiter-flexible";
import type { Sequelize } from "sequelize";
import { db } from "../db/connection";
import { AppError } from "./errors";
import { LIMITS, type LimitKey, type LimitName } from "./limits";

export { LIMITS, type LimitName };

/** The table of the counters (migrations/20261215090000-sessions-limits-and-rights.mjs). */
export const LIMITS_TABLE = "rate_limits";

export type LimitStore = Record<LimitName, RateLimiterPostgres>;

/** One limiter per limit on the given connection; the table must exist already. */
export function createLimitStore(sequelize: Sequelize): LimitStore {
  const entries = (Object.keys(LIMITS) as LimitName[]).map((name) => {
    const rule = LIMITS[name];
    const limiter = new RateLimiterPostgres({
      storeClient: sequelize,
      storeType: "sequelize",
      tableName: LIMITS_TABLE,
      tableCreated: true,
      keyPrefix: name,
      points: rule.points,
      duration: rule.seconds,
      // Expired rows are swept once per 5 minutes by the first limiter only.
      clearExpiredByTimeout: name === "compile",
    });
    return [name, limiter] as const;
  });
  return Object.fromEntries(entries) as LimitStore;
}

const g = globalThis as unknown as { fanboundLimitStore?: LimitStore };

/** This process's store, on the app's connection. */
export function limitStore(): LimitStore {
  return (g.fanboundLimitStore ??= createLimitStore(db().sequelize));
}

/** What a request is counted by: its caller, its user and the e-mail address it is about. */
export interface LimitSubject {
  caller: string;
  userId?: string | null;
  email?: string | null;
}

function keyOf(per: readonly LimitKey[], s: LimitSubject): string {
  const parts = per.map((k) => {
    if (k === "caller") return `c:${s.caller}`;
    if (k === "user") return s.userId ? `u:${s.userId}` : `c:${s.caller}`;
    return `e:${(s.email ?? "").trim().toLowerCase()}`;
  });
  return createHash("sha256").update(parts.join("\n"), "utf8").digest("hex");
}

/**
 * Counts one request against each named limit; throws a 429 AppError naming
 * what was limited, with the seconds to wait, when any of them is used up.
 */
export async function enforceLimits(names: readonly LimitName[] | undefined, subject: LimitSubject, store: LimitStore = limitStore()): Promise<void> {
  if (!names?.length) return;
  const results = await Promise.allSettled(names.map((n) => store[n].consume(keyOf(LIMITS[n].per, subject))));
  let refused: { name: LimitName; ms: number } | null = null;
  for (const [i, r] of results.entries()) {
    if (r.status === "fulfilled") continue;
    if (!(r.reason instanceof RateLimiterRes)) throw r.reason;
    if (!refused || r.reason.msBeforeNext > refused.ms) refused = { name: names[i]!, ms: r.reason.msBeforeNext };
  }
  if (refused) {
    const seconds = Math.max(1, Math.ceil(refused.ms / 1000));
    const { what, points, seconds: window } = LIMITS[refused.name];
    throw new AppError(
      "rate_limited",
      `Too many ${what} requests (at most ${points} in ${window >= 3600 ? `${window / 3600} h` : window >= 60 ? `${window / 60} min` : `${window} s`}); wait ${seconds} s and try again.`,
      { limit: refused.name, retryAfterSeconds: seconds },
      seconds,
    );
  }
}

/** Forgets every counter (tests). */
export async function resetLimits(): Promise<void> {
  await db().sequelize.query(`DELETE FROM ${LIMITS_TABLE}`);
}

/**
 * The caller's address for rate limits. X-Forwarded-For is believed only when
 * FANBOUND_TRUST_PROXY=1 (a proxy in front sets it); otherwise anyone could
 * send a fresh value with each request, so every caller shares "direct".
 */
export function clientIp(req: Request): string {
  if (process.env.FANBOUND_TRUST_PROXY === "1") {
    const fwd = req.headers.get("x-forwarded-for");
    if (fwd) return fwd.split(",").at(-1)!.trim();
  }
  return "direct";
}
