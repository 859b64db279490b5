/**
 * In-memory token buckets, one map per concern. A bucket holds `capacity`
 * tokens and regains `refillPerSecond`; a request takes one. The clock is
 * injectable so tests can move time without waiting.
 */
import { AppError } from "./errors";

export interface BucketOptions {
  /** Most requests in a burst. */
  capacity: number;
  /** Tokens regained per second. */
  refillPerSecond: number;
  /** Milliseconds since some epoch; default Date.now. */
  now?: () => number;
}

export class RateLimiter {
  private readonly buckets = new Map<string, { tokens: number; at: number }>();
  private now: () => number;
  constructor(private readonly options: BucketOptions) {
    this.now = options.now ?? Date.now;
  }

  /** Takes one token for `key`; returns 0 when allowed, else the seconds to wait. */
  take(key: string): number {
    const t = this.now();
    const { capacity, refillPerSecond } = this.options;
    const b = this.buckets.get(key) ?? { tokens: capacity, at: t };
    b.tokens = Math.min(capacity, b.tokens + ((t - b.at) / 1000) * refillPerSecond);
    b.at = t;
    if (b.tokens >= 1) {
      b.tokens -= 1;
      this.buckets.set(key, b);
      if (this.buckets.size > 50_000) this.prune();
      return 0;
    }
    this.buckets.set(key, b);
    return (1 - b.tokens) / refillPerSecond;
  }

  /** Throws a 429 AppError naming what was limited when the bucket is empty. */
  enforce(key: string, what: string): void {
    const wait = this.take(key);
    if (wait > 0) {
      const seconds = Math.max(1, Math.ceil(wait));
      throw new AppError("rate_limited", `Too many ${what} requests; wait ${seconds} s and try again.`, { retryAfterSeconds: seconds }, seconds);
    }
  }

  /** Replaces the clock (tests). */
  setClock(now: () => number): void {
    this.now = now;
  }

  /** Forgets every bucket (tests). */
  reset(): void {
    this.buckets.clear();
    this.now = this.options.now ?? Date.now;
  }

  private prune() {
    const t = this.now();
    for (const [k, b] of this.buckets) {
      if (b.tokens + ((t - b.at) / 1000) * this.options.refillPerSecond >= this.options.capacity) this.buckets.delete(k);
    }
  }
}

function make() {
  return {
    /** Password and link sign-ins, per IP and e-mail: 10 at once, then one per 6 s. */
    signIn: new RateLimiter({ capacity: 10, refillPerSecond: 1 / 6 }),
    /** Sign-ups per IP: 5 at once, then one per minute. */
    signUp: new RateLimiter({ capacity: 5, refillPerSecond: 1 / 60 }),
    /** Mails sent on request (links, resets), per IP and e-mail: 5 at once, then one per minute. */
    mail: new RateLimiter({ capacity: 5, refillPerSecond: 1 / 60 }),
    /**
     * Compilations per user (including revision saves): 60 at once, then three per
     * second — the workbench compiles after each pause in typing (350 ms), so
     * steady typing stays inside the limit while a script hammering the API does not.
     */
    compile: new RateLimiter({ capacity: 60, refillPerSecond: 3 }),
  };
}

// One set per process even when the bundler duplicates this module across routes.
const g = globalThis as unknown as { fanboundLimiters?: ReturnType<typeof make> };
export const limiters = (g.fanboundLimiters ??= make());

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
