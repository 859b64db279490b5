/**
 * Exact multi-output two-level minimization with don't-cares.
 *
 * Route: multi-output primes by Quine–McCluskey (./primes), then an exact
 * cover of the (output, ON-minterm) pairs (./cover), where a term shared by
 * several outputs is paid once. Beyond the exact route's limits (inputs above
 * TRUTH_TABLE_MAX_INPUTS, more than `maxPrimes` primes, a cyclic core too big
 * or a search not finished in time) the expand / irredundant / reduce loop
 * (./heuristic) runs per output, identical terms are shared, and the result
 * carries a proven lower bound (./bound). Every cover is verified (lib/verify)
 * before it is returned.
 */
import type { Cube, FunctionSpec } from "../logic";
import { MAX_INPUTS, TRUTH_TABLE_MAX_INPUTS, fullMask, popcount, tableFromCubes, tableMinterms } from "../logic";
import { verifyCovers } from "../verify";
import { independentPoints, tableOracle, cubeOracle, type BoundPoint } from "./bound";
import { PRODUCT_WEIGHT, boundFromSurrogate, columnWeight, designCost, gatesFor, validateModel } from "./cost";
import { rowColumns, solveCover } from "./cover";
import { formatCover } from "./expression";
import { HeuristicTimeout, heuristicCover } from "./heuristic";
import { DENSE_MAX_INPUTS, ExactLimit, compactCover, coverTaggedPrimes, denseTaggedPrimes, taggedPrimes, type TaggedPrime } from "./primes";
import type { CostModel, MinimizeOptions, MinimizeResult, MinimizedOutput } from "./types";
import { LimitError } from "./types";
import { OverBudget, WorkBudget, complement } from "./unate";

export type { CostModel, MinimizeOptions, MinimizeResult, MinimizedOutput } from "./types";
export { LimitError } from "./types";
export { formatCover } from "./expression";

/** Defaults of {@link MinimizeOptions}. */
export const DEFAULTS = {
  form: "sop" as const,
  cost: { kind: "products" } as CostModel,
  maxPrimes: 100_000,
  timeLimitMs: 10_000,
  /** Implicants the Quine–McCluskey tables may hold in total before the exact route gives way. */
  maxImplicants: 400_000,
  /** Outputs that share terms exactly; above, outputs are covered one by one (tags are 31-bit). */
  maxSharedOutputs: 31,
};

/** The problem actually covered: per output, the points to cover (ON, or OFF for POS) and DC. */
interface Target {
  on: Cube[];
  dc: Cube[];
  /** Present when inputs ≤ TRUTH_TABLE_MAX_INPUTS. `on` wins where both are set. */
  onT?: Uint32Array;
  dcT?: Uint32Array;
}

function tableCubes(t: Uint32Array, n: number): Cube[] {
  const full = fullMask(n);
  return tableMinterms(t, n).map((m) => ({ value: m, mask: full }));
}

function buildTargets(spec: FunctionSpec, form: "sop" | "pos"): Target[] {
  const n = spec.inputs.length;
  return spec.outputs.map((o) => {
    if (n <= TRUTH_TABLE_MAX_INPUTS) {
      const on = tableFromCubes(o.on, n);
      const dc = tableFromCubes(o.dc, n);
      for (let w = 0; w < on.length; w++) dc[w]! &= ~on[w]!;
      if (form === "sop") return { on: o.on, dc: o.dc, onT: on, dcT: dc };
      const off = new Uint32Array(on.length);
      const valid = n >= 5 ? 0xffffffff : (2 ** (2 ** n) - 1) >>> 0;
      for (let w = 0; w < on.length; w++) off[w] = ~(on[w]! | dc[w]!) & valid;
      return { on: tableCubes(off, n), dc: tableCubes(dc, n), onT: off, dcT: dc };
    }
    if (form === "sop") return { on: o.on, dc: o.dc };
    return { on: complement(o.on.concat(o.dc), fullMask(n)), dc: o.dc };
  });
}

interface Solved {
  /** Per output, the product cubes of the covered function (before POS inversion). */
  covers: Cube[][];
  exact: boolean;
  designBound: number;
  outputBounds: number[];
  primes: number;
  route: "exact" | "heuristic";
}

function sameCube(a: Cube, b: Cube): boolean {
  return a.value === b.value && a.mask === b.mask;
}

