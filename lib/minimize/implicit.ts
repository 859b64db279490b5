/**
 * Exact covering with rows made on demand, for functions with few primes and
 * a great many ON points: a wide "not all inputs equal" function has n(n−1)
 * primes and 2^n − 2 ON points, and a priority encoder's valid output 2^n − 1
 * of them, far too many rows to list (above 20 inputs, too many to count).
 *
 * The search starts from a few rows (ON points spread over each output),
 * finds a minimum cover of them (./exact's searches), then asks where that
 * cover misses an ON point: those points become rows, and the search runs
 * again. A minimum cover of some of the rows is a lower bound for all of
 * them, so the first cover that misses nothing is a minimum cover of the
 * function; a run cut short keeps the bound of its last complete search,
 * and its last cover completed by the primes that reach the points it
 * misses.
 *
 * When the minimum holds for a few rounds while rows are added, a cover of
 * that size likely exists, and searching from scratch each round finds one
 * slowly (a wide "not all equal" function's minimum is a ring of arrows
 * i → j; each round's search finds rings that fall apart into several, a new
 * way each time). A local search then moves the last cover, as many columns
 * at a time, to cover the new rows, and asks again: it mends one ring after
 * another within a few rounds.
 */
import type { Cube } from "../logic";
import { fullMask, popcount, tableAddCube } from "../logic";
import { boundFromSurrogate, columnWeight, designCost } from "./cost";
import { rowColumns } from "./cover";
import { unicostLocalSearch } from "./cover/local";
import { lexicographicCover } from "./lexicographic";
import type { CoveringProblem, ExactSettings } from "./problem";
import type { TaggedPrime } from "./primes";
import type { Solved } from "./solved";
import type { Target } from "./target";
import type { CostModel } from "./types";
import { OverBudget, WorkBudget, cofactorCube, complement, primesOfCover, tautology } from "./unate";

/** Where the ON points are: which points of an output a set of cubes misses. */
export interface PointSpace {
  /** Up to `k` ON points of output j that no cube of `cubes` holds, spread over them; [] when none. */
  missed(j: number, cubes: readonly Cube[], k: number): number[];
  /** Whether `cubes` hold every ON point of output j inside `within`. */
  holds(j: number, cubes: readonly Cube[], within: Cube): boolean;
}

/** Points on truth tables (n ≤ TRUTH_TABLE_MAX_INPUTS). */
export function tableSpace(targets: Target[], n: number): PointSpace {
  const words = targets[0]!.onT!.length;
  const union = (cubes: readonly Cube[]) => {
    const t = new Uint32Array(words);
    for (const c of cubes) tableAddCube(t, c, n);
    return t;
  };
  return {
    missed(j, cubes, k) {
      const on = targets[j]!.onT!;
      const u = union(cubes);
      let total = 0;
      for (let w = 0; w < words; w++) total += popcount(on[w]! & ~u[w]!);
      if (total === 0) return [];
      // Every step-th missed point, so that the rows spread over the function.
      const step = Math.max(1, Math.floor(total / k));
      const out: number[] = [];
      let seen = 0;
      for (let w = 0; w < words && out.length < k; w++) {
        for (let x = on[w]! & ~u[w]!; x !== 0 && out.length < k; x &= x - 1) {
          if (seen++ % step === 0) out.push(w * 32 + 31 - Math.clz32(x & -x));
        }
      }
      return out;
    },
    holds(j, cubes, within) {
      const on = targets[j]!.onT!;
      const u = union(cubes);
      const w0 = union([within]);
      for (let w = 0; w < words; w++) if ((on[w]! & w0[w]! & ~u[w]!) !== 0) return false;
      return true;
    },
  };
}

/**
 * Points on cube lists (above the truth tables): a missed point is found by
 * halving an ON cube the cubes do not hold (a tautology test on their
 * cofactor) down to a minterm, keeping a half they do not hold.
 */
