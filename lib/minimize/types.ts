import type { Cube } from "../logic";

/**
 * How a two-level cover is priced.
 * - `products` (default): the fewest product terms that need a gate, then the
 *   fewest literals. A product of one literal needs no gate — it is a wire, or
 *   an inverter — so it is not counted among the products (its literal is
 *   counted); nor is the constant 1. Distinct terms are counted once, however
 *   many outputs share them.
 * - `gate-inputs`: literals of every distinct product plus one OR-plane input per
 *   (term, output) connection.
 * - `fan-in`: gates needed when every gate has at most `fanIn` inputs: a term of k
 *   literals costs ceil((k-1)/(fanIn-1)) AND gates, an output of t terms costs
 *   ceil((t-1)/(fanIn-1)) OR gates. `fanIn` ≥ 2.
 */
export type CostModel = { kind: "products" } | { kind: "gate-inputs" } | { kind: "fan-in"; fanIn: number };

/** Options of {@link minimize}. */
export interface MinimizeOptions {
  /** "sop" (default) or "pos" (the complement is minimized and each term inverted). */
  form?: "sop" | "pos";
  /** Default `{ kind: "products" }`. */
  cost?: CostModel;
  /** Skip the exact route and run the expand / irredundant / reduce loop. Default false. */
  heuristic?: boolean;
  /** The exact route gives way to the heuristic above this many prime implicants. Default 100 000. */
  maxPrimes?: number;
  /** Wall-clock budget of one run in milliseconds. Default 10 000. */
  timeLimitMs?: number;
  /**
   * Called as the run goes on with where it stands (see {@link MinimizeProgress}):
   * at most about twice a second, and as each route ends. Default none.
   */
  onProgress?: (p: MinimizeProgress) => void;
}

/** Where a run stands; each field appears once known. */
export interface MinimizeProgress {
  /** Multi-output prime implicants found (the exact route and rows on demand). */
  primes?: number;
  /** Cost of the best cover of the whole design found so far, under the cost model. */
  cost?: number;
  /** Proven lower bound on the design's cost under the cost model; the minimum when it meets `cost`. */
  lowerBound?: number;
}

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

export interface MinimizedOutput {
  name: string;
  form: "sop" | "pos";
  /** SOP: product terms. POS: sum terms, where '1' = plain literal in the sum, '0' = complemented literal. */
  cubes: Cube[];
  /** The cover in the equation language: `a * b' + c` or `(a + b') * (c)`; 0 / 1 for constants. */
  expression: string;
  products: number;
  literals: number;
  /** True when the design's cover is proven minimum under the cost model (shared terms counted once). */
  exact: boolean;
  /** Proven lower bound on this output's own cost under the chosen model, counted as if it stood alone. */
  lowerBound: number;
}

export interface MinimizeResult {
  inputs: string[];
  outputs: MinimizedOutput[];
  /** Terms used by more than one output. */
  shared: number;
  exact: boolean;
  /** Wall-clock milliseconds of the run. */
  ms: number;
  /** The design's cost under the chosen model (products model: distinct products of two or more literals). */
  cost: number;
  /** Proven lower bound on the design's cost under the chosen model. */
  lowerBound: number;
  /** Number of multi-output prime implicants, or -1 when the heuristic ran without enumerating them. */
  primes: number;
  /** Which route produced the cover. */
  route: "exact" | "heuristic";
}

/** A duration in plain words: "400 ms", "10 s", "1.5 s", "2 min". */
export function plainDuration(ms: number): string {
  if (ms < 1000) return `${Math.round(ms)} ms`;
  if (ms < 120_000) return `${Number((ms / 1000).toFixed(1))} s`;
  return `${Number((ms / 60_000).toFixed(1))} min`;
}

/**
 * The one error {@link minimize} throws: a limit stopped the run. The message
 * says in plain words what happened and what to change; `what` names the
 * limit reached, to follow "Stopped at the" ("time limit of 10 s"); `hint` is
 * what to change; `limit` is a code for programs ("MAX_INPUTS", "timeLimitMs"),
 * not for display, and `value` its setting.
 */
export class LimitError extends Error {
  limit: string;
  value: number;
  what: string;
  hint: string;
  constructor(
    limit: string,
    value: number,
    /** What happened, as a sentence without its full stop: "the design has 31 inputs, ...". */
    happened: string,
    hint: string,
    what: string = happened,
  ) {
    super(`${happened.charAt(0).toUpperCase()}${happened.slice(1)}. ${hint}`);
    this.name = "LimitError";
    this.limit = limit;
    this.value = value;
    this.what = what;
    this.hint = hint;
  }
}
