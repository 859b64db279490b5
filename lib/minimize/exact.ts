/**
 * The exact route over a group of outputs that share terms: the covering
 * problem (./problem), a minimum cover (./lexicographic on ./cover) — under
 * "products, then literals" in two searches, fewest products then fewest
 * literals — and the per-output bounds.
 */
import { popcount } from "../logic";
import { boundFromSurrogate, designCost } from "./cost";
import { type RowColumns, rowColumns } from "./cover";
import { implicitCover, tableSpace } from "./implicit";
import { lexicographicCover } from "./lexicographic";
import { type CoveringProblem, type ExactSettings, multiOutputPrimes, problemFromPrimes } from "./problem";
import { assignTerms, costOfCovers } from "./share";
import { type Solved, boundProves } from "./solved";
import type { Target } from "./target";
import { type CostModel, DEFAULTS } from "./types";

/**
 * Per output, a bound on its cost as if it stood alone: a greedy set of its
 * rows no column covers two of (fewest columns first), each charged its
 * cheapest column. Rows of one output are numbered consecutively.
 */
function outputAloneBounds(prob: CoveringProblem & { rowsPerOutput: number[] }, model: CostModel, rc: RowColumns): number[] {
  const { weight } = prob;
  const { start, cols } = rc;
  // used[c] === stamp: column c covers a row already taken for this output, so no other row of c may be taken.
  const used = new Int32Array(prob.colRows.length);
  const bounds: number[] = [];
  for (let j = 0, lo = 0; j < prob.rowsPerOutput.length; j++) {
    const count = prob.rowsPerOutput[j]!;
    const hi = lo + count;
    const stamp = j + 1;
    // Fewest columns first, ties in row order: a counting sort on the column counts.
    let most = 0;
    for (let r = lo; r < hi; r++) most = Math.max(most, start[r + 1]! - start[r]!);
    const at = new Int32Array(most + 2);
    for (let r = lo; r < hi; r++) at[start[r + 1]! - start[r]! + 1]!++;
    for (let d = 0; d <= most; d++) at[d + 1]! += at[d]!;
    const order = new Int32Array(count);
    for (let r = lo; r < hi; r++) order[at[start[r + 1]! - start[r]!]!++] = r;
    let w = 0;
    for (let k = 0; k < count; k++) {
      const r = order[k]!;
      // A row shares a column with a row already taken exactly when one of its columns is used.
      let free = true;
      for (let q = start[r]!; q < start[r + 1]! && free; q++) if (used[cols[q]!] === stamp) free = false;
      if (!free) continue;
      let m = Infinity;
      for (let q = start[r]!; q < start[r + 1]!; q++) {
        const c = cols[q]!;
        if (weight[c]! < m) m = weight[c]!;
        used[c] = stamp;
      }
      w += m;
    }
    bounds.push(count === 0 ? 0 : boundFromSurrogate(model, w, 1));
    lo = hi;
  }
  return bounds;
}

/** ON points, and ON points per prime, from which rows are made on demand (./implicit) rather than all listed. */
const IMPLICIT_MIN_POINTS = 16_384;
const IMPLICIT_POINTS_PER_PRIME = 16;

/** Exact route over a group of outputs sharing terms. Throws ExactLimit beyond its limits. */
export function exactGroup(
  n: number,
  targets: Target[],
  model: CostModel,
  limits: ExactSettings,
): Solved {
  const primes = multiOutputPrimes(n, targets, limits);
  limits.progress?.update({ primes: primes.length });
  // Few primes and a great many ON points: rows on demand (./implicit) instead of all of them.
  let points = 0;
  for (const t of targets) for (let w = 0; w < t.onT!.length; w++) points += popcount(t.onT![w]!);
  if (points >= IMPLICIT_MIN_POINTS && points > IMPLICIT_POINTS_PER_PRIME * primes.length) {
    return implicitCover(n, targets, model, primes, tableSpace(targets, n), limits, true);
  }
  const prob = problemFromPrimes(n, targets, model, primes);
  const { rowCount } = prob;
  const all = prob.primes;
  const live = targets.filter((t, j) => t.on.length > 0 && prob.rowsPerOutput[j]! > 0).length;
  // Rows → columns, once for the steps below and the cover searches.
  const rc = rowColumns(prob.colRows, rowCount);
  const report = limits.progress ? { progress: limits.progress, live, covers: true } : undefined;
  const sol = rowCount === 0 ? { chosen: [], weight: 0, lowerBound: 0, exact: true } : lexicographicCover(prob, model, limits, rc, report);
  const { covers, literals } = assignTerms(n, targets.length, prob, sol.chosen);
  const cost = designCost(model, literals, covers.map((c) => c.length));
  const bound = Math.min(cost, boundFromSurrogate(model, sol.lowerBound, live));
  // Per output: independent rows of that output alone, each charged its cheapest column.
  const outputBounds = outputAloneBounds(prob, model, rc);
  limits.progress?.update({ cost, lowerBound: Math.max(bound, ...outputBounds) }, true);
  return {
    covers,
    cost,
    exact: sol.exact && cost === bound,
    designBound: Math.max(bound, ...outputBounds),
    outputBounds,
    primes: all.length,
    route: "exact",
  };
}

/**
 * The exact route over the whole design: one group sharing terms, or above
 * DEFAULTS.maxSharedOutputs outputs (tags are 31-bit), each output alone.
 * Throws ExactLimit beyond its limits.
 */
export function exactRoute(n: number, targets: Target[], model: CostModel, limits: ExactSettings): Solved {
  if (targets.length <= DEFAULTS.maxSharedOutputs) return exactGroup(n, targets, model, limits);
  // Each part's cover and bound are one output's, not the design's: the parts report nothing.
  const quiet = { ...limits, progress: undefined };
  const parts = targets.map((t) => exactGroup(n, [t], model, quiet));
  limits.progress?.update({ primes: parts.reduce((a, p) => a + p.primes, 0) });
  const covers = parts.map((p) => p.covers[0]!);
  const cost = costOfCovers(model, covers);
  const outputBounds = parts.map((p) => p.designBound);
  const designBound = Math.min(cost, Math.max(...outputBounds));
  limits.progress?.update({ cost, lowerBound: designBound }, true);
  // Outputs covered one by one cannot prove a shared optimum: only a met bound of a cost-only model does.
  const exact = parts.every((p) => p.exact) && boundProves(model, cost, designBound);
  return { covers, cost, exact, designBound, outputBounds, primes: parts.reduce((a, p) => a + p.primes, 0), route: "exact" };
}
