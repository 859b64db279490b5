import { describe, expect, it } from "vitest";
import { minimize, type MinimizeProgress } from "../../lib/minimize";
import { randomCase } from "../../lib/bench/cases";
import { milpMinimum, randomSpec } from "./helpers";

/** Runs minimize, keeping every progress report. */
function watched(spec: Parameters<typeof minimize>[0], options: Parameters<typeof minimize>[1] = {}) {
  const reports: MinimizeProgress[] = [];
  const r = minimize(spec, { ...options, onProgress: (p) => reports.push(p) });
  return { r, reports };
}

/** The reports' contract (MinimizeOptions.onProgress): the cost only falls, the bound only rises, the last is the result's. */
function checkReports(reports: MinimizeProgress[], r: ReturnType<typeof minimize>) {
  expect(reports.length).toBeGreaterThan(0);
  for (let i = 1; i < reports.length; i++) {
    const [a, b] = [reports[i - 1]!, reports[i]!];
    if (a.cost !== undefined) expect(b.cost!).toBeLessThanOrEqual(a.cost);
    if (a.lowerBound !== undefined) expect(b.lowerBound!).toBeGreaterThanOrEqual(a.lowerBound);
  }
  // Every bound reported bounds every cover reported, the last one included.
  const highest = Math.max(...reports.map((p) => p.lowerBound ?? 0));
  for (const p of reports) if (p.cost !== undefined) expect(highest).toBeLessThanOrEqual(p.cost);
  expect(reports.at(-1)).toEqual({ ...(r.primes >= 0 ? { primes: r.primes } : {}), cost: r.cost, lowerBound: r.lowerBound });
}

describe("progress reports", () => {
  for (const seed of [61, 62]) {
    it(`random 8 inputs, seed ${seed}: primes first, then covers and bounds on either side of the minimum`, async () => {
      const spec = randomSpec(8, 1, seed);
      const { r, reports } = watched(spec);
      checkReports(reports, r);
      // The primes are listed before any cover is sought.
      expect(reports[0]).toEqual({ primes: r.primes });
      // Reference: the test's own enumeration of every implicant and an exact MILP (highs): no reported bound
      // above the minimum, no reported cost below it.
      const ref = await milpMinimum(spec);
      for (const p of reports) {
        if (p.lowerBound !== undefined) expect(p.lowerBound).toBeLessThanOrEqual(ref.products);
        if (p.cost !== undefined) expect(p.cost).toBeGreaterThanOrEqual(ref.products);
      }
    });
  }

  it("a random 12-input function cut short reports while it searches, and ends with its result", () => {
    const { r, reports } = watched(randomCase(12, 1).spec, { timeLimitMs: 3000 });
    checkReports(reports, r);
    expect(r.exact).toBe(false);
    // Reports before the last: the primes, then covers found and bounds proven on the way.
    expect(reports.length).toBeGreaterThan(2);
    expect(reports.slice(0, -1).some((p) => p.cost !== undefined && p.lowerBound !== undefined)).toBe(true);
  });

  it("the heuristic alone reports its cover and bound, without primes", () => {
    const { r, reports } = watched(randomSpec(10, 2, 63), { heuristic: true });
    checkReports(reports, r);
    expect(reports.every((p) => p.primes === undefined)).toBe(true);
  });
});