function cubeKey(c: Cube): number {
  return c.mask * 1073741824 + c.value;
}

/** Per output, drop chosen terms that the output's other terms already cover, costliest first. */
function assignTerms(n: number, targets: Target[], chosen: TaggedPrime[]): Cube[][] {
  const full = fullMask(n);
  // How many candidate terms cover each ON point; reset after each output through the point lists.
  const count = new Int32Array(2 ** n);
  return targets.map((t, j) => {
    const bit = 1 << j;
    const cand = chosen.filter((p) => (p.tag & bit) !== 0);
    const onT = t.onT!;
    const pts = cand.map((p) => {
      const list: number[] = [];
      const free = (full & ~p.mask) >>> 0;
      let sub = 0;
      for (;;) {
        const m = (p.value | sub) >>> 0;
        if ((onT[m >>> 5]! >>> (m & 31)) & 1) {
          list.push(m);
          count[m]!++;
        }
        if (sub === free) break;
        sub = ((sub - free) & free) >>> 0;
      }
      return list;
    });
    const order = cand.map((_, i) => i).sort((a, b) => popcount(cand[b]!.mask) - popcount(cand[a]!.mask));
    const keep = new Uint8Array(cand.length).fill(1);
    for (const i of order) {
      const list = pts[i]!;
      let redundant = true;
      for (let k = 0; k < list.length; k++) {
        if (count[list[k]!]! <= 1) {
          redundant = false;
          break;
        }
      }
      if (redundant) {
        keep[i] = 0;
        for (let k = 0; k < list.length; k++) count[list[k]!]!--;
      }
    }
    for (const list of pts) for (let k = 0; k < list.length; k++) count[list[k]!] = 0;
    return cand.filter((_, i) => keep[i] === 1).map((p) => ({ value: p.value, mask: p.mask }));
  });
}

function costOfCovers(model: CostModel, covers: Cube[][]): number {
  // Distinct terms by sorting their keys: covers of tens of thousands of terms make a map the slow part.
  // The keys are exact below 2^53, that is for masks below 2^23.
  let total = 0;
  let wide = false;
  for (const cv of covers) {
    total += cv.length;
    for (const c of cv) if (c.mask >= 2 ** 23) wide = true;
  }
  if (wide) {
    const distinct = new Map<string, number>();
    for (const cv of covers) for (const c of cv) distinct.set(`${c.mask}/${c.value}`, popcount(c.mask));
    return designCost(model, [...distinct.values()], covers.map((c) => c.length));
  }
  const keys = new Float64Array(total);
  let i = 0;
  for (const cv of covers) for (const c of cv) keys[i++] = cubeKey(c);
  keys.sort();
  const literals: number[] = [];
  for (let k = 0; k < total; k++) {
    if (k > 0 && keys[k] === keys[k - 1]) continue;
    literals.push(popcount(Math.floor(keys[k]! / 1073741824)));
  }
  return designCost(model, literals, covers.map((c) => c.length));
}

/** The covering problem of the exact route: rows (output, ON minterm), columns multi-output primes. */
export interface CoveringProblem {
  /** All multi-output primes (value, mask, tag: bit j = output j). */
  primes: TaggedPrime[];
  /** The primes that reach at least one row, in column order. */
  columns: TaggedPrime[];
  /** colRows[c]: rows covered by column c. */
  colRows: Int32Array[];
  /** Integer weight of each column under the cost model (see ./cost). */
  weight: number[];
  rowCount: number;
}