export function cubeSpace(targets: Target[], n: number): PointSpace {
  const full = fullMask(n);
  const inside = (cubes: readonly Cube[], o: Cube) => tautology(cofactorCube(cubes, o), (full & ~o.mask) >>> 0);
  return {
    missed(j, cubes, k) {
      const on = targets[j]!.on;
      const out: number[] = [];
      const offer = (m: number) => {
        if (!out.includes(m)) out.push(m);
      };
      const step = Math.max(1, Math.floor(on.length / k));
      // What the cubes miss, as cubes, when that is cheap to work out: a cover near the function's misses
      // little. Each ON cube's part of it offers two corners, its free inputs at 0 and at 1.
      let holes: Cube[] | null = null;
      try {
        holes = complement(cubes, full, new WorkBudget(HOLE_WORK));
      } catch (e) {
        if (!(e instanceof OverBudget)) throw e;
      }
      if (holes) {
        for (let pass = 0; pass < 2 && out.length < k; pass++) {
          for (let i = pass; i < on.length && out.length < k; i += pass === 0 ? step : 1) {
            const o = on[i]!;
            for (const q of holes) {
              if (((o.value ^ q.value) & o.mask & q.mask) !== 0) continue;
              const mask = (o.mask | q.mask) >>> 0;
              const low = (o.value | q.value) >>> 0;
              offer(low);
              offer((low | (full & ~mask)) >>> 0);
            }
          }
        }
        return out;
      }
      // Else each ON cube the cubes do not hold is halved down to a point (a tautology test a half),
      // keeping a half they do not hold, the one with the free input at 0 first.
      for (let pass = 0; pass < 2 && out.length < k; pass++) {
        for (let i = pass; i < on.length && out.length < k; i += pass === 0 ? step : 1) {
          let o = on[i]!;
          if (inside(cubes, o)) continue;
          for (let free = (full & ~o.mask) >>> 0; free !== 0; free = (full & ~o.mask) >>> 0) {
            const bit = free & -free;
            const low = { value: o.value, mask: (o.mask | bit) >>> 0 };
            o = inside(cubes, low) ? { value: (o.value | bit) >>> 0, mask: (o.mask | bit) >>> 0 } : low;
          }
          offer(o.value);
        }
      }
      return out;
    },
    holds(j, cubes, within) {
      for (const o of targets[j]!.on) {
        if (((o.value ^ within.value) & o.mask & within.mask) !== 0) continue;
        const part = { value: (o.value | within.value) >>> 0, mask: (o.mask | within.mask) >>> 0 };
        if (!inside(cubes, part)) return false;
      }
      return true;
    },
  };
}

/** Work allowed to the complement of a cover (units of ./unate's COST, about a nanosecond). */
const HOLE_WORK = 500_000_000;

/** The local search of a repair: at most this many steps per row, and this share of the time left. */
const REPAIR_STEPS_PER_ROW = 20;
const REPAIR_TIME_SHARE = 0.25;
/** Rounds the minimum must hold, unchanged, before a repair is tried. */
const REPAIR_AFTER = 2;

/** Rows added per output at each round, the strongest of OFFERED times as many missed points. */
const ROWS_PER_ROUND = 24;
const OFFERED = 16;

/**
 * A minimum cover of the targets by the given primes, with rows made on
 * demand (see above). `complete`: the primes are all the multi-output
 * primes, so a minimum over them is the function's minimum.
 */
