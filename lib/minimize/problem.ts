/**
 * The covering problem of the exact route: rows are (output, ON minterm)
 * pairs, columns the multi-output primes that reach a row. The primes come
 * from one of the routes of ./primes, chosen by what each would cost: the
 * recursive rule on compact cube covers when cheap, else a dense ternary
 * table or Quine–McCluskey tables.
 */
import type { FunctionSpec } from "../logic";
import { LOW_VARIABLE_WORDS, fullMask, popcount, tableMinterms } from "../logic";
import { columnWeight } from "./cost";
import type { CoverTuning } from "./cover";
import { DENSE_MAX_INPUTS, ExactLimit, compactCover, coverTaggedPrimes, denseTaggedPrimes, taggedPrimes, type TaggedPrime } from "./primes";
import type { Reporter } from "./progress";
import { buildTargets, type Target } from "./target";
import { type CostModel, DEFAULTS } from "./types";
import { OverBudget, WorkBudget } from "./unate";

/** The exact route's limits (primes, implicants the tables may hold, the Date.now() deadline) and its searches' settings. */
export interface ExactSettings {
  maxPrimes: number;
  maxImplicants: number;
  deadline: number;
  /** Date.now() milliseconds at which the cover searches stop; default `deadline`. */
  coverDeadline?: number;
  /** Settings of the cover searches; default DEFAULT_TUNING of ./cover. */
  tuning?: CoverTuning;
  /** Where the route reports what it finds (primes, covers, bounds); default nowhere. */
  progress?: Reporter;
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

export function buildProblem(
  n: number,
  targets: Target[],
  model: CostModel,
  limits: ExactSettings,
): CoveringProblem & { rowsPerOutput: number[] } {
  return problemFromPrimes(n, targets, model, multiOutputPrimes(n, targets, limits));
}

/** The multi-output primes of the targets (n ≤ TRUTH_TABLE_MAX_INPUTS), by the route that costs least. Throws ExactLimit beyond the limits. */
export function multiOutputPrimes(n: number, targets: Target[], limits: ExactSettings): TaggedPrime[] {
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
  return all;
}

/** Pairs of care points one variable apart (n ≥ 5, bit-parallel over the table). */
function adjacentPairs(care: Uint32Array, n: number): number {
  let pairs = 0;
  for (let i = 0; i < Math.min(n, 5); i++) {
    const sh = 1 << i;
    // The pair's lower point has variable i at 0.
    const zero = ~LOW_VARIABLE_WORDS[i]!;
    for (let w = 0; w < care.length; w++) pairs += popcount(care[w]! & (care[w]! >>> sh) & zero);
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
  limits: ExactSettings,
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

/** The covering problem over the given primes: rows (output, ON minterm) numbered output by output in minterm order. */
export function problemFromPrimes(n: number, targets: Target[], model: CostModel, all: TaggedPrime[]): CoveringProblem & { rowsPerOutput: number[] } {
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

