import highsLoader from "highs";
import { describe, expect, it } from "vitest";
import { popcount } from "../../lib/logic";
import { coveringProblem } from "../../lib/minimize";
import { coverLpDuals, lagrangianValue } from "../../lib/minimize/lp";
import { milpMinimum, randomSpec, rng } from "./helpers";

type Highs = Awaited<ReturnType<typeof highsLoader>>;
let highsPromise: Promise<Highs> | null = null;

/** Minimum of Σ w·y over covers (rows ≥ 1, optional Σy ≤ K), by highs: binary y, or 0 ≤ y ≤ 1 when relaxed. */
async function highsCover(rowCount: number, cols: Int32Array[], w: number[], K: number, relaxed: boolean): Promise<number | null> {
  highsPromise ??= highsLoader();
  const highs = await highsPromise;
  const rowCols: number[][] = Array.from({ length: rowCount }, () => []);
  cols.forEach((rs, c) => rs.forEach((r) => rowCols[r]!.push(c)));
  const lines = ["Minimize", " obj: " + w.map((x, c) => `${x} y${c}`).join(" + "), "Subject To"];
  rowCols.forEach((cs, r) => lines.push(` r${r}: ${cs.map((c) => `y${c}`).join(" + ")} >= 1`));
  if (K >= 0) lines.push(` k: ${w.map((_, c) => `y${c}`).join(" + ")} <= ${K}`);
  lines.push("Bounds", ...w.map((_, c) => ` 0 <= y${c} <= 1`));
  if (!relaxed) lines.push("General", " " + w.map((_, c) => `y${c}`).join(" "));
  lines.push("End");
  const res = highs.solve(lines.join("\n"), { output_flag: false, mip_rel_gap: 0 });
  if (res.Status === "Infeasible") return null;
  if (res.Status !== "Optimal") throw new Error(`highs status ${res.Status}`);
  return res.ObjectiveValue;
}

/** A random set-cover instance in which every row has at least one column. */
function randomInstance(seed: number): { rowCount: number; cols: Int32Array[]; w: number[] } {
  const r = rng(seed);
  const rowCount = 8 + Math.floor(r() * 30);
  const C = 10 + Math.floor(r() * 40);
  const sets: Set<number>[] = Array.from({ length: C }, () => new Set<number>());
  for (const s of sets) for (let k = 1 + Math.floor(r() * 6); k > 0; k--) s.add(Math.floor(r() * rowCount));
  for (let row = 0; row < rowCount; row++) sets[Math.floor(r() * C)]!.add(row);
  return { rowCount, cols: sets.map((s) => Int32Array.from(s)), w: sets.map(() => 1 + Math.floor(r() * 7)) };
}

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
      // Reference: highs MILP over all implicants found by brute force (tests/minimize/helpers.ts).
      const ref = await milpMinimum(spec);
      const lp = coverLpDuals(prob.rowCount, prob.colRows, lits, ref.products);
      expect(lp.optimal).toBe(true);
      expect(lagrangianValue(prob.colRows, lits, lp.u, lp.mu, ref.products)).toBeLessThanOrEqual(ref.literals + 1e-6);
    }
  });
});
