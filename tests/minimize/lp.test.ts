import highsLoader from "highs";
import { describe, expect, it } from "vitest";
import { popcount } from "../../lib/logic";
import { coveringProblem } from "../../lib/minimize";
import { solveCover } from "../../lib/minimize/cover";
import { CoverLp, coverLpDuals, lagrangianValue, type LpCut } from "../../lib/minimize/lp";
import { milpMinimum, randomSpec, rng } from "./helpers";

type Highs = Awaited<ReturnType<typeof highsLoader>>;
let highsPromise: Promise<Highs> | null = null;

/**
 * Minimum of Σ w·y over covers (rows ≥ 1, optional Σy ≤ K, optional rows Σ val·y ≤ rhs), by highs: binary y,
 * or 0 ≤ y ≤ 1 when relaxed.
 */
async function highsCover(rowCount: number, cols: Int32Array[], w: number[], K: number, relaxed: boolean, cuts: readonly LpCut[] = []): Promise<number | null> {
  highsPromise ??= highsLoader();
  const highs = await highsPromise;
  const rowCols: number[][] = Array.from({ length: rowCount }, () => []);
  cols.forEach((rs, c) => rs.forEach((r) => rowCols[r]!.push(c)));
  const lines = ["Minimize", " obj: " + w.map((x, c) => `${x} y${c}`).join(" + "), "Subject To"];
  rowCols.forEach((cs, r) => lines.push(` r${r}: ${cs.map((c) => `y${c}`).join(" + ")} >= 1`));
  if (K >= 0) lines.push(` k: ${w.map((_, c) => `y${c}`).join(" + ")} <= ${K}`);
  cuts.forEach((cut, g) => lines.push(` g${g}: ${Array.from(cut.cols, (c, k) => `${cut.val[k]! < 0 ? "-" : "+"} ${Math.abs(cut.val[k]!)} y${c}`).join(" ")} <= ${cut.rhs}`));
  lines.push("Bounds", ...w.map((_, c) => ` 0 <= y${c} <= 1`));
  if (!relaxed) lines.push("General", " " + w.map((_, c) => `y${c}`).join(" "));
  lines.push("End");
  const res = highs.solve(lines.join("\n"), { output_flag: false, mip_rel_gap: 0 });
  if (res.Status === "Infeasible") return null;
  if (res.Status !== "Optimal") throw new Error(`highs status ${res.Status}`);
  return res.ObjectiveValue;
}

/**
 * A random set-cover instance: `rows` and `cols` are [least, how many more at most], each column covers
 * `size` = [least, how many more] random rows, every row joins `perRow` random columns, weights 1..maxWeight.
 */
function coverInstance(
  seed: number,
  shape: { rows: [number, number]; cols: [number, number]; size: [number, number]; perRow: number; maxWeight: number },
): { rowCount: number; cols: Int32Array[]; w: number[] } {
  const r = rng(seed);
  const rowCount = shape.rows[0] + Math.floor(r() * shape.rows[1]);
  const C = shape.cols[0] + Math.floor(r() * shape.cols[1]);
  const sets: Set<number>[] = Array.from({ length: C }, () => new Set<number>());
  for (const s of sets) for (let k = shape.size[0] + Math.floor(r() * shape.size[1]); k > 0; k--) s.add(Math.floor(r() * rowCount));
  for (let row = 0; row < rowCount; row++) for (let t = 0; t < shape.perRow; t++) sets[Math.floor(r() * C)]!.add(row);
  return { rowCount, cols: sets.map((s) => Int32Array.from(s)), w: sets.map(() => 1 + Math.floor(r() * shape.maxWeight)) };
}

/** 8-37 rows, 10-49 columns of 1-6 rows, weights 1-7; every row has at least one column. */
const randomInstance = (seed: number) => coverInstance(seed, { rows: [8, 30], cols: [10, 40], size: [1, 6], perRow: 1, maxWeight: 7 });

