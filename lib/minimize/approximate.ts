/**
 * The heuristic route over a design: a prime and irredundant cover per output
 * (./heuristic), identical terms shared, and a proven lower bound from
 * independent points (./bound).
 */
import type { Cube } from "../logic";
import { LOW_VARIABLE_WORDS, TRUTH_TABLE_MAX_INPUTS, fullMask, popcount, tableMinterms } from "../logic";
import { independentPoints, tableOracle, cubeOracle, type BoundPoint } from "./bound";
import { gatesFor } from "./cost";
import { HeuristicTimeout, heuristicCover } from "./heuristic";
import type { Reporter } from "./progress";
import { costOfCovers } from "./share";
import { type Solved, boundProves } from "./solved";
import type { Target } from "./target";
import { type CostModel, LimitError, plainDuration } from "./types";
import { complement } from "./unate";

/** Heuristic route: a prime and irredundant cover per output, identical terms shared, proven bound. */
export function heuristicAll(n: number, targets: Target[], model: CostModel, deadline: number, limit: number, progress?: Reporter): Solved {
  const covers: Cube[][] = [];
  for (const t of targets) {
    try {
      covers.push(heuristicCover(n, t.on, t.dc, deadline, t.onT && t.dcT ? { on: t.onT, dc: t.dcT } : undefined));
    } catch (e) {
      if (e instanceof HeuristicTimeout) {
        throw new LimitError(
          "timeLimitMs",
          limit,
          `not even a first cover of every output could be finished within the time limit of ${plainDuration(limit)}`,
          "Split the design into smaller blocks, with fewer inputs or outputs each.",
          `time limit of ${plainDuration(limit)}`,
        );
      }
      throw e;
    }
  }
  // ON points with no ON or DC neighbour ("isolated") are each their output's only implicant through
  // them: every cover holds them as terms, and they are independent of every point at another minterm.
  // They are counted directly; the greedy set below is drawn from the other minterms.
  const iso = n <= TRUTH_TABLE_MAX_INPUTS ? isolatedPoints(targets, n) : null;
  // Candidate points: a spread sample of each output's ON points (or its cubes' corners above 20 inputs).
  // Under the products model a point a wire of its output may serve is left out: a wire is no product.
  const full = fullMask(n);
  const offCubes = n <= TRUTH_TABLE_MAX_INPUTS ? null : targets.map((t) => complement(t.on.concat(t.dc), full));
  const candidates: BoundPoint[] = [];
  const perOutputCap = Math.max(64, Math.floor(12000 / Math.max(1, targets.length)));
  targets.forEach((t, j) => {
    const wires = model.kind === "products" ? wiresOf(t, n, offCubes?.[j]) : [];
    // Above the tables, two opposite corners of each ON cube (its free variables all 0, all 1).
    const pts = (t.onT ? tableMinterms(t.onT, n) : t.on.flatMap((c) => (c.mask === full ? [c.value] : [c.value, (c.value | (full & ~c.mask)) >>> 0]))).filter(
      (m) => !(iso && (iso.any[m >>> 5]! >>> (m & 31)) & 1) && !wires.some((c) => ((m ^ c.value) & c.mask) === 0),
    );
    const step = Math.max(1, Math.ceil(pts.length / perOutputCap));
    // Cubes may share a corner: each point once.
    const taken = new Set<number>();
    for (let i = 0; i < pts.length; i += step) {
      if (taken.has(pts[i]!)) continue;
      taken.add(pts[i]!);
      candidates.push({ output: j, minterm: pts[i]! });
    }
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
      : cubeOracle(offCubes!);
  // Points with few care neighbours first: they are the likeliest to be independent of the rest (a corner
  // many ON cubes share, next to all of them, taken first, would rule out every other corner of theirs).
  // Above the tables a neighbour is looked up in the OFF cubes, when that stays within about 10^8 tests.
  const offTests = offCubes ? candidates.length * n * Math.max(...offCubes.map((o) => o.length), 1) : 0;
  if (n <= TRUTH_TABLE_MAX_INPUTS || offTests <= 1e8) {
    const degree = (p: BoundPoint): number => {
      const t = targets[p.output]!;
      let d = 0;
      for (let i = 0; i < n; i++) {
        const q = (p.minterm ^ (1 << i)) >>> 0;
        if (t.onT && t.dcT) {
          if (((t.onT[q >>> 5]! | t.dcT[q >>> 5]!) >>> (q & 31)) & 1) d++;
        } else if (!oracle.meetsOff({ value: q, mask: full }, p.output)) d++;
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
  const found = independentPoints(candidates, oracle, full, boundDeadline);
  const ind = { total: found.total + (iso?.total ?? 0) };
  const k = targets.map((_, j) => (found.perOutput.get(j) ?? 0) + (iso?.perOutput[j] ?? 0));
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
  progress?.update({ cost });
  design = Math.min(cost, Math.max(design, ...perOutput));
  // When every ON point is isolated, its minterm is the one cover there is (a parity function's): minimum under any model.
  const forced = iso !== null && targets.every((t, j) => iso.perOutput[j] === t.on.length && t.on.every((c) => c.mask === full));
  const exact = forced || boundProves(model, cost, design);
  progress?.update({ lowerBound: exact ? cost : design }, true);
  return { covers, cost, exact, designBound: exact ? cost : design, outputBounds: exact && targets.length === 1 ? [cost] : perOutput, primes: -1, route: "heuristic" };
}

/**
 * Per output, its ON points with no ON or DC point one variable away, and
 * the minterms isolated in some output: `total` counts those minterms (a
 * term at one minterm may serve every output it is ON in).
 */
function isolatedPoints(targets: Target[], n: number): { any: Uint32Array; perOutput: number[]; total: number } {
  const words = targets[0]?.onT?.length ?? 1;
  const any = new Uint32Array(words);
  const perOutput: number[] = [];
  const near = new Uint32Array(words);
  for (const t of targets) {
    near.fill(0);
    const on = t.onT!;
    const dc = t.dcT!;
    for (let i = 0; i < n; i++) {
      if (i < 5) {
        const up = LOW_VARIABLE_WORDS[i]!;
        const sh = 1 << i;
        for (let w = 0; w < words; w++) {
          const care = on[w]! | dc[w]!;
          near[w]! |= ((care & ~up) << sh) | ((care & up) >>> sh);
        }
      } else {
        const s = 1 << (i - 5);
        for (let w = 0; w < words; w++) near[w]! |= on[w ^ s]! | dc[w ^ s]!;
      }
    }
    let count = 0;
    for (let w = 0; w < words; w++) {
      const lone = on[w]! & ~near[w]!;
      any[w]! |= lone;
      count += popcount(lone);
    }
    perOutput.push(count);
  }
  let total = 0;
  for (let w = 0; w < words; w++) total += popcount(any[w]!);
  return { any, perOutput, total };
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
 * The terms of one literal that lie in the output's ON ∪ DC: the wires it may
 * use. Exact on the truth tables; above them, on the OFF-set's cubes.
 */
function wiresOf(t: Target, n: number, off: readonly Cube[] | undefined): Cube[] {
  const out: Cube[] = [];
  for (let i = 0; i < n; i++) {
    for (const v of [0, 1]) {
      const c = { value: (v << i) >>> 0, mask: (1 << i) >>> 0 };
      let inside: boolean;
      if (t.onT && t.dcT) {
        inside = true;
        const valid = n >= 5 ? 0xffffffff : 2 ** 2 ** n - 1;
        for (let w = 0; w < t.onT.length && inside; w++) {
          // The word's points with variable i at v.
          const pts = i < 5 ? (v ? LOW_VARIABLE_WORDS[i]! : ~LOW_VARIABLE_WORDS[i]!) & valid : ((w >>> (i - 5)) & 1) === v ? valid : 0;
          if ((pts & ~(t.onT[w]! | t.dcT[w]!)) !== 0) inside = false;
        }
      } else inside = !off!.some((r) => ((r.value ^ c.value) & r.mask & c.mask) === 0);
      if (inside) out.push(c);
    }
  }
  return out;
}