function buildProblem(
  n: number,
  targets: Target[],
  model: CostModel,
  limits: { maxPrimes: number; maxImplicants: number; deadline: number },
): CoveringProblem & { rowsPerOutput: number[] } {
  const words = targets[0]!.onT!.length;
  const care = new Uint32Array(words);
  for (const t of targets) for (let w = 0; w < words; w++) care[w]! |= t.onT![w]! | t.dcT![w]!;
  // The care minterms as a list only for the routes that walk them.
  let mintermList: number[] | null = null;
  const minterms = () => (mintermList ??= tableMinterms(care, n));
  const tagOf = (m: number): number => {
    let tag = 0;
    const w = m >>> 5;
    const b = m & 31;
    for (let j = 0; j < targets.length; j++) {
      if (((targets[j]!.onT![w]! | targets[j]!.dcT![w]!) >>> b) & 1) tag |= 1 << j;
    }
    return tag;
  };
  let all: TaggedPrime[] | null;
  // The dense table costs 3^n whatever the function; the tables cost what they hold, little when few care points are adjacent.
  const pairs = n < 6 ? Infinity : adjacentPairs(care, n);
  if (pairs === 0) {
    // No two care points one variable apart: nothing merges, every care minterm is a prime.
    const full = fullMask(n);
    all = [];
    for (const m of minterms()) {
      const tag = tagOf(m);
      if (tag !== 0) all.push({ value: m, mask: full, tag });
    }
    if (all.length > limits.maxPrimes) throw new ExactLimit("maxPrimes", all.length);
  } else {
    const dense = n <= DENSE_MAX_INPUTS && pairs > 2 ** (n - 1);
    let careCount = 0;
    for (let w = 0; w < words; w++) careCount += popcount(care[w]!);
    // Functions with large cubes have small cube covers and few primes: the recursive rule then costs a
    // small part of the table route, and is tried first within a part of that cost.
    all = recursivePrimes(n, targets, limits, { dense, careCount, pairs });
    if (all === null && dense) {
      const tags = new Uint32Array(2 ** n);
      targets.forEach((t, j) => {
        for (let w = 0; w < words; w++) {
          for (let x = t.onT![w]! | t.dcT![w]!; x !== 0; x &= x - 1) tags[w * 32 + 31 - Math.clz32(x & -x)]! |= 1 << j;
        }
      });
      all = denseTaggedPrimes(n, tags, limits);
    } else if (all === null) {
      all = tablePrimes(n, targets, words, minterms(), tagOf, limits, pairs <= 2 ** (n - 1));
    }
  }
  return problemFromPrimes(n, targets, model, all);
}

/** Pairs of care points one variable apart (n ≥ 5, bit-parallel over the table). */
function adjacentPairs(care: Uint32Array, n: number): number {
  let pairs = 0;
  const low = [0x55555555, 0x33333333, 0x0f0f0f0f, 0x00ff00ff, 0x0000ffff];
  for (let i = 0; i < Math.min(n, 5); i++) {
    const sh = 1 << i;
    for (let w = 0; w < care.length; w++) pairs += popcount(care[w]! & (care[w]! >>> sh) & low[i]!);
  }
  for (let i = 5; i < n; i++) {
    const s = 1 << (i - 5);
    for (let w = 0; w < care.length; w++) if ((w & s) === 0) pairs += popcount(care[w]! & care[w + s]!);
  }
  return pairs;
}

function tablePrimes(
  n: number,
  targets: Target[],
  words: number,
  minterms: ArrayLike<number>,
  tagOf: (m: number) => number,
  limits: { maxPrimes: number; maxImplicants: number; deadline: number },
  /** Few adjacent care points: the tables stay small, no need to estimate. */
  sparse: boolean,
): TaggedPrime[] {
  let all: TaggedPrime[];
  // A cube of d free variables holds 3^d implicants the tables would list: skip them when that is hopeless.
  let estimate = 0;
  for (const t of sparse ? [] : targets) {
    const ct = new Uint32Array(words);
    for (let w = 0; w < words; w++) ct[w] = t.onT![w]! | t.dcT![w]!;
    for (const c of compactCover(ct, n)) estimate = Math.max(estimate, 3 ** (n - popcount(c.mask)));
  }
  try {
    if (estimate > limits.maxImplicants) throw new ExactLimit("implicants", estimate);
    all = taggedPrimes(n, minterms, tagOf, limits);
  } catch (e) {
    // Large cubes make the tables explode; the recursive rule reaches the same primes from cube covers.
    if (!(e instanceof ExactLimit) || e.limit !== "implicants") throw e;
    all = recursivePrimes(n, targets, limits);
  }
  return all;
}

