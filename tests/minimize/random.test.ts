import highsLoader from "highs";
import { describe, expect, it } from "vitest";
import { minterm, popcount } from "../../lib/logic";
import { coveringProblem, minimize } from "../../lib/minimize";
import { randomCase } from "../../lib/bench/cases";
import { isPrimeFor, milpMinimum, milpModelMinimum, randomSpec, valueAt } from "./helpers";

function coverMatches(spec: ReturnType<typeof randomSpec>, r: ReturnType<typeof minimize>): boolean {
  const n = spec.inputs.length;
  return spec.outputs.every((_, j) => {
    for (let m = 0; m < 2 ** n; m++) {
      const v = valueAt(spec, j, m);
      const got = r.outputs[j]!.cubes.some((c) => ((m ^ c.value) & c.mask) === 0);
      if (v === 1 && !got) return false;
      if (v === 0 && got) return false;
    }
    return true;
  });
}

describe("random functions against brute force and the highs MILP", () => {
  for (const [n, outputs, seeds] of [
    [4, 1, [1, 2, 3, 4, 5]],
    [6, 1, [11, 12, 13]],
    [8, 1, [21, 22]],
    [4, 3, [31, 32, 33]],
    [5, 2, [41, 42, 43]],
  ] as const) {
    for (const seed of seeds) {
      it(`${n} inputs, ${outputs} output(s), seed ${seed}: minimum products and literals`, async () => {
        const spec = randomSpec(n, outputs, seed);
        const r = minimize(spec);
        // Reference: the test's own enumeration of every implicant and an exact MILP (highs).
        const ref = await milpMinimum(spec);
        expect(coverMatches(spec, r)).toBe(true);
        expect(r.exact).toBe(true);
        expect(r.cost).toBe(ref.products);
        if (outputs === 1) {
          const lits = r.outputs[0]!.cubes.reduce((a, c) => a + popcount(c.mask), 0);
          expect(lits).toBe(ref.literals);
        }
      });
    }
  }

  for (const seed of [51, 52, 53]) {
    it(`heuristic on 7 inputs, seed ${seed}: prime, irredundant, bound at most the MILP minimum`, async () => {
      const spec = randomSpec(7, 1, seed);
      const r = minimize(spec, { heuristic: true });
      expect(coverMatches(spec, r)).toBe(true);
      const cubes = r.outputs[0]!.cubes;
      // Brute force by the test: every term is prime ...
      for (const c of cubes) expect(isPrimeFor(spec, 0, c)).toBe(true);
      // ... and none can go: each has an ON point no other term covers.
      for (let i = 0; i < cubes.length; i++) {
        let own = false;
        for (let m = 0; m < 2 ** 7 && !own; m++) {
          if (valueAt(spec, 0, m) !== 1) continue;
          const inside = (c: (typeof cubes)[number]) => ((m ^ c.value) & c.mask) === 0;
          if (inside(cubes[i]!) && !cubes.some((c, k) => k !== i && inside(c))) own = true;
        }
        expect(own).toBe(true);
      }
      const ref = await milpMinimum(spec);
      expect(r.lowerBound).toBeLessThanOrEqual(ref.products);
      expect(r.outputs[0]!.products).toBeGreaterThanOrEqual(ref.products);
      // Under "products, then literals" only the exact route's searches prove a minimum: the heuristic's
      // bounds count products, so it never claims one (the MILP's minimum may still match it).
      expect(r.exact).toBe(false);
    });
  }

  it("the heuristic does not call a cover exact when only its product count is proven", async () => {
    // Σm(4,6,10,13) + d(2,7,8,11,14) over four inputs: the heuristic finds three products with
    // ten literals; the minimum has three products and nine (c·d' + a'·b·d' + a·b·c'·d),
    // as the test's own MILP over every implicant confirms.
    const spec = {
      inputs: ["a", "b", "c", "d"],
      outputs: [{ name: "f", on: [4, 6, 10, 13].map((m) => minterm(m, 4)), dc: [2, 7, 8, 11, 14].map((m) => minterm(m, 4)) }],
    };
    const ref = await milpMinimum(spec);
    expect(ref).toEqual({ products: 3, literals: 9 });
    const r = minimize(spec, { heuristic: true });
    expect(coverMatches(spec, r)).toBe(true);
    // Its product bound meets its three products, which proves nothing about the literals.
    expect(r.lowerBound).toBe(3);
    expect(r.exact).toBe(false);
    expect(r.outputs[0]!.literals).toBeGreaterThanOrEqual(9);
  });

  for (const seed of [61, 62, 63]) {
    it(`gate-inputs model, 6 inputs, seed ${seed}: the minimum of a MILP over all implicants`, async () => {
      const spec = randomSpec(6, 1, seed);
      const r = minimize(spec, { cost: { kind: "gate-inputs" } });
      // Reference: the test's own MILP (highs) of Σ (literals + 1) over every implicant.
      const ref = await milpModelMinimum(spec, { kind: "gate-inputs" });
      expect(coverMatches(spec, r)).toBe(true);
      expect(r.outputs[0]!.literals + r.outputs[0]!.products).toBe(r.cost);
      expect(r.exact).toBe(true);
      expect(r.cost).toBe(ref);
    });
  }

  for (const [seed, fanIn] of [[64, 2], [65, 3], [66, 4]] as const) {
    it(`fan-in ${fanIn} model, 6 inputs, seed ${seed}: proven at the MILP minimum`, async () => {
      const spec = randomSpec(6, 1, seed);
      const r = minimize(spec, { cost: { kind: "fan-in", fanIn } });
      // Reference: the test's own MILP (highs) with AND gates per term and integer OR gates.
      const ref = await milpModelMinimum(spec, { kind: "fan-in", fanIn });
      expect(coverMatches(spec, r)).toBe(true);
      expect(r.cost).toBeGreaterThanOrEqual(ref);
      expect(r.lowerBound).toBeLessThanOrEqual(ref);
      // Small enough for the exact route to close: its cover's true cost meets the surrogate's bound.
      expect(r.exact).toBe(true);
      expect(r.cost).toBe(ref);
    });
  }
});

