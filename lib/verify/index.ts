/**
 * Proof that an implementation meets a specification: for every output,
 * ON ⊆ implementation ⊆ ON ∪ DC. Up to TRUTH_TABLE_MAX_INPUTS inputs the check
 * is exhaustive on bit-parallel truth tables; above, each of the two
 * inclusions is refuted with a SAT solver (logic-solver, MiniSat).
 *
 * Any stage can use it: a two-level cover (verifyCovers) or any evaluator,
 * e.g. a gate netlist, given as a bit-parallel simulator and/or a SAT
 * encoder (verifyImplementation).
 */
import type LogicSolver from "logic-solver";
import type { Formula } from "logic-solver";
import type { Cube, FunctionSpec } from "../logic";
import { TRUTH_TABLE_MAX_INPUTS, fullMask } from "../logic";

export type { Formula } from "logic-solver";
export type LogicModule = typeof LogicSolver;

let loaded: LogicModule | null = null;

/**
 * The SAT solver, loaded on first use: only designs above
 * TRUTH_TABLE_MAX_INPUTS inputs need it, and loading it costs a command-line
 * run a large part of its start-up. Loaded through Node's require (the solver
 * is a CommonJS package), which the pure core reaches without importing a
 * Node module.
 */
export function logicSolver(): LogicModule {
  if (loaded) return loaded;
  const mod = (globalThis.process as unknown as { getBuiltinModule(id: string): unknown }).getBuiltinModule("node:module") as {
    createRequire(from: string): (id: string) => unknown;
  };
  loaded = mod.createRequire(import.meta.url)("logic-solver") as LogicModule;
  return loaded;
}

export type Verdict =
  | { ok: true; method: "exhaustive" | "sat" }
  | {
      ok: false;
      method: "exhaustive" | "sat";
      output: string;
      /** "missing": an ON point the implementation leaves 0; "extra": an OFF point it sets 1. */
      kind: "missing" | "extra";
      /** The failing input combination as a minterm index (first input = most significant bit). */
      minterm: number;
    };

/** An implementation under test. Give `simulate`, `encode` or both. */
export interface Implementation {
  /**
   * Bit-parallel evaluation: `inputs[i]` is the truth table of input i over all
   * 2^n minterms (see {@link inputTables}); return one table per output, same length.
   */
  simulate?(inputs: Uint32Array[]): Uint32Array[];
  /** SAT encoding: one logic-solver formula per output, over the given input formulas. */
  encode?(logic: LogicModule, inputs: Formula[]): Formula[];
}

export interface VerifyOptions {
  /** "auto" (default): exhaustive up to TRUTH_TABLE_MAX_INPUTS inputs when `simulate` is given, else SAT. */
  method?: "auto" | "exhaustive" | "sat";
}

/** Truth table of each input over n ≤ TRUTH_TABLE_MAX_INPUTS inputs (bit m of table i = bit n-1-i of m). */
export function inputTables(n: number): Uint32Array[] {
  if (n > TRUTH_TABLE_MAX_INPUTS) throw new RangeError(`truth tables stop at ${TRUTH_TABLE_MAX_INPUTS} inputs`);
  const words = Math.max(1, 2 ** n / 32);
  const low = [0xaaaaaaaa, 0xcccccccc, 0xf0f0f0f0, 0xff00ff00, 0xffff0000];
  const out: Uint32Array[] = [];
  for (let i = 0; i < n; i++) {
    const pos = n - 1 - i;
    const t = new Uint32Array(words);
    if (pos < 5) t.fill(low[pos]! >>> 0);
    else for (let w = 0; w < words; w++) t[w] = (w >>> (pos - 5)) & 1 ? 0xffffffff : 0;
    out.push(t);
  }
  return out;
}

/** In-word minterm patterns of the five lowest variables (bit pos of the minterm index set). */
const LOW_WORDS = [0xaaaaaaaa, 0xcccccccc, 0xf0f0f0f0, 0xff00ff00, 0xffff0000];

/**
 * Truth table of a list of cubes, a word at a time: a cube's literals on the
 * five lowest variables give its pattern inside a word, its free higher
 * variables enumerate the words that receive the pattern. Written here rather
 * than taken from lib/logic so that the check shares no table builder with
 * the minimizer it checks.
 */
export function coverTable(cubes: readonly Cube[], n: number): Uint32Array {
  return cubesTable(cubes, n, false);
}

/** {@link coverTable}; with `inverted`, of the cubes with every literal inverted (POS sum terms as OFF products). */
function cubesTable(cubes: readonly Cube[], n: number, inverted: boolean): Uint32Array {
  const words = Math.max(1, 2 ** n / 32);
  const t = new Uint32Array(words);
  const full = fullMask(n);
  const valid = n >= 5 ? 0xffffffff : (2 ** (2 ** n) - 1) >>> 0;
  const low = Math.min(n, 5);
  for (let k = 0; k < cubes.length; k++) {
    const c = cubes[k]!;
    const mask = c.mask & full;
    const value = (inverted ? ~c.value : c.value) & mask;
    if (mask === full) {
      t[value >>> 5]! |= 1 << (value & 31);
      continue;
    }
    let inWord = valid;
    for (let pos = 0; pos < low; pos++) {
      if ((mask >>> pos) & 1) inWord &= (value >>> pos) & 1 ? LOW_WORDS[pos]! : ~LOW_WORDS[pos]!;
    }
    const wordValue = value >>> 5;
    const wordFree = ((full & ~mask) >>> 5) >>> 0;
    for (let sub = 0; ; sub = ((sub - wordFree) & wordFree) >>> 0) {
      t[wordValue | sub]! |= inWord;
      if (sub === wordFree) break;
    }
  }
  return t;
}