function problemFromPrimes(n: number, targets: Target[], model: CostModel, all: TaggedPrime[]): CoveringProblem & { rowsPerOutput: number[] } {
  const full = fullMask(n);
  const words = targets[0]!.onT!.length;
  const valid = n >= 5 ? -1 >>> 0 : 2 ** 2 ** n - 1;
  // Rows of each output numbered consecutively in minterm order: the row of ON minterm 32w + b of output j
  // is first[j][w] + (ON minterms of word w below bit b).
  let rowCount = 0;
  const rowsPerOutput: number[] = [];
  const first = targets.map((t) => {
    const f = new Int32Array(words);
    const start = rowCount;
    for (let w = 0; w < words; w++) {
      f[w] = rowCount;
      rowCount += popcount(t.onT![w]! & valid);
    }
    rowsPerOutput.push(rowCount - start);
    return f;
  });
  const colRows: Int32Array[] = [];
  const weight: number[] = [];
  const cols: TaggedPrime[] = [];
  let buf = new Int32Array(1024);
  for (const p of all) {
    let len = 0;
    // The cube's minterms a word at a time: `pattern` holds its positions within a word (variables 0..4),
    // the words are those matching it on variables 5 and up.
    const lowFree = ~p.mask & full & 31;
    let pattern = 0;
    for (let sub = 0; ; sub = (sub - lowFree) & lowFree) {
      pattern |= 1 << ((p.value & 31) | sub);
      if (sub === lowFree) break;
    }
    pattern = (pattern & valid) >>> 0;
    const highFree = (~p.mask & full) >>> 5;
    const base = p.value >>> 5;
    for (let j = 0; j < targets.length; j++) {
      if (!((p.tag >>> j) & 1)) continue;
      const on = targets[j]!.onT!;
      const f = first[j]!;
      for (let sub = 0; ; sub = (sub - highFree) & highFree) {
        const w = base | sub;
        const word = on[w]!;
        let x = word & pattern;
        if (x !== 0) {
          if (len + 32 > buf.length) {
            const grown = new Int32Array(buf.length * 2);
            grown.set(buf);
            buf = grown;
          }
          const f0 = f[w]!;
          if (x === (word | 0)) {
            // The whole word's ON points: consecutive rows.
            for (let r = f0, end = f0 + popcount(word); r < end; r++) buf[len++] = r;
          } else {
            for (; x !== 0; x &= x - 1) {
              const b = 31 - Math.clz32(x & -x);
              buf[len++] = f0 + popcount(word & ((1 << b) - 1));
            }
          }
        }
        if (sub === highFree) break;
      }
    }
    if (len === 0) continue;
    cols.push(p);
    colRows.push(buf.slice(0, len));
    weight.push(columnWeight(model, popcount(p.mask)));
  }
  return { primes: all, columns: cols, colRows, weight, rowCount, rowsPerOutput };
}

/**
 * Multi-output primes without the tables, from compact cube covers of each
 * output's ON ∪ DC (coverTaggedPrimes in ./primes): exactly the set the
 * tables give. Without `table`, up to 8 outputs, bounded by the limits only.
 * With `table` (the route the tables would take: dense or not, care points,
 * adjacent pairs), returns null instead as soon as the work passes a part of
 * what that route would cost: then the tables are the better choice, and
 * little of their cost was spent.
 */
function recursivePrimes(n: number, targets: Target[], limits: { maxPrimes: number; deadline: number }): TaggedPrime[];
function recursivePrimes(
  n: number,
  targets: Target[],
  limits: { maxPrimes: number; deadline: number },
  table: { dense: boolean; careCount: number; pairs: number },
): TaggedPrime[] | null;
function recursivePrimes(
  n: number,
  targets: Target[],
  limits: { maxPrimes: number; deadline: number },
  table?: { dense: boolean; careCount: number; pairs: number },
): TaggedPrime[] | null {
  const k = targets.length;
  if (table === undefined && k > 8) throw new ExactLimit("implicants", k);
  // The table route's cost in the budget's units (about a nanosecond, see COST in ./unate): the dense
  // table about 4 a cube plus 8 for each implicant it finds; the map-based tables about 30 per variable
  // for each implicant. Implicants: at least the care points and their adjacent pairs, and at least the
  // 3^d cubes inside each cube of d free variables of an output's disjoint cover.
  const base = table === undefined ? Infinity : table.dense ? 4 * 3 ** n : 30 * n * (table.careCount + table.pairs);
  // Below about 0.1 ms there is nothing to win.
  if (base < 1e5) return null;
  const words = targets[0]!.onT!.length;
  const care = targets.map((t) => {
    const c = new Uint32Array(words);
    for (let w = 0; w < words; w++) c[w] = t.onT![w]! | t.dcT![w]!;
    return c;
  });
  if (table === undefined) return coverTaggedPrimes(n, care, limits);
  try {
    // Building the covers: the first 1/16. The walk that stops it early costs far less than the merging it charges.
    const setup = new WorkBudget(base / 16);
    const covers = care.map((c) => compactCover(c, n, setup));
    let inside = 0;
    for (const cv of covers) {
      let sum = 0;
      for (const c of cv) sum += 3 ** (n - popcount(c.mask));
      inside = Math.max(inside, sum);
    }
    const cost = table.dense ? base + 8 * inside : 30 * n * Math.max(table.careCount + table.pairs, inside);
    // The rest: 1/10.
    return coverTaggedPrimes(n, care, limits, { covers, work: new WorkBudget(cost / 10) });
  } catch (e) {
    if (e instanceof OverBudget) return null;
    throw e;
  }
}