export function implicitCover(
  n: number,
  targets: Target[],
  model: CostModel,
  primes: TaggedPrime[],
  space: PointSpace,
  settings: ExactSettings,
  complete: boolean,
): Solved {
  const k = targets.length;
  const live = targets.filter((t) => t.on.length > 0).length;
  settings.progress?.update({ primes: primes.length });
  const weight = primes.map((p) => columnWeight(model, popcount(p.mask)));
  const colRows: number[][] = primes.map(() => []);
  const seen = new Set<number>();
  let rowCount = 0;
  const rowsPerOutput = new Array<number>(k).fill(0);
  const addRow = (j: number, m: number) => {
    const key = j * 2 ** 30 + m;
    if (seen.has(key)) return;
    seen.add(key);
    const r = rowCount++;
    rowsPerOutput[j]!++;
    for (let c = 0; c < primes.length; c++) {
      const p = primes[c]!;
      if ((p.tag >>> j) & 1 && ((m ^ p.value) & p.mask) === 0) colRows[c]!.push(r);
    }
  };
  // Of the points offered, those the fewest primes reach: they constrain a cover most.
  const reach = (j: number, m: number) => {
    let count = 0;
    for (const p of primes) if ((p.tag >>> j) & 1 && ((m ^ p.value) & p.mask) === 0) count++;
    return count;
  };
  const strongest = (j: number, cubes: readonly Cube[]) => {
    const offered = space.missed(j, cubes, ROWS_PER_ROUND * OFFERED);
    const by = offered.map((m) => ({ m, c: reach(j, m) })).sort((a, b) => a.c - b.c || a.m - b.m);
    return by.slice(0, ROWS_PER_ROUND).map((x) => x.m);
  };
  for (let j = 0; j < k; j++) for (const m of strongest(j, [])) addRow(j, m);
  let chosen: number[] = [];
  let lowerBound = 0;
  let solvedAll = false;
  let exactRounds = true;
  const missedBy = (cover: number[]) => {
    let added = 0;
    for (let j = 0; j < k; j++) {
      const cubes = cover.filter((c) => (primes[c]!.tag >>> j) & 1).map((c) => primes[c]!);
      for (const m of strongest(j, cubes)) {
        addRow(j, m);
        added++;
      }
    }
    return added;
  };
  const deadline = settings.coverDeadline ?? settings.deadline;
  /**
   * A cover of fewest columns for the rows so far, which misses points (rows by now): a local search
   * (./cover/local) moves it, as many columns at a time, until it covers every row again, and the function
   * is asked again what the new cover misses. Returns a cover that misses nothing, or null when the search
   * finds no cover of the rows of as many columns within its steps or by `until`.
   */
  const repair = (start: number[], until: number): number[] | null => {
    let cover = start;
    for (let round = 1; Date.now() < until; round++) {
      const rowCols: number[][] = Array.from({ length: rowCount }, () => []);
      colRows.forEach((rs, c) => {
        for (const r of rs) rowCols[r]!.push(c);
      });
      // The cover, completed by the first column of each row it misses, is where the search starts.
      const covered = new Uint8Array(rowCount);
      for (const c of cover) for (const r of colRows[c]!) covered[r] = 1;
      const from = cover.slice();
      for (let r = 0; r < rowCount; r++) {
        if (covered[r]) continue;
        const c = rowCols[r]![0]!;
        from.push(c);
        for (const q of colRows[c]!) covered[q] = 1;
      }
      const found = unicostLocalSearch({ rowCount, colRows, rowCols }, from, {
        target: cover.length,
        maxSteps: REPAIR_STEPS_PER_ROW * rowCount,
        deadline: until,
        seed: round,
      });
      if (found.length > cover.length) return null;
      cover = found;
      if (missedBy(cover) === 0) return cover;
    }
    return null;
  };
  let previous = -1;
  let held = 0;
  for (;;) {
    const prob: CoveringProblem = {
      primes,
      columns: primes,
      colRows: colRows.map((rs) => Int32Array.from(rs)),
      weight,
      rowCount,
    };
    // A cover of some rows covers nothing yet; a bound over them is the design's when the primes are all.
    const report = complete && settings.progress ? { progress: settings.progress, live, covers: false } : undefined;
    const sol = lexicographicCover(prob, model, settings, rowColumns(prob.colRows, rowCount), report);
    chosen = sol.chosen;
    // A minimum over some rows bounds the minimum over all of them.
    lowerBound = Math.max(lowerBound, sol.lowerBound);
    if (complete) settings.progress?.update({ lowerBound: boundFromSurrogate(model, lowerBound, live) });
    exactRounds = sol.exact;
    const added = missedBy(chosen);
    if (added === 0) {
      solvedAll = true;
      break;
    }
    if (!sol.exact || Date.now() > deadline) break;
    // The minimum held as rows were added: a cover of that many columns is likely to exist, and the local
    // search looks for one among the rows to come far faster than a search from scratch each round.
    held = sol.weight === previous ? held + 1 : 0;
    previous = sol.weight;
    if (held >= REPAIR_AFTER) {
      held = 0;
      const fixed = repair(chosen, Date.now() + (deadline - Date.now()) * REPAIR_TIME_SHARE);
      if (fixed) {
        chosen = fixed;
        solvedAll = true;
        // Minimum when it weighs what the minimum over the rows does (as many columns may differ in literals).
        exactRounds = fixed.reduce((a, c) => a + weight[c]!, 0) <= sol.lowerBound;
        break;
      }
    }
  }
  // Cut short: the points the cover misses get, one at a time, the cheapest prime that reaches them.
  const inCover = new Set(chosen);
  for (let j = 0; j < k && !solvedAll; j++) {
    for (;;) {
      const cubes = [...inCover].filter((c) => (primes[c]!.tag >>> j) & 1).map((c) => primes[c]!);
      const miss = space.missed(j, cubes, 1);
      if (miss.length === 0) break;
      const m = miss[0]!;
      let best = -1;
      for (let c = 0; c < primes.length; c++) {
        const p = primes[c]!;
        if (!((p.tag >>> j) & 1) || ((m ^ p.value) & p.mask) !== 0) continue;
        if (best < 0 || weight[c]! < weight[best]!) best = c;
      }
      inCover.add(best);
    }
  }
  // Per output, its terms among the chosen, costliest first dropped when the others hold its points.
  const covers: Cube[][] = [];
  for (let j = 0; j < k; j++) {
    let terms = [...inCover].filter((c) => (primes[c]!.tag >>> j) & 1).sort((a, b) => popcount(primes[b]!.mask) - popcount(primes[a]!.mask));
    for (const c of terms.slice()) {
      const others = terms.filter((d) => d !== c).map((d) => primes[d]!);
      if (space.holds(j, others, primes[c]!)) terms = terms.filter((d) => d !== c);
    }
    covers.push(terms.map((c) => ({ value: primes[c]!.value, mask: primes[c]!.mask })));
  }
  const distinct = new Map<string, number>();
  for (const cv of covers) for (const c of cv) distinct.set(`${c.value}/${c.mask}`, popcount(c.mask));
  const cost = designCost(model, [...distinct.values()], covers.map((c) => c.length));
  // Over some of the primes only (several outputs above the tables: no primes of their products), a minimum
  // bounds nothing: a shared term outside them may serve several outputs at once.
  const bound = complete ? Math.min(cost, boundFromSurrogate(model, lowerBound, live)) : 0;
  settings.progress?.update({ cost, lowerBound: bound }, true);
  return {
    covers,
    cost,
    exact: complete && solvedAll && exactRounds && cost === bound,
    designBound: bound,
    // A single output's bound is the design's; with several, each output's own is not tracked here.
    outputBounds: k === 1 ? [bound] : rowsPerOutput.map(() => 0),
    primes: primes.length,
    route: "exact",
  };
}

