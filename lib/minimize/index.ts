/**
 * Exact multi-output two-level minimization with don't-cares: the one public
 * entry of lib/minimize.
 *
 * Stages: ./target (the sets covered: ON, or OFF for product of sums),
 * ./problem (multi-output primes by ./primes, then rows and columns), ./exact
 * (a minimum cover by ./cover, whose LP lives in ./lp; terms shared among
 * outputs by ./share), ./approximate (beyond the exact route's reach: the
 * expand / irredundant / reduce loop of ./heuristic per output, with a proven
 * lower bound from ./bound), ./order (the order of the terms listed), and
 * ./expression (the cover in the equation language). Every cover is verified
 * (lib/verify) before it is returned. Design notes: README.md beside this file.
 */
import type { Cube, FunctionSpec } from "../logic";
import { MAX_INPUTS, TRUTH_TABLE_MAX_INPUTS } from "../logic";
import { verifyCovers } from "../verify";
import { heuristicAll } from "./approximate";
import { validateModel } from "./cost";
import { exactRoute } from "./exact";
import { formatCover } from "./expression";
import { cubeSpace, implicitCover, widePrimes } from "./implicit";
import { canonicalOrder, literalsOf } from "./order";
import { Reporter } from "./progress";
import { ExactLimit } from "./primes";
import { costOfCovers, sharedTerms } from "./share";
import { type Solved, boundProves } from "./solved";
import { buildTargets } from "./target";
import { DEFAULTS, LimitError, type MinimizeOptions, type MinimizeResult, type MinimizedOutput } from "./types";

export type { CostModel, MinimizeOptions, MinimizeProgress, MinimizeResult, MinimizedOutput } from "./types";
export { DEFAULTS, LimitError } from "./types";
export { formatCover } from "./expression";
export { coveringProblem, type CoveringProblem } from "./problem";

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
    throw new LimitError(
      "MAX_INPUTS",
      MAX_INPUTS,
      `the design has ${n} inputs, more than the ${MAX_INPUTS} a design may have`,
      `Split it into blocks of at most ${MAX_INPUTS} inputs each.`,
      `limit of ${MAX_INPUTS} inputs`,
    );
  }
  const deadline = t0 + timeLimitMs;
  const progress = new Reporter(options.onProgress);
  // Value bits outside a cube's mask are no literals (lib/logic's cube definition); drop them once here.
  const clean = (cs: Cube[]): Cube[] => (cs.some((c) => (c.value & ~c.mask) !== 0) ? cs.map((c) => ({ value: (c.value & c.mask) >>> 0, mask: c.mask })) : cs);
  spec = { ...spec, outputs: spec.outputs.map((o) => ({ ...o, on: clean(o.on), dc: clean(o.dc) })) };
  const targets = buildTargets(spec, form);
  let solved: Solved | null = null;
  /** A route cut short: the heuristic's cover when it is cheaper, and the higher of the two bounds either way. */
  const orHeuristic = (s: Solved): Solved => {
    if (s.exact || Date.now() >= deadline) return s;
    let h: Solved | null = null;
    try {
      h = heuristicAll(n, targets, model, deadline, timeLimitMs, progress);
    } catch (e) {
      if (!(e instanceof LimitError)) throw e;
    }
    if (!h) return s;
    const out = h.cost < s.cost ? { ...h, primes: s.primes } : { ...s };
    out.designBound = Math.max(h.designBound, s.designBound);
    out.exact = out.exact || boundProves(model, out.cost, out.designBound);
    return out;
  };
  const exactPossible = !options.heuristic && n <= TRUTH_TABLE_MAX_INPUTS && targets.length > 0;
  if (exactPossible) {
    // The exact route may use about 60 % of the budget for its primes and 85 % for its covers; the
    // heuristic keeps the rest (all of it when the exact route gives way).
    const limits = { maxPrimes, maxImplicants: DEFAULTS.maxImplicants, deadline: t0 + timeLimitMs * 0.6, coverDeadline: t0 + timeLimitMs * 0.85, progress };
    try {
      solved = exactRoute(n, targets, model, limits);
    } catch (e) {
      if (!(e instanceof ExactLimit)) throw e;
      solved = null;
    }
    if (solved) solved = orHeuristic(solved);
  }
  if (!options.heuristic && n > TRUTH_TABLE_MAX_INPUTS && targets.length > 0 && targets.length <= DEFAULTS.maxSharedOutputs) {
    // Above the truth tables, functions with few primes are covered exactly with rows made on demand
    // (./implicit): within 60 % of the time for the primes, 85 % for the covers, like the exact route.
    const primes = widePrimes(targets, n, maxPrimes, timeLimitMs * 0.2 * 1e6);
    if (primes) {
      const limits = { maxPrimes, maxImplicants: DEFAULTS.maxImplicants, deadline: t0 + timeLimitMs * 0.6, coverDeadline: t0 + timeLimitMs * 0.85, progress };
      solved = orHeuristic(implicitCover(n, targets, model, primes, cubeSpace(targets, n), limits, targets.length === 1));
    }
  }
  solved ??= heuristicAll(n, targets, model, deadline, timeLimitMs, progress);

  // Canonical order: fewer literals first, then by the earliest declared inputs.
  const outCubes = solved.covers.map((cv) => canonicalOrder(cv, n, form === "pos"));
  const verdict = verifyCovers(spec, outCubes.map((cubes) => ({ form, cubes })));
  if (!verdict.ok) {
    throw new Error(
      `internal error: the ${form} cover of ${verdict.output} fails at minterm ${verdict.minterm} (${verdict.kind}); please report this design`,
    );
  }
  const shared = sharedTerms(solved.covers);
  const cost = solved.cost;
  progress.update({ cost, lowerBound: solved.designBound }, true);
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
