/**
 * The exact route over a group of outputs that share terms: the covering
 * problem (./problem), a minimum cover (./cover) — under "products, then
 * literals" in two searches, fewest products then fewest literals — and the
 * per-output bounds.
 */
import { popcount } from "../logic";
import { PRODUCT_WEIGHT, boundFromSurrogate, designCost, needsGate } from "./cost";
import { type RowColumns, rowColumns, solveCover } from "./cover";
import { BufferPool } from "./lp";
import { implicitCover, tableSpace } from "./implicit";
import { type CoveringProblem, type ExactSettings, multiOutputPrimes, problemFromPrimes } from "./problem";
import { assignTerms, costOfCovers } from "./share";
import { type Solved, boundProves } from "./solved";
import { swapForFewerLiterals } from "./swap";
import type { Target } from "./target";
import { type CostModel, DEFAULTS } from "./types";

/**
 * Products-then-literals in two searches, because one search over the
 * combined weight must resolve literal differences everywhere and explores
 * far more nodes. First the fewest products P* (unit weights); then the
 * fewest literals among covers of at most P* columns (the column budget is
 * relaxed into the Lagrangian bound and checked against independent rows).
 * When some columns are wires (one literal, no product), the budget would
 * have to skip them, and one search over the combined weight runs instead.
 * Returns weights in the {@link columnWeight} scale.
 */
export function lexicographicCover(prob: CoveringProblem, model: CostModel, settings: ExactSettings, rc: RowColumns) {
  const { colRows, weight, rowCount } = prob;
  const { tuning } = settings;
  // The searches may go on past the primes' deadline: the primes are there, and the heuristic that follows
  // rarely beats what they find on large functions.
  const deadline = settings.coverDeadline ?? settings.deadline;
  // The three searches below hand their LPs' basis inverses to each other.
  const pool = new BufferPool();
  const only = essentialCover(colRows, rc, rowCount);
  if (only) {
    // Every cover holds the essential columns, and they cover every row: they are the one minimum cover.
    let w = 0;
    for (let i = 0; i < only.length; i++) w += weight[only[i]!]!;
    return { chosen: only, weight: w, lowerBound: w, exact: true };
  }
  if (model.kind !== "products") return solveCover({ colRows, weight, rowCount, deadline, rowCols: rc, tuning, pool });
  const lits = prob.columns.map((p) => popcount(p.mask));
  // Wires (terms of one literal) and the constant 1 are no products: they weigh their literals only.
  let wires = 0;
  for (let c = 0; c < lits.length; c++) if (!needsGate(lits[c]!)) wires++;
  const gates = (cs: number[]) => cs.reduce((a, c) => a + (needsGate(lits[c]!) ? 1 : 0), 0);
  // One root LP over the combined weight first: when its rounding meets its bound the cover is
  // lexicographically minimum as well, provided no cover with fewer products can make up the product
  // weight in literals (PRODUCT_WEIGHT ≥ most literals × products + wires).
  const s0 = solveCover({ colRows, weight, rowCount, deadline, rootOnly: true, rowCols: rc, tuning, pool });
  let mostLits = 1;
  for (let c = 0; c < lits.length; c++) if (lits[c]! > mostLits) mostLits = lits[c]!;
  if (s0.exact && PRODUCT_WEIGHT >= mostLits * gates(s0.chosen) + wires) {
    return { chosen: s0.chosen, weight: s0.weight, lowerBound: s0.weight, exact: true };
  }
  // The root's rounded cover, when there is one, starts both searches.
  const first = Number.isFinite(s0.weight) ? s0.chosen : undefined;
  if (wires > 0) {
    // The literal search's column budget would have to leave the wires out: one search over the
    // combined weight instead, from the root's cover and cuts (found without a budget, on these weights).
    const s = solveCover({ colRows, weight, rowCount, deadline, rowCols: rc, incumbent: first, cuts: s0.cuts, tuning, pool });
    return { chosen: s.chosen, weight: s.weight, lowerBound: s.lowerBound, exact: s.exact };
  }
  // The root's bound proves the fewest products when no cover of one product less reaches it
  // (each of its products weighs at most PRODUCT_WEIGHT + mostLits): the product search is then not needed.
  const proven = first !== undefined && s0.lowerBound > (first.length - 1) * (PRODUCT_WEIGHT + mostLits);
  const s1 = proven
    ? { chosen: first, exact: true, lowerBound: first.length }
    : solveCover({ colRows, weight: lits.map(() => 1), rowCount, deadline, rowCols: rc, incumbent: first, tuning, pool });
  const P = s1.chosen.length;
  let start = swapForFewerLiterals(s1.chosen, colRows, lits, rowCount, rc);
  if (first && first.length <= P) {
    const litsOf = (cs: number[]) => cs.reduce((a, c) => a + lits[c]!, 0);
    if (litsOf(first) < litsOf(start)) start = first;
  }
  // A cover of P columns has at least the literals of the P columns with fewest: a start that has no more is the minimum.
  if (s1.exact) {
    const fewest = lits.slice().sort((a, b) => a - b);
    let least = 0;
    for (let i = 0; i < P; i++) least += fewest[i]!;
    if (start.reduce((a, c) => a + lits[c]!, 0) === least) {
      const w = start.reduce((a, c) => a + weight[c]!, 0);
      return { chosen: start, weight: w, lowerBound: w, exact: true };
    }
  }
  // The root's cuts hold for the literal search too: its root reductions, the same under the literal weights, are checked.
  const s2 = solveCover({ colRows, weight: lits, rowCount, deadline, incumbent: start, maxColumns: P, rowCols: rc, cuts: s0.cuts, tuning, pool });
  const chosen = s2.chosen.length === P || !s1.exact ? s2.chosen : s1.chosen;
  const w = chosen.reduce((a, c) => a + weight[c]!, 0);
  // Bound in the combined scale: at least the proven product count, each with at least one literal... kept simple:
  // products bound times the product weight (literals add nothing to the bound).
  const lb = s1.exact && s2.exact ? w : Math.min(w, s1.lowerBound * PRODUCT_WEIGHT);
  return { chosen, weight: w, lowerBound: lb, exact: s1.exact && s2.exact };
}