describe("LP relaxation of the covering problem", () => {
  it("its Lagrangian bound never exceeds the integer optimum, and reaches the LP optimum", async () => {
    let withBudget = 0;
    let infeasible = 0;
    for (let seed = 1; seed <= 60; seed++) {
      const { rowCount, cols, w } = randomInstance(seed);
      // Half the instances carry a column budget, some of them too tight to meet.
      const K = seed % 2 === 0 ? Math.max(1, Math.floor(cols.length / (2 + (seed % 5)))) : -1;
      const lp = coverLpDuals(rowCount, cols, w, K);
      const bound = lagrangianValue(cols, w, lp.u, lp.mu, K);
      // Reference: highs MILP on the same instance (the test's own model).
      const opt = await highsCover(rowCount, cols, w, K, false);
      const relaxedFirst = await highsCover(rowCount, cols, w, K, true);
      // Reference: highs on the LP relaxation. "infeasible" is claimed only when highs finds no fractional point either.
      if (lp.status === "infeasible") {
        expect(relaxedFirst).toBeNull();
        infeasible++;
      }
      if (opt === null) continue; // no cover within the budget: every bound is valid
      if (K >= 0) withBudget++;
      expect(bound).toBeLessThanOrEqual(opt + 1e-6);
      // Reference: highs on the LP relaxation; the simplex ends optimal on a feasible LP.
      const relaxed = await highsCover(rowCount, cols, w, K, true);
      expect(lp.optimal).toBe(true);
      expect(bound).toBeCloseTo(relaxed!, 4);
    }
    expect(withBudget).toBeGreaterThan(5);
    // Some budgets are too tight for any fractional cover, and the simplex proves it.
    expect(infeasible).toBeGreaterThan(0);
  });

  it("bounds the fewest literals among covers with the fewest products of random functions", async () => {
    for (let seed = 1; seed <= 12; seed++) {
      const spec = randomSpec(4 + (seed % 2), 1 + (seed % 3), 500 + seed);
      const prob = coveringProblem(spec);
      if (prob.rowCount === 0) continue;
      const lits = prob.columns.map((c) => popcount(c.mask));
      // Reference: highs MILP over all implicants found by brute force (tests/minimize/helpers.ts), every
      // term counted as a product, as the column budget counts every column.
      const ref = await milpMinimum(spec, { everyTermAProduct: true });
      const lp = coverLpDuals(prob.rowCount, prob.colRows, lits, ref.products);
      expect(lp.optimal).toBe(true);
      expect(lagrangianValue(prob.colRows, lits, lp.u, lp.mu, ref.products)).toBeLessThanOrEqual(ref.literals + 1e-6);
    }
  });
});

/**
 * Small instances whose covers can all be listed: 10-20 rows, 10-15 columns of 2-5 rows, every row in two
 * random columns at least, weights 1-3 (fractional LP optima are common at this density).
 */
const smallInstance = (seed: number) => coverInstance(seed, { rows: [10, 11], cols: [10, 6], size: [2, 4], perRow: 2, maxWeight: 3 });

/** Every cover (as a column bitmask) with at most K columns (K < 0: any), by enumeration of all column subsets. */
function allCovers(rowCount: number, cols: Int32Array[], K: number): number[] {
  const rowBits = cols.map((rs) => rs.reduce((a, r) => a | (1 << r), 0));
  const full = 2 ** rowCount - 1;
  const out: number[] = [];
  for (let x = 0; x < 2 ** cols.length; x++) {
    let covered = 0;
    let count = 0;
    for (let c = 0; c < cols.length; c++) {
      if ((x >>> c) & 1) {
        covered |= rowBits[c]!;
        count++;
      }
    }
    if (covered === full && (K < 0 || count <= K)) out.push(x);
  }
  return out;
}

/** Rounds of cuts on a solved LP, as the cover search adds them at a root. */
function cutRounds(lp: CoverLp, rounds: number): { status: string; cuts: LpCut[] } {
  let status = lp.solve();
  const cuts: LpCut[] = [];
  for (let round = 0; round < rounds && status === "optimal"; round++) {
    const fresh = lp.gomoryCuts(20);
    if (fresh.length === 0) break;
    cuts.push(...fresh);
    lp.withCuts(fresh);
    status = lp.solve();
  }
  return { status, cuts };
}

