/**
 * Exact multi-output two-level minimization with don't-cares.
 *
 * Route: multi-output primes (./primes: from compact cube covers by the
 * recursive prime rule when that is cheap, else by Quine–McCluskey tables or
 * a dense ternary table), then an exact cover of the (output, ON-minterm)
 * pairs (./cover), where a term shared by
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
  /** costOfCovers of `covers`. */
  cost: number;
  exact: boolean;
  designBound: number;
  outputBounds: number[];
  primes: number;
  route: "exact" | "heuristic";
}

/**
 * Distinct terms of one or more covers: open addressing on (mask, value),
 * which fit 30 bits each. Covers of tens of thousands of terms make a Map or
 * a sort the slow part of pricing them.
 */
class TermTable {
  /** Slot i holds mask + 1 at 2i (0 when free) and value at 2i + 1. */
  private readonly cells: Int32Array;
  private readonly shift: number;
  /** Literal count of every distinct term, in the order first seen. */
  readonly literals: number[] = [];

  constructor(capacity: number) {
    // More than twice as many slots as terms.
    const bits = Math.max(4, 33 - Math.clz32(capacity));
    this.shift = 32 - bits;
    this.cells = new Int32Array(2 << bits);
  }

  /** Number of slots: slot() returns indices below it. */
  get slots(): number {
    return this.cells.length >>> 1;
  }

  /** Slot of the term; a new term takes a free slot. */
  slot(c: Cube): number {
    const cells = this.cells;
    const last = (cells.length >>> 1) - 1;
    const mask = c.mask | 0;
    const value = c.value | 0;
    let i = Math.imul(mask ^ Math.imul(value, 0x85ebca6b), 0x9e3779b1) >>> this.shift;
    for (;;) {
      const m = cells[2 * i]!;
      if (m === 0) {
        cells[2 * i] = mask + 1;
        cells[2 * i + 1] = value;
        this.literals.push(popcount(mask));
        return i;
      }
      if (m === mask + 1 && cells[2 * i + 1] === value) return i;
      i = (i + 1) & last;
    }
  }
}

/**
 * Per output, drop chosen terms that the output's other terms already cover,
 * costliest first (ties in the order chosen). Works on the rows of the
 * covering problem: the rows of output j that column c covers are its ON
 * points of output j. Rows of different outputs are disjoint, so one pass in
 * the global order makes, for each output, the decisions its own pass would.
 * Also returns the literal count of each term kept by some output: the
 * columns are distinct primes, so these are the design's distinct terms.
 */
function assignTerms(
  n: number,
  k: number,
  prob: CoveringProblem & { rowsPerOutput: number[] },
  chosen: number[],
): { covers: Cube[][]; literals: number[] } {
  const { colRows, rowCount } = prob;
  const rowOutput = new Uint8Array(rowCount);
  for (let j = 0, r = 0; j < k; j++) for (let e = r + prob.rowsPerOutput[j]!; r < e; r++) rowOutput[r] = j;
  // count[r]: chosen terms, not yet dropped for r's output, that cover row r.
  const count = new Int32Array(rowCount);
  const lits = new Int32Array(chosen.length);
  for (let i = 0; i < chosen.length; i++) {
    const rs = colRows[chosen[i]!]!;
    for (let x = 0; x < rs.length; x++) count[rs[x]!]!++;
    lits[i] = popcount(prob.columns[chosen[i]!]!.mask);
  }
  // Stable order by literals, most first (a counting sort: ties keep the chosen order).
  const bucket = new Int32Array(n + 2);
  for (let i = 0; i < lits.length; i++) bucket[n - lits[i]! + 1]!++;
  for (let l = 0; l <= n; l++) bucket[l + 1]! += bucket[l]!;
  const order = new Int32Array(chosen.length);
  for (let i = 0; i < chosen.length; i++) order[bucket[n - lits[i]!]!++] = i;
  // dropped[i]: outputs (bits) for which the i-th chosen term is redundant.
  const dropped = new Int32Array(chosen.length);
  const outputs = k >= 31 ? 0x7fffffff : (1 << k) - 1;
  for (let q = 0; q < order.length; q++) {
    const i = order[q]!;
    const rs = colRows[chosen[i]!]!;
    const tag = prob.columns[chosen[i]!]!.tag & outputs;
    // Outputs for which the term covers a row no other kept term covers; once all its outputs, nothing to drop.
    let needed = 0;
    for (let x = 0; x < rs.length && needed !== tag; x++) if (count[rs[x]!]! <= 1) needed |= 1 << rowOutput[rs[x]!]!;
    const drop = tag & ~needed;
    if (drop === 0) continue;
    dropped[i] = drop;
    for (let x = 0; x < rs.length; x++) if ((drop >>> rowOutput[rs[x]!]!) & 1) count[rs[x]!]!--;
  }
  const covers: Cube[][] = Array.from({ length: k }, () => []);
  const literals: number[] = [];
  for (let i = 0; i < chosen.length; i++) {
    const p = prob.columns[chosen[i]!]!;
    const kept = p.tag & outputs & ~dropped[i]!;
    if (kept !== 0) literals.push(lits[i]!);
    for (let keep = kept; keep !== 0; keep &= keep - 1) {
      covers[31 - Math.clz32(keep & -keep)]!.push({ value: p.value, mask: p.mask });
    }
  }
  return { covers, literals };
}