/**
 * The covering problem minimize() solves on its exact route (SOP form), for
 * comparison with other solvers. Inputs ≤ TRUTH_TABLE_MAX_INPUTS; at most 31 outputs.
 */
export function coveringProblem(spec: FunctionSpec, options: { cost?: CostModel; form?: "sop" | "pos" } = {}): CoveringProblem {
  const n = spec.inputs.length;
  const targets = buildTargets(spec, options.form ?? "sop");
  const model = options.cost ?? DEFAULTS.cost;
  // Same prime generation as minimize() (the cube route within its budget, else the tables, or the cube route where the
  // tables would explode), without its limits.
  let p: ReturnType<typeof buildProblem>;
  try {
    p = buildProblem(n, targets, model, { maxPrimes: Infinity, maxImplicants: DEFAULTS.maxImplicants, deadline: Infinity });
  } catch (e) {
    if (!(e instanceof ExactLimit)) throw e;
    p = buildProblem(n, targets, model, { maxPrimes: Infinity, maxImplicants: Infinity, deadline: Infinity });
  }
  return { primes: p.primes, columns: p.columns, colRows: p.colRows, weight: p.weight, rowCount: p.rowCount };
}

/**
 * Products-then-literals in two searches, because one search over the
 * combined weight must resolve literal differences everywhere and explores
 * far more nodes. First the fewest products P* (unit weights); then the
 * fewest literals among covers of at most P* columns (the column budget is
 * relaxed into the Lagrangian bound and checked against independent rows).
 * Returns weights in the {@link columnWeight} scale.
 */
function lexicographicCover(prob: CoveringProblem, model: CostModel, deadline: number) {
  const { colRows, weight, rowCount } = prob;
  if (model.kind !== "products") return solveCover({ colRows, weight, rowCount, deadline });
  const lits = prob.columns.map((p) => popcount(p.mask));
  const s1 = solveCover({ colRows, weight: lits.map(() => 1), rowCount, deadline });
  const P = s1.chosen.length;
  const start = swapForFewerLiterals(s1.chosen, colRows, lits, rowCount);
  const s2 = solveCover({ colRows, weight: lits, rowCount, deadline, incumbent: start, maxColumns: P });
  const chosen = s2.chosen.length === P || !s1.exact ? s2.chosen : s1.chosen;
  const w = chosen.reduce((a, c) => a + weight[c]!, 0);
  // Bound in the combined scale: at least the proven product count, each with at least one literal... kept simple:
  // products bound times the product weight (literals add nothing to the bound).
  const lb = s1.exact && s2.exact ? w : Math.min(w, s1.lowerBound * PRODUCT_WEIGHT);
  return { chosen, weight: w, lowerBound: lb, exact: s1.exact && s2.exact };
}

/**
 * One-for-one swaps that keep the cover and lower its literals: a column can
 * give way to a cheaper one covering every row only it covers. Gives the
 * literal search a good first incumbent.
 */