function cubeFormula(c: Cube, n: number, vars: Formula[]): Formula {
  const Logic = logicSolver();
  const lits: Formula[] = [];
  for (let i = 0; i < n; i++) {
    const bit = 1 << (n - 1 - i);
    if (c.mask & bit) lits.push(c.value & bit ? vars[i]! : Logic.not(vars[i]!));
  }
  return lits.length === 0 ? Logic.TRUE : Logic.and(lits);
}

/** logic-solver formula of a sum of products over the input formulas. */
export function sopFormula(cubes: readonly Cube[], n: number, vars: Formula[]): Formula {
  const Logic = logicSolver();
  if (cubes.length === 0) return Logic.FALSE;
  return Logic.or(cubes.map((c) => cubeFormula(c, n, vars)));
}

/** Checks an implementation against every output of the specification. */
export function verifyImplementation(spec: FunctionSpec, impl: Implementation, options: VerifyOptions = {}): Verdict {
  const n = spec.inputs.length;
  const method = options.method ?? "auto";
  const exhaustive =
    method === "exhaustive" || (method === "auto" && n <= TRUTH_TABLE_MAX_INPUTS && impl.simulate !== undefined);
  if (exhaustive) {
    if (!impl.simulate) throw new Error("exhaustive verification needs simulate()");
    return exhaustiveCheck(spec, impl.simulate);
  }
  if (!impl.encode) throw new Error(`verification of ${n} inputs needs encode() for the SAT check`);
  return satCheck(spec, impl.encode);
}

function exhaustiveCheck(spec: FunctionSpec, simulate: NonNullable<Implementation["simulate"]>): Verdict {
  const n = spec.inputs.length;
  const inputs = inputTables(n);
  const got = simulate(inputs);
  const valid = n >= 5 ? 0xffffffff : (2 ** (2 ** n) - 1) >>> 0;
  for (let j = 0; j < spec.outputs.length; j++) {
    const o = spec.outputs[j]!;
    const on = coverTable(o.on, n);
    const dc = coverTable(o.dc, n);
    const g = got[j];
    if (!g || g.length !== on.length) throw new Error(`simulate() returned no table of ${on.length} words for output ${o.name}`);
    for (let w = 0; w < on.length; w++) {
      const missing = on[w]! & ~g[w]! & valid;
      const extra = g[w]! & ~on[w]! & ~dc[w]! & valid;
      const bad = missing | extra;
      if (bad !== 0) {
        const b = 31 - Math.clz32(bad & -bad);
        return {
          ok: false,
          method: "exhaustive",
          output: o.name,
          kind: (missing >>> b) & 1 ? "missing" : "extra",
          minterm: w * 32 + b,
        };
      }
    }
  }
  return { ok: true, method: "exhaustive" };
}

function satCheck(spec: FunctionSpec, encode: NonNullable<Implementation["encode"]>): Verdict {
  const n = spec.inputs.length;
  const names = spec.inputs.map((_, i) => `x${i}`);
  const Logic = logicSolver();
  const outs = encode(Logic, names);
  for (let j = 0; j < spec.outputs.length; j++) {
    const o = spec.outputs[j]!;
    const on = sopFormula(o.on, n, names);
    const dc = sopFormula(o.dc, n, names);
    const g = outs[j]!;
    const checks: ["missing" | "extra", Formula][] = [
      ["missing", Logic.and(on, Logic.not(g))],
      ["extra", Logic.and(g, Logic.not(on), Logic.not(dc))],
    ];
    for (const [kind, f] of checks) {
      const solver = new Logic.Solver();
      solver.require(f);
      const sol = solver.solve();
      if (sol) {
        const trueVars = new Set(sol.getTrueVars());
        let m = 0;
        for (let i = 0; i < n; i++) if (trueVars.has(names[i]!)) m += 2 ** (n - 1 - i);
        return { ok: false, method: "sat", output: o.name, kind, minterm: m };
      }
    }
  }
  return { ok: true, method: "sat" };
}

/** One output's two-level cover: SOP product terms, or POS sum terms ('1' plain literal in the sum). */
export interface TwoLevelCover {
  form: "sop" | "pos";
  cubes: Cube[];
}

/** A POS sum term is the complement of the product with every literal inverted. */
function sumTermsAsOffProducts(cubes: readonly Cube[]): Cube[] {
  return cubes.map((c) => ({ value: (~c.value & c.mask) >>> 0, mask: c.mask }));
}

/** Checks two-level covers (one per output, in the spec's order) against the specification. */
export function verifyCovers(spec: FunctionSpec, covers: readonly TwoLevelCover[], options: VerifyOptions = {}): Verdict {
  const n = spec.inputs.length;
  return verifyImplementation(
    spec,
    {
      simulate() {
        return covers.map((cv) => {
          if (cv.form === "sop") return coverTable(cv.cubes, n);
          const t = cubesTable(cv.cubes, n, true);
          for (let w = 0; w < t.length; w++) t[w] = ~t[w]! >>> 0;
          return t;
        });
      },
      encode(logic, vars) {
        return covers.map((cv) =>
          cv.form === "sop"
            ? sopFormula(cv.cubes, n, vars)
            : logic.not(sopFormula(sumTermsAsOffProducts(cv.cubes), n, vars)),
        );
      },
    },
    options,
  );
}