/**
 * The essential columns (sole column of some row) when they cover every row,
 * in the order the cover search lists them (rows in order, a row already
 * covered skipped); null when rows remain.
 */
function essentialCover(colRows: Int32Array[], rc: RowColumns, rowCount: number): number[] | null {
  const { start, cols } = rc;
  const covered = new Uint8Array(rowCount);
  const taken = new Uint8Array(colRows.length);
  const chosen: number[] = [];
  for (let r = 0; r < rowCount; r++) {
    if (covered[r] || start[r + 1]! - start[r]! !== 1) continue;
    const c = cols[start[r]!]!;
    if (!taken[c]) {
      taken[c] = 1;
      chosen.push(c);
    }
    const rs = colRows[c]!;
    for (let i = 0; i < rs.length; i++) covered[rs[i]!] = 1;
  }
  for (let r = 0; r < rowCount; r++) if (!covered[r]) return null;
  return chosen;
}

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
  const sol = rowCount === 0 ? { chosen: [], weight: 0, lowerBound: 0, exact: true } : lexicographicCover(prob, model, limits, rc);
  const { covers, literals } = assignTerms(n, targets.length, prob, sol.chosen);
  const cost = designCost(model, literals, covers.map((c) => c.length));
  const bound = Math.min(cost, boundFromSurrogate(model, sol.lowerBound, live));
  // Per output: independent rows of that output alone, each charged its cheapest column.
  const outputBounds = outputAloneBounds(prob, model, rc);
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
  const parts = targets.map((t) => exactGroup(n, [t], model, limits));
  const covers = parts.map((p) => p.covers[0]!);
  const cost = costOfCovers(model, covers);
  const outputBounds = parts.map((p) => p.designBound);
  const designBound = Math.min(cost, Math.max(...outputBounds));
  // Outputs covered one by one cannot prove a shared optimum: only a met bound of a cost-only model does.
  const exact = parts.every((p) => p.exact) && boundProves(model, cost, designBound);
  return { covers, cost, exact, designBound, outputBounds, primes: parts.reduce((a, p) => a + p.primes, 0), route: "exact" };
}