describe("10- and 12-input functions of the bench", () => {
  // Chosen because, when written, seeds 2 and 9 were closed by the root LP over the combined weight and
  // seed 5 needed a deep literal search; the test holds whichever path the search takes.
  for (const seed of [2, 5, 9]) {
    it(`random 10 #${seed}: minimum products, then literals, against the test's own MILP`, async () => {
      const { spec } = randomCase(10, seed);
      const r = minimize(spec);
      // Reference: every implicant enumerated by the test and an exact MILP (highs), products weighted above all literals.
      const ref = await milpMinimum(spec);
      expect(coverMatches(spec, r)).toBe(true);
      expect(r.exact).toBe(true);
      expect([r.outputs[0]!.products, r.outputs[0]!.literals]).toEqual([ref.products, ref.literals]);
    }, 120_000);
  }

  // A regression: a 12-input core is above the root LP's limit and the search is cut short, which once handed
  // a non-cover to the literal phase.
  it("a random 12-input function under a 1.5 s limit still gives a cover of the function", () => {
    const { spec } = randomCase(12, 1);
    const r = minimize(spec, { timeLimitMs: 1500 });
    // Reference: the definition of a sum of products, evaluated by the test at every minterm.
    expect(coverMatches(spec, r)).toBe(true);
    expect(r.lowerBound).toBeLessThanOrEqual(r.cost);
  }, 60_000);

  // A core of about 1400 rows: the root-only search over the combined weight is not run, and the root of the
  // fewest-products search takes its bound from subgradient steps without the Lagrangian heuristic's roundings.
  it("random 12 #2 cut short: its proven bound lies at or below a cover highs finds, and near the LP optimum", async () => {
    const { spec } = randomCase(12, 2);
    const r = minimize(spec, { timeLimitMs: 2500 });
    // Reference: the definition of a sum of products, evaluated by the test at every minterm.
    expect(coverMatches(spec, r)).toBe(true);
    // These primes are all of 8 literals or more: every term is a product, and the products are the columns.
    const p = coveringProblem(spec);
    expect(p.columns.every((c) => popcount(c.mask) >= 2)).toBe(true);
    // Reference: highs (MILP) on the same covering problem, stopped after 3 s: its cover bounds the minimum from
    // above, so a proven lower bound cannot exceed it.
    const cover = await highsCover(p.rowCount, p.colRows, false, 3);
    expect(r.lowerBound).toBeLessThanOrEqual(cover);
    // Reference: highs on the LP relaxation. Not a vacuous bound: within 2 % of the LP optimum (the heuristic
    // route's independent points bound this function at about 440 products, 10 % below).
    const lp = await highsCover(p.rowCount, p.colRows, true, 60);
    expect(r.lowerBound).toBeGreaterThanOrEqual(0.98 * lp);
  }, 120_000);
});

describe("cubes whose value has bits outside the mask", () => {
  it("are minimized as the cubes the definition describes", async () => {
    // Reference: the definition of a cube (lib/logic): only the mask's positions are literals, so
    // {value 0b11, mask 0b01} over (a, b) is the cube b; the minimum of b alone is b (the test's own MILP agrees).
    const spec = { inputs: ["a", "b"], outputs: [{ name: "f", on: [{ value: 0b11, mask: 0b01 }], dc: [{ value: 0b10, mask: 0b10 }] }] };
    const r = minimize(spec);
    expect(coverMatches(spec, r)).toBe(true);
    const clean = { inputs: ["a", "b"], outputs: [{ name: "f", on: [{ value: 0b01, mask: 0b01 }], dc: [{ value: 0b10, mask: 0b10 }] }] };
    const ref = await milpMinimum(clean);
    expect([r.cost, r.outputs[0]!.literals]).toEqual([ref.products, ref.literals]);
    expect(r.outputs[0]!.expression).toBe("b");
  });
});

/**
 * Fewest columns of a cover of the rows that highs finds within `seconds` (a cover, not necessarily a minimum),
 * or with `relaxed` the optimum of the LP relaxation (0 ≤ y ≤ 1).
 */
async function highsCover(rowCount: number, colRows: Int32Array[], relaxed: boolean, seconds: number): Promise<number> {
  const highs = await highsLoader();
  const rowCols: number[][] = Array.from({ length: rowCount }, () => []);
  colRows.forEach((rs, c) => rs.forEach((row) => rowCols[row]!.push(c)));
  const y = colRows.map((_, c) => `y${c}`);
  const lines = ["Minimize", " obj: " + y.join(" + "), "Subject To"];
  rowCols.forEach((cs, row) => lines.push(` r${row}: ${cs.map((c) => `y${c}`).join(" + ")} >= 1`));
  lines.push("Bounds", ...y.map((v) => ` 0 <= ${v} <= 1`));
  if (!relaxed) lines.push("General", " " + y.join(" "));
  lines.push("End");
  const res = highs.solve(lines.join("\n"), { output_flag: false, time_limit: seconds });
  expect(relaxed ? ["Optimal"] : ["Optimal", "Time limit reached"]).toContain(res.Status);
  return res.ObjectiveValue;
}