function swapForFewerLiterals(chosen: number[], colRows: Int32Array[], lits: number[], rowCount: number): number[] {
  const { start, cols } = rowColumns(colRows, rowCount);
  const count = new Int32Array(rowCount);
  const cur = chosen.slice();
  const inCover = new Uint8Array(colRows.length);
  for (const c of cur) inCover[c] = 1;
  for (const c of cur) for (const r of colRows[c]!) count[r]!++;
  // mark[r] === stamp: row r is one of the rows only the column under study covers.
  const mark = new Int32Array(rowCount);
  let stamp = 0;
  const own: number[] = [];
  for (let improved = true; improved; ) {
    improved = false;
    for (let i = 0; i < cur.length; i++) {
      const c = cur[i]!;
      own.length = 0;
      stamp++;
      for (const r of colRows[c]!) {
        if (count[r] === 1) {
          own.push(r);
          mark[r] = stamp;
        }
      }
      if (own.length === 0) continue;
      let best = -1;
      const r0 = own[0]!;
      for (let q = start[r0]!; q < start[r0 + 1]!; q++) {
        const d = cols[q]!;
        if (d === c || inCover[d] || lits[d]! >= lits[best < 0 ? c : best]!) continue;
        const rs = colRows[d]!;
        let hits = 0;
        for (let k = 0; k < rs.length; k++) if (mark[rs[k]!] === stamp) hits++;
        if (hits === own.length) best = d;
      }
      if (best < 0) continue;
      for (const r of colRows[c]!) count[r]!--;
      for (const r of colRows[best]!) count[r]!++;
      inCover[c] = 0;
      inCover[best] = 1;
      cur[i] = best;
      improved = true;
    }
  }
  return cur;
}

/**
 * Per output, a bound on its cost as if it stood alone: a greedy set of its
 * rows no column covers two of (fewest columns first), each charged its
 * cheapest column. Rows of one output are numbered consecutively.
 */
function outputAloneBounds(prob: CoveringProblem & { rowsPerOutput: number[] }, model: CostModel): number[] {
  const { colRows, weight, rowCount } = prob;
  const { start, cols } = rowColumns(colRows, rowCount);
  const blocked = new Int32Array(rowCount);
  const colDone = new Int32Array(colRows.length);
  let first = 0;
  return prob.rowsPerOutput.map((count, j) => {
    const lo = first;
    first += count;
    if (count === 0) return 0;
    const stamp = j + 1;
    // Fewest columns first; ties in row order (keys are unique, so a plain numeric sort does it).
    const keys = new Float64Array(count);
    for (let i = 0; i < count; i++) keys[i] = (start[lo + i + 1]! - start[lo + i]!) * 2 ** 24 + i;
    keys.sort();
    let w = 0;
    for (let k = 0; k < count; k++) {
      const r = lo + (keys[k]! % 2 ** 24);
      if (blocked[r] === stamp) continue;
      let m = Infinity;
      for (let q = start[r]!; q < start[r + 1]!; q++) {
        const c = cols[q]!;
        if (weight[c]! < m) m = weight[c]!;
        if (colDone[c] === stamp) continue;
        colDone[c] = stamp;
        const rs = colRows[c]!;
        for (let i = 0; i < rs.length; i++) blocked[rs[i]!] = stamp;
      }
      w += m;
    }
    return boundFromSurrogate(model, w, 1);
  });
}

/** Exact route over a group of outputs sharing terms. Throws ExactLimit beyond its limits. */
function exactGroup(
  n: number,
  targets: Target[],
  model: CostModel,
  limits: { maxPrimes: number; maxImplicants: number; deadline: number },
): Solved {
  const prob = buildProblem(n, targets, model, limits);
  const { rowCount } = prob;
  const all = prob.primes;
  const cols = prob.columns;
  const live = targets.filter((t, j) => t.on.length > 0 && prob.rowsPerOutput[j]! > 0).length;
  const sol = rowCount === 0 ? { chosen: [], weight: 0, lowerBound: 0, exact: true } : lexicographicCover(prob, model, limits.deadline);
  const covers = assignTerms(n, targets, sol.chosen.map((c) => cols[c]!));
  const cost = costOfCovers(model, covers);
  const bound = Math.min(cost, boundFromSurrogate(model, sol.lowerBound, live));
  // Per output: independent rows of that output alone, each charged its cheapest column.
  const outputBounds = outputAloneBounds(prob, model);
  return {
    covers,
    exact: sol.exact && cost === bound,
    designBound: Math.max(bound, ...outputBounds),
    outputBounds,
    primes: all.length,
    route: "exact",
  };
}