describe("Chvátal–Gomory cuts of the covering LP", () => {
  it("every cut holds for every cover within the budget, and the LP bound with cuts stays at or below the optimum", () => {
    // Reference: all column subsets enumerated (the test's own). Any cut Σ ⌊λA⌋x ≤ ⌊λb⌋ with λ ≥ 0 holds for
    // every integer point (Chvátal 1973, "Edmonds polytopes and a hierarchy of combinatorial problems"; from memory).
    let cutCount = 0;
    let raised = 0;
    for (let seed = 1; seed <= 40; seed++) {
      const { rowCount, cols, w } = smallInstance(seed);
      const unbudgeted = allCovers(rowCount, cols, -1);
      const fewest = Math.min(...unbudgeted.map((x) => popcount(x)));
      // Half the instances carry the tightest budget, where the LP is weakest.
      const K = seed % 2 === 0 ? fewest : -1;
      const covers = K < 0 ? unbudgeted : allCovers(rowCount, cols, K);
      const weightOf = (x: number) => w.reduce((a, wc, c) => a + ((x >>> c) & 1) * wc, 0);
      const opt = Math.min(...covers.map(weightOf));
      const plain = new CoverLp(rowCount, cols, w, K);
      plain.solve();
      const lp = new CoverLp(rowCount, cols, w, K);
      const { status, cuts } = cutRounds(lp, 5);
      cutCount += cuts.length;
      for (const cut of cuts) {
        for (const x of covers) {
          let lhs = 0;
          for (let k = 0; k < cut.cols.length; k++) lhs += ((x >>> cut.cols[k]!) & 1) * cut.val[k]!;
          expect(lhs).toBeLessThanOrEqual(cut.rhs);
        }
      }
      expect(status).toBe("optimal");
      expect(lp.objective()).toBeLessThanOrEqual(opt + 1e-6);
      if (lp.objective() > plain.objective() + 1e-6) raised++;
    }
    // The check is not vacuous: cuts were found, and they raised the bound on some instances.
    expect(cutCount).toBeGreaterThan(40);
    expect(raised).toBeGreaterThan(5);
  });

  it("cuts added to a solved LP lead to the optimum of the LP with those rows, and infeasibility only when there is none", async () => {
    let compared = 0;
    for (let seed = 1; seed <= 80; seed++) {
      const { rowCount, cols, w } = seed % 2 === 0 ? randomInstance(seed) : smallInstance(seed);
      const K = seed % 4 === 0 ? Math.max(1, Math.floor(cols.length / (2 + (seed % 5)))) : -1;
      const lp = new CoverLp(rowCount, cols, w, K, [], 8);
      const first = lp.solve();
      if (first !== "optimal") continue;
      const fresh = lp.gomoryCuts(20);
      if (fresh.length === 0) continue;
      // Room for 8 rows only: more cuts make the LP grow on the way.
      const grown = lp.withCuts(fresh);
      expect(grown).toBe(lp);
      const status = grown.solve();
      // Reference: highs on the LP relaxation with the same cut rows.
      const ref = await highsCover(rowCount, cols, w, K, true, fresh);
      if (status === "infeasible") {
        expect(ref).toBeNull();
        continue;
      }
      expect(status).toBe("optimal");
      expect(ref).not.toBeNull();
      expect(grown.objective()).toBeCloseTo(ref!, 5);
      // The same LP solved from its slack basis agrees.
      const cold = new CoverLp(rowCount, cols, w, K, fresh);
      expect(cold.solve()).toBe("optimal");
      expect(cold.objective()).toBeCloseTo(ref!, 5);
      compared++;
    }
    expect(compared).toBeGreaterThan(20);
  });

  it("a cover search takes over another search's cuts only when its root reductions match them", async () => {
    // The first of these random functions whose root-only search (combined weight, as minimize() runs it) finds cuts.
    let found: { spec: ReturnType<typeof randomSpec>; pool: NonNullable<ReturnType<typeof solveCover>["cuts"]> } | null = null;
    for (let seed = 1; seed <= 60 && !found; seed++) {
      const spec = randomSpec(7, 1, 4200 + seed);
      const p = coveringProblem(spec);
      const weight = p.columns.map((c) => 2 ** 21 + popcount(c.mask));
      const root = solveCover({ colRows: p.colRows, weight, rowCount: p.rowCount, deadline: Infinity, rootOnly: true });
      if (root.cuts) found = { spec, pool: root.cuts };
    }
    expect(found).not.toBeNull();
    const { spec, pool } = found!;
    const prob = coveringProblem(spec);
    const lits = prob.columns.map((c) => popcount(c.mask));
    // Reference: highs MILP over all implicants found by brute force (tests/minimize/helpers.ts), every term
    // counted, as the column budget and the combined weight above count every column.
    const ref = await milpMinimum(spec, { everyTermAProduct: true });
    const solve = (cuts: typeof pool) =>
      solveCover({ colRows: prob.colRows, weight: lits, rowCount: prob.rowCount, deadline: Infinity, maxColumns: ref.products, cuts });
    // Its own cuts: the same minimum as without them.
    const withPool = solve(pool);
    expect(withPool.exact).toBe(true);
    expect(withPool.weight).toBe(ref.literals);
    // A cut that holds for no cover (Σ over all live columns ≤ -1) under the matching root: the search trusts it and finds nothing.
    const bogus: LpCut = { cols: Int32Array.from(pool.live), val: new Int32Array(pool.live.length).fill(1), rhs: -1 };
    const trusted = solve({ ...pool, cuts: [bogus] });
    expect(trusted.weight).toBe(Infinity);
    // The same cut with a root that does not match (a live column moved to the taken list) is not used.
    const moved = pool.live[0]!;
    const mismatched = { ...pool, cuts: [bogus], live: pool.live.slice(1), taken: [...pool.taken, moved].sort((a, b) => a - b) };
    const ignored = solve(mismatched);
    expect(ignored.exact).toBe(true);
    expect(ignored.weight).toBe(ref.literals);
    // Cuts found under a budget may rest on it: a search with no budget or a looser one does not use them.
    const budgeted = { ...pool, cuts: [bogus], budget: ref.products - 1 };
    expect(solve(budgeted).weight).toBe(ref.literals);
    const unbudgeted = solveCover({ colRows: prob.colRows, weight: lits, rowCount: prob.rowCount, deadline: Infinity, cuts: budgeted });
    expect(unbudgeted.exact).toBe(true);
    // Without a budget the fewest literals can only be fewer than with one: a cover of at most ref.literals
    // literals shows that the bogus cut (which admits no cover) was not used.
    expect(unbudgeted.weight).toBeLessThanOrEqual(ref.literals);
    // A pool of another problem (one row less) is not used either.
    expect(solve({ ...pool, cuts: [bogus], rowCount: pool.rowCount - 1 }).weight).toBe(ref.literals);
  });
});