function costOfCovers(model: CostModel, covers: Cube[][]): number {
  let total = 0;
  for (const cv of covers) total += cv.length;
  const terms = new TermTable(total);
  for (const cv of covers) for (let i = 0; i < cv.length; i++) terms.slot(cv[i]!);
  return designCost(model, terms.literals, covers.map((c) => c.length));
}

/** The covering problem of the exact route: rows (output, ON minterm), columns multi-output primes. */
export interface CoveringProblem {
  /** All multi-output primes (value, mask, tag: bit j = output j). */
  primes: TaggedPrime[];
  /** The primes that reach at least one row, in column order. */
  columns: TaggedPrime[];
  /** colRows[c]: rows covered by column c (read-only views into one shared buffer, from problemFromPrimes). */
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
  const weight: number[] = [];
  const cols: TaggedPrime[] = [];
  // Every column's rows in one buffer (column i's at ends[i - 1] .. ends[i]), cut into views at the end:
  // hundreds of small arrays of their own cost more to allocate and collect than the rest of this.
  let buf = new Int32Array(4096);
  let len = 0;
  const ends: number[] = [];
  for (const p of all) {
    const len0 = len;
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
    if (len === len0) continue;
    cols.push(p);
    ends.push(len);
    weight.push(columnWeight(model, popcount(p.mask)));
  }
  const colRows: Int32Array[] = [];
  for (let i = 0, at = 0; i < ends.length; at = ends[i++]!) colRows.push(buf.subarray(at, ends[i]!));
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
function lexicographicCover(prob: CoveringProblem, model: CostModel, deadline: number, rc: RowColumns) {
  const { colRows, weight, rowCount } = prob;
  const only = essentialCover(colRows, rc, rowCount);
  if (only) {
    // Every cover holds the essential columns, and they cover every row: they are the one minimum cover.
    let w = 0;
    for (let i = 0; i < only.length; i++) w += weight[only[i]!]!;
    return { chosen: only, weight: w, lowerBound: w, exact: true };
  }
  if (model.kind !== "products") return solveCover({ colRows, weight, rowCount, deadline, rowCols: rc });
  const lits = prob.columns.map((p) => popcount(p.mask));
  // One root LP over the combined weight first: when its rounding meets its bound the cover is
  // lexicographically minimum as well, provided no cover with fewer products can make up the product
  // weight in literals (PRODUCT_WEIGHT ≥ most literals × products).
  const s0 = solveCover({ colRows, weight, rowCount, deadline, rootOnly: true, rowCols: rc });
  let mostLits = 1;
  for (let c = 0; c < lits.length; c++) if (lits[c]! > mostLits) mostLits = lits[c]!;
  if (s0.exact && PRODUCT_WEIGHT >= mostLits * s0.chosen.length) {
    return { chosen: s0.chosen, weight: s0.weight, lowerBound: s0.weight, exact: true };
  }
  // The root's rounded cover, when there is one, starts both searches.
  const first = Number.isFinite(s0.weight) ? s0.chosen : undefined;
  // The root's bound proves the fewest products when no cover of one product less reaches it
  // (each of its products weighs at most PRODUCT_WEIGHT + mostLits): the product search is then not needed.
  const proven = first !== undefined && s0.lowerBound > (first.length - 1) * (PRODUCT_WEIGHT + mostLits);
  const s1 = proven
    ? { chosen: first, exact: true, lowerBound: first.length }
    : solveCover({ colRows, weight: lits.map(() => 1), rowCount, deadline, rowCols: rc, incumbent: first });
  const P = s1.chosen.length;
  let start = swapForFewerLiterals(s1.chosen, colRows, lits, rowCount, rc);
  if (first && first.length <= P) {
    const litsOf = (cs: number[]) => cs.reduce((a, c) => a + lits[c]!, 0);
    if (litsOf(first) < litsOf(start)) start = first;
  }
  // The root's cuts hold for the literal search too: its root reductions, the same under the literal weights, are checked.
  const s2 = solveCover({ colRows, weight: lits, rowCount, deadline, incumbent: start, maxColumns: P, rowCols: rc, cuts: s0.cuts });
  const chosen = s2.chosen.length === P || !s1.exact ? s2.chosen : s1.chosen;
  const w = chosen.reduce((a, c) => a + weight[c]!, 0);
  // Bound in the combined scale: at least the proven product count, each with at least one literal... kept simple:
  // products bound times the product weight (literals add nothing to the bound).
  const lb = s1.exact && s2.exact ? w : Math.min(w, s1.lowerBound * PRODUCT_WEIGHT);
  return { chosen, weight: w, lowerBound: lb, exact: s1.exact && s2.exact };
}

type RowColumns = ReturnType<typeof rowColumns>;

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
 * One-for-one swaps that keep the cover and lower its literals: a column can
 * give way to a cheaper one covering every row only it covers. Gives the
 * literal search a good first incumbent.
 */
function swapForFewerLiterals(chosen: number[], colRows: Int32Array[], lits: number[], rowCount: number, rc: RowColumns): number[] {
  const { start, cols } = rc;
  const count = new Int32Array(rowCount);
  const cur = chosen.slice();
  const inCover = new Uint8Array(colRows.length);
  for (const c of cur) inCover[c] = 1;
  for (const c of cur) for (const r of colRows[c]!) count[r]!++;
  // The rows only the column under study covers.
  const own: number[] = [];
  // Whether column d covers every row of `own`: d among each row's columns (ascending), first miss ends it.
  const coversOwn = (d: number): boolean => {
    if (colRows[d]!.length < own.length) return false;
    for (let k = 0; k < own.length; k++) {
      const r = own[k]!;
      let q = start[r]!;
      const end = start[r + 1]!;
      while (q < end && cols[q]! < d) q++;
      if (q === end || cols[q] !== d) return false;
    }
    return true;
  };
  for (let improved = true; improved; ) {
    improved = false;
    for (let i = 0; i < cur.length; i++) {
      const c = cur[i]!;
      const rows = colRows[c]!;
      let first = 0;
      while (first < rows.length && count[rows[first]!] !== 1) first++;
      if (first === rows.length) continue;
      // A replacement covers the first own row and has fewer literals; without one, the other own rows do not matter.
      const r0 = rows[first]!;
      let some = false;
      for (let q = start[r0]!; q < start[r0 + 1]! && !some; q++) {
        const d = cols[q]!;
        some = d !== c && !inCover[d] && lits[d]! < lits[c]!;
      }
      if (!some) continue;
      own.length = 0;
      for (let k = first; k < rows.length; k++) if (count[rows[k]!] === 1) own.push(rows[k]!);
      let best = -1;
      for (let q = start[r0]!; q < start[r0 + 1]!; q++) {
        const d = cols[q]!;
        if (d === c || inCover[d] || lits[d]! >= lits[best < 0 ? c : best]!) continue;
        if (coversOwn(d)) best = d;
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
  const live = targets.filter((t, j) => t.on.length > 0 && prob.rowsPerOutput[j]! > 0).length;
  // Rows → columns, once for the steps below and the cover searches.
  const rc = rowColumns(prob.colRows, rowCount);
  const sol = rowCount === 0 ? { chosen: [], weight: 0, lowerBound: 0, exact: true } : lexicographicCover(prob, model, limits.deadline, rc);
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
  return { covers, cost, exact: boundProves(model, cost, design), designBound: design, outputBounds: perOutput, primes: -1, route: "heuristic" };
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
  // Value bits outside a cube's mask are no literals (lib/logic's cube definition); drop them once here.
  const clean = (cs: Cube[]): Cube[] => (cs.some((c) => (c.value & ~c.mask) !== 0) ? cs.map((c) => ({ value: (c.value & c.mask) >>> 0, mask: c.mask })) : cs);
  spec = { ...spec, outputs: spec.outputs.map((o) => ({ ...o, on: clean(o.on), dc: clean(o.dc) })) };
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
        solved = { covers, cost, exact, designBound, outputBounds, primes: parts.reduce((a, p) => a + p.primes, 0), route: "exact" };
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
      if (h && h.cost < solved.cost) {
        solved = { ...h, designBound: Math.max(h.designBound, solved.designBound), primes: solved.primes };
      }
      solved.exact = boundProves(model, solved.cost, solved.designBound);
    }
  }
  solved ??= heuristicAll(n, targets, model, deadline, timeLimitMs);

  // Canonical order: fewer literals first, then by the earliest declared inputs.
  const outCubes = solved.covers.map((cv) => canonicalOrder(cv, n, form === "pos"));
  const verdict = verifyCovers(spec, outCubes.map((cubes) => ({ form, cubes })));
  if (!verdict.ok) {
    throw new Error(
      `internal error: the ${form} cover of ${verdict.output} fails at minterm ${verdict.minterm} (${verdict.kind}); please report this design`,
    );
  }
  let shared = 0;
  if (solved.covers.length > 1) {
    // Terms in more than one output: count each term once per output that uses it.
    const terms = new TermTable(solved.covers.reduce((a, cv) => a + cv.length, 0));
    const lastOutput = new Int32Array(terms.slots).fill(-1);
    const uses = new Int32Array(terms.slots);
    solved.covers.forEach((cv, j) => {
      for (const c of cv) {
        const s = terms.slot(c);
        if (lastOutput[s] === j) continue;
        lastOutput[s] = j;
        if (++uses[s]! === 2) shared++;
      }
    });
  }
  const cost = solved.cost;
  const outputs: MinimizedOutput[] = spec.outputs.map((o, j) => {
    const cubes = outCubes[j]!;
    const own = solved.covers.length === 1 ? cost : costOfCovers(model, [solved.covers[j]!]);
    return {
      name: o.name,
      form,
      cubes,
      expression: formatCover(cubes, spec.inputs, form),
      products: cubes.length,
      literals: literalsOf(cubes),
      exact: solved.exact,
      lowerBound: Math.min(own, solved.outputBounds[j] ?? 0),
    };
  });
  return {
    inputs: spec.inputs.slice(),
    outputs,
    shared,
    exact: solved.exact,
    ms: Date.now() - t0,
    cost,
    lowerBound: solved.designBound,
    primes: solved.primes,
    route: solved.route,
  };
}

function literalsOf(cubes: readonly Cube[]): number {
  let total = 0;
  for (let i = 0; i < cubes.length; i++) total += popcount(cubes[i]!.mask);
  return total;
}

/**
 * A cover's terms in canonical order: fewer literals first, then the larger
 * mask, then the larger value (earliest declared inputs first, plain before
 * complemented); ties keep their order. With `invert`, POS sum terms: every
 * literal inverted. Up to 27 inputs the keys fit two 32-bit words, sorted by
 * a stable radix sort (a comparison sort of tens of thousands of terms is
 * the slow part otherwise).
 */
function canonicalOrder(cv: readonly Cube[], n: number, invert: boolean): Cube[] {
  const len = cv.length;
  const out: Cube[] = new Array<Cube>(len);
  for (let i = 0; i < len; i++) {
    const c = cv[i]!;
    out[i] = invert ? { value: (~c.value & c.mask) >>> 0, mask: c.mask } : c;
  }
  if (n > 27) {
    return out.sort((a, b) => popcount(a.mask) - popcount(b.mask) || b.mask - a.mask || b.value - a.value);
  }
  const full = fullMask(n);
  const scale = 2 ** n;
  // Ascending (hi, lo) with hi = literals · 2^n + (full - mask), lo = full - value.
  const hi = new Uint32Array(len);
  const lo = new Uint32Array(len);
  for (let i = 0; i < len; i++) {
    const c = out[i]!;
    hi[i] = popcount(c.mask) * scale + (full - c.mask);
    lo[i] = full - c.value;
  }
  // Terms often arrive in one run (the cover search lists them by row): then a scan orders them.
  let rising = true;
  let falling = true;
  for (let i = 1; i < len && (rising || falling); i++) {
    const d = hi[i]! - hi[i - 1]! || lo[i]! - lo[i - 1]!;
    if (d < 0) rising = false;
    if (d >= 0) falling = false;
  }
  if (rising) return out;
  if (falling) return out.reverse();
  let perm = new Int32Array(len);
  for (let i = 0; i < len; i++) perm[i] = i;
  let next = new Int32Array(len);
  const count = new Int32Array(257);
  // Least significant byte first: the bytes of lo, then those of hi.
  const loPasses = Math.ceil(n / 8);
  const passes = loPasses + Math.ceil((n + 5) / 8);
  for (let pass = 0; pass < passes; pass++) {
    const keys = pass < loPasses ? lo : hi;
    const shift = 8 * (pass < loPasses ? pass : pass - loPasses);
    count.fill(0);
    for (let i = 0; i < len; i++) count[((keys[i]! >>> shift) & 255) + 1]!++;
    // One byte value throughout: the pass would move nothing.
    if (len === 0 || count[((keys[0]! >>> shift) & 255) + 1] === len) continue;
    for (let d = 0; d < 256; d++) count[d + 1]! += count[d]!;
    for (let i = 0; i < len; i++) {
      const p = perm[i]!;
      next[count[(keys[p]! >>> shift) & 255]!++] = p;
    }
    const t = perm;
    perm = next;
    next = t;
  }
  const sorted: Cube[] = new Array<Cube>(len);
  for (let i = 0; i < len; i++) sorted[i] = out[perm[i]!]!;
  return sorted;
}