/** Heuristic route: a prime and irredundant cover per output, identical terms shared, proven bound. */
function heuristicAll(n: number, targets: Target[], model: CostModel, deadline: number, limit: number): Solved {
  const covers: Cube[][] = [];
  for (const t of targets) {
    try {
      covers.push(heuristicCover(n, t.on, t.dc, deadline, t.onT && t.dcT ? { on: t.onT, dc: t.dcT } : undefined));
    } catch (e) {
      if (e instanceof HeuristicTimeout) {
        throw new LimitError(
          "timeLimitMs",
          limit,
          "no prime and irredundant cover could be finished within the time limit",
          "Raise timeLimitMs, or split the design into smaller blocks.",
        );
      }
      throw e;
    }
  }
  // Candidate points: a spread sample of each output's ON points (or its cubes' corners above 20 inputs).
  const full = fullMask(n);
  const candidates: BoundPoint[] = [];
  const perOutputCap = Math.max(64, Math.floor(12000 / Math.max(1, targets.length)));
  targets.forEach((t, j) => {
    const pts = t.onT ? tableMinterms(t.onT, n) : t.on.map((c) => c.value);
    const step = Math.max(1, Math.ceil(pts.length / perOutputCap));
    for (let i = 0; i < pts.length; i += step) candidates.push({ output: j, minterm: pts[i]! });
  });
  const oracle =
    n <= TRUTH_TABLE_MAX_INPUTS
      ? tableOracle(
          targets.map((t) => {
            const c = new Uint32Array(t.onT!.length);
            for (let w = 0; w < c.length; w++) c[w] = t.onT![w]! | t.dcT![w]!;
            return c;
          }),
          n,
        )
      : cubeOracle(targets.map((t) => complement(t.on.concat(t.dc), full)));
  if (n <= TRUTH_TABLE_MAX_INPUTS) {
    // Points with few care neighbours first: they are the likeliest to be independent of the rest.
    const degree = (p: BoundPoint): number => {
      const t = targets[p.output]!;
      let d = 0;
      for (let i = 0; i < n; i++) {
        const q = (p.minterm ^ (1 << i)) >>> 0;
        if (((t.onT![q >>> 5]! | t.dcT![q >>> 5]!) >>> (q & 31)) & 1) d++;
      }
      return d;
    };
    const deg = candidates.map(degree);
    const idx = candidates.map((_, i) => i).sort((a, b) => deg[a]! - deg[b]!);
    const sorted = idx.map((i) => candidates[i]!);
    candidates.length = 0;
    candidates.push(...sorted);
  }
  const boundDeadline = Math.min(deadline, Date.now() + 2000);
  const ind = independentPoints(candidates, oracle, full, boundDeadline);
  const k = targets.map((_, j) => ind.perOutput.get(j) ?? 0);
  const perOutput = k.map((kj) => pointsToCost(model, kj, kj));
  let design: number;
  switch (model.kind) {
    case "products":
      design = ind.total;
      break;
    case "gate-inputs":
      // Connections: each output needs k_j terms; literals: independent terms are not constant 1 when ≥ 2.
      design = k.reduce((a, b) => a + b, 0) + (ind.total >= 2 ? ind.total : 0);
      break;
    case "fan-in":
      design = k.reduce((a, kj) => a + gatesFor(kj, model.fanIn), 0);
      break;
  }
  const cost = costOfCovers(model, covers);
  design = Math.min(cost, Math.max(design, ...perOutput));
  return { covers, exact: boundProves(model, cost, design), designBound: design, outputBounds: perOutput, primes: -1, route: "heuristic" };
}

/**
 * Whether a cost that meets a proven bound proves the cover minimum. Under
 * "products, then literals" the bounds count products only, so meeting one
 * says nothing of the literals: only the exact route's two-phase search, run
 * to its end, proves that model.
 */
function boundProves(model: CostModel, cost: number, bound: number): boolean {
  return model.kind !== "products" && cost === bound;
}

/** Cost bound of an output whose ON-set holds k independent points. */
function pointsToCost(model: CostModel, k: number, _indep: number): number {
  switch (model.kind) {
    case "products":
      return k;
    case "gate-inputs":
      return k >= 2 ? 2 * k : k;
    case "fan-in":
      return gatesFor(k, model.fanIn);
  }
}

/**
 * Minimizes every output of the specification as a two-level cover.
 * Defaults: SOP, the products-then-literals cost, exact route first with at
 * most 100 000 primes, 10 000 ms in total. Throws {@link LimitError} when a
 * limit stops the run (too many inputs, or not even a heuristic cover in time).
 */