/**
 * Above the truth tables: each output's primes from its ON ∪ DC cubes by the
 * recursive rule (./unate), identical primes merged into one tagged with
 * every output they belong to. They are all the primes of a single output;
 * with several outputs, the primes of their products are missing, so a
 * minimum over these proves nothing for the design. Null when there are more
 * than `maxPrimes` or the work passes `work` (units of about a nanosecond).
 */
export function widePrimes(targets: Target[], n: number, maxPrimes: number, work: number): TaggedPrime[] | null {
  const full = fullMask(n);
  const byMask = new Map<number, Map<number, TaggedPrime>>();
  const out: TaggedPrime[] = [];
  const budget = new WorkBudget(work);
  for (let j = 0; j < targets.length; j++) {
    const t = targets[j]!;
    if (t.on.length === 0) continue;
    let primes: Cube[];
    try {
      primes = primesOfCover(t.on.concat(t.dc), full, maxPrimes, budget);
    } catch (e) {
      if (e instanceof RangeError || e instanceof OverBudget) return null;
      throw e;
    }
    for (const p of primes) {
      let values = byMask.get(p.mask);
      if (!values) byMask.set(p.mask, (values = new Map()));
      const known = values.get(p.value);
      if (known) known.tag |= 1 << j;
      else {
        const tp = { value: p.value, mask: p.mask, tag: 1 << j };
        values.set(p.value, tp);
        out.push(tp);
      }
    }
    if (out.length > maxPrimes) return null;
  }
  return out;
}
