/**
 * The cover searches of the exact route, under "products, then literals" in
 * two searches (fewest products, then fewest literals among covers of that
 * many), and under the other models in one. Used by ./exact on all the rows
 * and by ./implicit on rows made on demand.
 */
import { popcount } from "../logic";
import { PRODUCT_WEIGHT, boundFromSurrogate, needsGate } from "./cost";
import { DEFAULT_TUNING, type RowColumns, solveCover } from "./cover";
import { BufferPool } from "./lp";
import type { CoveringProblem, ExactSettings } from "./problem";
import type { Reporter } from "./progress";
import { swapForFewerLiterals } from "./swap";
import type { CostModel } from "./types";

/** Where {@link lexicographicCover} reports its searches' covers and bounds. */
export interface CoverReport {
  progress: Reporter;
  /** Outputs that need a term (the fan-in model's bound depends on them). */
  live: number;
  /** Whether a cover of the problem's rows covers the design (not when the rows are a sample, as in ./implicit). */
  covers: boolean;
}

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
export function lexicographicCover(prob: CoveringProblem, model: CostModel, settings: ExactSettings, rc: RowColumns, report?: CoverReport) {
  const { colRows, weight, rowCount } = prob;
  const { tuning } = settings;
  // Progress in the design's cost: under the products model every search's weight says how many products
  // its cover has (combined weights: the multiples of PRODUCT_WEIGHT; unit weights: the columns, all of them
  // products when that search runs); under the others a weight is only a bound on the cost.
  const progress = report?.progress;
  const combinedProgress = progress?.active
    ? (w: number, lb: number) =>
        progress.update(model.kind === "products"
          ? { ...(report!.covers ? { cost: Math.floor(w / PRODUCT_WEIGHT) } : {}), lowerBound: Math.floor(lb / PRODUCT_WEIGHT) }
          : { lowerBound: boundFromSurrogate(model, lb, report!.live) })
    : undefined;
  const unitProgress = progress?.active
    ? (w: number, lb: number) => progress.update({ ...(report!.covers ? { cost: w } : {}), lowerBound: lb })
    : undefined;
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
  if (model.kind !== "products") return solveCover({ colRows, weight, rowCount, deadline, rowCols: rc, tuning, pool, onProgress: combinedProgress });
  const lits = prob.columns.map((p) => popcount(p.mask));
  // Wires (terms of one literal) and the constant 1 are no products: they weigh their literals only.
  let wires = 0;
  for (let c = 0; c < lits.length; c++) if (!needsGate(lits[c]!)) wires++;
  const gates = (cs: number[]) => cs.reduce((a, c) => a + (needsGate(lits[c]!) ? 1 : 0), 0);
  // One root LP over the combined weight first: when its rounding meets its bound the cover is
  // lexicographically minimum as well, provided no cover with fewer products can make up the product
  // weight in literals (PRODUCT_WEIGHT ≥ most literals × products + wires).
  // A core of more than twice the rows the root-only search solves the LP of gets no LP there (the root's
  // reductions take 5 to 15 % of a large random core's rows, not half): that search, whose reductions alone
  // cost such a core time better spent below, is not run (random 14-input functions: 6500 core rows, 0.6 s).
  const rootOnlyMaxRows = (tuning ?? DEFAULT_TUNING).rootOnlyMaxRows;
  const s0 = coreRows(colRows, rc, rowCount) > ROOT_ONLY_REACH * rootOnlyMaxRows
    ? { chosen: [], weight: Infinity, lowerBound: 0, exact: false, cuts: undefined }
    : solveCover({ colRows, weight, rowCount, deadline, rootOnly: true, rowCols: rc, tuning, pool });
  if (Number.isFinite(s0.weight)) combinedProgress?.(s0.weight, s0.lowerBound);
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
    const s = solveCover({ colRows, weight, rowCount, deadline, rowCols: rc, incumbent: first, cuts: s0.cuts, tuning, pool, onProgress: combinedProgress });
    return { chosen: s.chosen, weight: s.weight, lowerBound: s.lowerBound, exact: s.exact };
  }
  // The root's bound proves the fewest products when no cover of one product less reaches it
  // (each of its products weighs at most PRODUCT_WEIGHT + mostLits): the product search is then not needed.
  const proven = first !== undefined && s0.lowerBound > (first.length - 1) * (PRODUCT_WEIGHT + mostLits);
  const s1 = proven
    ? { chosen: first, exact: true, lowerBound: first.length }
    : solveCover({ colRows, weight: lits.map(() => 1), rowCount, deadline, rowCols: rc, incumbent: first, tuning, pool, onProgress: unitProgress });
  const P = s1.chosen.length;
  unitProgress?.(P, s1.lowerBound);
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

/** How many times the rows the root-only search solves the LP of a core may have before that search is not run (see rootOnlyMaxRows). */
const ROOT_ONLY_REACH = 2;

/** Rows the sparse essentials (sole columns of some row) leave uncovered. */
function coreRows(colRows: Int32Array[], rc: RowColumns, rowCount: number): number {
  const { start, cols } = rc;
  const covered = new Uint8Array(rowCount);
  for (let r = 0; r < rowCount; r++) {
    if (start[r + 1]! - start[r]! !== 1) continue;
    const rs = colRows[cols[start[r]!]!]!;
    for (let i = 0; i < rs.length; i++) covered[rs[i]!] = 1;
  }
  let left = 0;
  for (let r = 0; r < rowCount; r++) left += 1 - covered[r]!;
  return left;
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