export function minimize(spec: FunctionSpec, options: MinimizeOptions = {}): MinimizeResult {
  const t0 = Date.now();
  const n = spec.inputs.length;
  const form = options.form ?? DEFAULTS.form;
  const model = options.cost ?? DEFAULTS.cost;
  validateModel(model);
  const maxPrimes = options.maxPrimes ?? DEFAULTS.maxPrimes;
  const timeLimitMs = options.timeLimitMs ?? DEFAULTS.timeLimitMs;
  if (n > MAX_INPUTS) {
    throw new LimitError("MAX_INPUTS", MAX_INPUTS, `the design has ${n} inputs`, "Split the design into blocks of at most 30 inputs.");
  }
  const deadline = t0 + timeLimitMs;
  const targets = buildTargets(spec, form);
  let solved: Solved | null = null;
  const exactPossible = !options.heuristic && n <= TRUTH_TABLE_MAX_INPUTS && targets.length > 0;
  if (exactPossible) {
    // The exact route may use about 60 % of the budget; the heuristic keeps the rest.
    const limits = { maxPrimes, maxImplicants: DEFAULTS.maxImplicants, deadline: t0 + timeLimitMs * 0.6 };
    try {
      if (targets.length <= DEFAULTS.maxSharedOutputs) {
        solved = exactGroup(n, targets, model, limits);
      } else {
        const parts = targets.map((t) => exactGroup(n, [t], model, limits));
        const covers = parts.map((p) => p.covers[0]!);
        const cost = costOfCovers(model, covers);
        const outputBounds = parts.map((p) => p.designBound);
        const designBound = Math.min(cost, Math.max(...outputBounds));
        // Outputs covered one by one cannot prove a shared optimum: only a met bound of a cost-only model does.
        const exact = parts.every((p) => p.exact) && boundProves(model, cost, designBound);
        solved = { covers, exact, designBound, outputBounds, primes: parts.reduce((a, p) => a + p.primes, 0), route: "exact" };
      }
    } catch (e) {
      if (!(e instanceof ExactLimit)) throw e;
      solved = null;
    }
    // A search cut short keeps its cover only if the heuristic does not beat it.
    if (solved && !solved.exact && Date.now() < deadline) {
      let h: Solved | null = null;
      try {
        h = heuristicAll(n, targets, model, deadline, timeLimitMs);
      } catch (e) {
        if (!(e instanceof LimitError)) throw e;
      }
      if (h && costOfCovers(model, h.covers) < costOfCovers(model, solved.covers)) {
        solved = { ...h, designBound: Math.max(h.designBound, solved.designBound), primes: solved.primes };
      }
      solved.exact = boundProves(model, costOfCovers(model, solved.covers), solved.designBound);
    }
  }
  solved ??= heuristicAll(n, targets, model, deadline, timeLimitMs);

  // Canonical order: fewer literals first, then by the earliest declared inputs.
  const order = (a: Cube, b: Cube) => popcount(a.mask) - popcount(b.mask) || b.mask - a.mask || b.value - a.value;
  const outCubes = solved.covers.map((cv) =>
    (form === "sop" ? cv.slice() : cv.map((c) => ({ value: (~c.value & c.mask) >>> 0, mask: c.mask }))).sort(order),
  );
  const verdict = verifyCovers(spec, outCubes.map((cubes) => ({ form, cubes })));
  if (!verdict.ok) {
    throw new Error(
      `internal error: the ${form} cover of ${verdict.output} fails at minterm ${verdict.minterm} (${verdict.kind}); please report this design`,
    );
  }
  let shared = 0;
  if (solved.covers.length > 1) {
    const uses = new Map<number, number>();
    for (const cv of solved.covers) for (const c of new Set(cv.map(cubeKey))) uses.set(c, (uses.get(c) ?? 0) + 1);
    shared = [...uses.values()].filter((u) => u > 1).length;
  }
  const outputs: MinimizedOutput[] = spec.outputs.map((o, j) => {
    const cubes = outCubes[j]!;
    const own = costOfCovers(model, [solved.covers[j]!]);
    return {
      name: o.name,
      form,
      cubes,
      expression: formatCover(cubes, spec.inputs, form),
      products: cubes.length,
      literals: cubes.reduce((a, c) => a + popcount(c.mask), 0),
      exact: solved.exact,
      lowerBound: Math.min(own, solved.outputBounds[j] ?? 0),
    };
  });
  void sameCube;
  return {
    inputs: spec.inputs.slice(),
    outputs,
    shared,
    exact: solved.exact,
    ms: Date.now() - t0,
    cost: costOfCovers(model, solved.covers),
    lowerBound: solved.designBound,
    primes: solved.primes,
    route: solved.route,
  };
}
