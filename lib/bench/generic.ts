/**
 * The generic route for comparison: every multi-output prime, then the
 * minimum-weight cover solved as a 0-1 MILP by highs (HiGHS compiled to
 * WebAssembly), with the same integer column weights as the exact route.
 */
import highsLoader from "highs";
import type { FunctionSpec } from "../logic";
import { coveringProblem } from "../minimize";

type Highs = Awaited<ReturnType<typeof highsLoader>>;

let loaded: Promise<Highs> | null = null;

/** Loads the WebAssembly solver once. */
export function loadSolver(): Promise<Highs> {
  loaded ??= highsLoader();
  return loaded;
}

export interface GenericResult {
  /** Optimal total column weight, or null when the solver did not prove optimality. */
  weight: number | null;
  status: string;
  primes: number;
  ms: number;
}

/** Primes, then the minimum cover by MILP. `timeLimitS` bounds the solver (seconds, default 120). */
export async function genericRoute(spec: FunctionSpec, timeLimitS = 120): Promise<GenericResult> {
  const highs = await loadSolver();
  const t0 = performance.now();
  const p = coveringProblem(spec);
  const rowCols: number[][] = Array.from({ length: p.rowCount }, () => []);
  p.colRows.forEach((rs, c) => {
    for (const r of rs) rowCols[r]!.push(c);
  });
  const lines: string[] = ["Minimize", " obj: " + p.weight.map((w, c) => `${w} y${c}`).join(" + "), "Subject To"];
  rowCols.forEach((cs, r) => lines.push(` r${r}: ${cs.map((c) => `y${c}`).join(" + ")} >= 1`));
  lines.push("Binary", " " + p.weight.map((_, c) => `y${c}`).join(" "), "End");
  if (p.rowCount === 0) return { weight: 0, status: "Optimal", primes: p.primes.length, ms: performance.now() - t0 };
  const res = highs.solve(lines.join("\n"), {
    output_flag: false,
    mip_rel_gap: 0,
    mip_abs_gap: 0.5,
    time_limit: timeLimitS,
  });
  const ms = performance.now() - t0;
  const ok = res.Status === "Optimal";
  return { weight: ok ? Math.round(res.ObjectiveValue) : null, status: res.Status, primes: p.primes.length, ms };
}
