/**
 * Where a run stands, for {@link MinimizeOptions.onProgress}: the primes
 * found, the cost of the best cover so far and the proven lower bound. The
 * stages report whatever they learn; the reporter keeps the best of it (the
 * lowest cost, the highest bound) and passes it on at a coarse rate.
 */
import type { MinimizeOptions, MinimizeProgress } from "./types";

/** Reports closer together than this are held back (the latest is passed on with the next one), ms. */
const EVERY_MS = 500;

export class Reporter {
  private readonly state: MinimizeProgress = {};
  private pending = false;
  private last = -Infinity;

  constructor(private readonly fn: MinimizeOptions["onProgress"]) {}

  /** Whether anyone listens: the stages skip the work of a report when not. */
  get active(): boolean {
    return this.fn !== undefined;
  }

  /**
   * Takes what a stage learnt: a cost counts when it is below the best so
   * far, a bound when it is above. `now` passes it on at once (a stage's end).
   */
  update(p: MinimizeProgress, now = false): void {
    if (!this.fn) return;
    const s = this.state;
    if (p.primes !== undefined && p.primes !== s.primes) {
      s.primes = p.primes;
      this.pending = true;
    }
    if (p.cost !== undefined && !(s.cost !== undefined && s.cost <= p.cost)) {
      s.cost = p.cost;
      this.pending = true;
    }
    if (p.lowerBound !== undefined && !(s.lowerBound !== undefined && s.lowerBound >= p.lowerBound)) {
      s.lowerBound = p.lowerBound;
      this.pending = true;
    }
    if (!this.pending) return;
    const t = Date.now();
    if (!now && t - this.last < EVERY_MS) return;
    this.last = t;
    this.pending = false;
    this.fn({ ...s });
  }
}
