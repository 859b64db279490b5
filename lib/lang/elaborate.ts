/**
 * Elaboration: each design output to its ON-set and DC-set over the declared
 * inputs. Outputs that depend on at most TRUTH_TABLE_MAX_INPUTS inputs are
 * computed with bit-parallel truth tables over exactly those inputs; wider
 * ones with cube lists. Impossible combinations (never lines) become
 * don't-cares of every output and are taken out of every ON-set.
 */
import { TRUTH_TABLE_MAX_INPUTS, type FunctionSpec, type OutputSpec } from "../logic/index";
import type { Expr, Name, SetClause } from "./ast";
import { cubeAlgebra, tableAlgebra, type Algebra } from "./algebra";
import { callsOfExpr, definitionOrder, refsOfExpr, type BlockInfo, type CheckedProgram, type Definition, type Scope } from "./check";
import { CubeLimitError, rangeToCubes } from "./cubes";
import { error, warning, type Diagnostic } from "./diagnostics";
import type { LanguageLimits } from "./limits";

interface Env<V> {
  scope: Scope;
  inputs: V[];
  memo: Map<string, V>;
  calls: Map<Expr, V[]>;
  /** The blocks that calls in this scope name. */
  blocks: Map<string, BlockInfo>;
  /**
   * Impossible combinations brought in by the library blocks called so far,
   * one value per call, over the design's inputs; shared by a design's
   * environment and every block environment inside it.
   */
  impossible: V[];
}

class Evaluator<V> {
  private readonly orders = new Map<BlockInfo, string[]>();

  constructor(private readonly alg: Algebra<V>) {}

  signal(env: Env<V>, name: string): V {
    const entry = env.scope.signals.get(name)!;
    if (entry.role === "input") return env.inputs[entry.index]!;
    const hit = env.memo.get(name);
    if (hit) return hit;
    const v = this.definition(env, env.scope.defs.get(name)!);
    env.memo.set(name, v);
    return v;
  }

  /** The value of a definition as read by other equations (no don't-cares there, by the checks). */
  definition(env: Env<V>, def: Definition): V {
    const v = def.statement.value;
    if (v.kind === "expr") {
      if (def.statement.tuple && v.expr.kind === "call") return this.call(env, v.expr)[def.index]!;
      return this.expr(env, v.expr);
    }
    const on = v.clauses.find((c) => c.kind === "on");
    const off = v.clauses.find((c) => c.kind === "off");
    if (on) return this.set(env, on);
    if (off) return this.alg.not(this.set(env, off));
    return this.alg.zero();
  }

  expr(env: Env<V>, e: Expr): V {
    const a = this.alg;
    switch (e.kind) {
      case "const":
        return e.value === 1 ? a.one() : a.zero();
      case "ref":
        return this.signal(env, e.name);
      case "not":
        return a.not(this.expr(env, e.operand));
      case "and":
      case "or":
      case "xor": {
        const f = e.kind === "and" ? a.and : e.kind === "or" ? a.or : a.xor;
        let acc = this.expr(env, e.operands[0]!);
        for (let i = 1; i < e.operands.length; i++) acc = f(acc, this.expr(env, e.operands[i]!));
        return acc;
      }
      case "call":
        return this.call(env, e)[0]!;
    }
  }

  call(env: Env<V>, e: Extract<Expr, { kind: "call" }>): V[] {
    const hit = env.calls.get(e);
    if (hit) return hit;
    const info = env.blocks.get(e.block.text)!;
    const inner: Env<V> = {
      scope: info.scope,
      inputs: e.args.map((x) => this.expr(env, x)),
      memo: new Map(),
      calls: new Map(),
      blocks: info.blocks ?? env.blocks,
      impossible: env.impossible,
    };
    let order = this.orders.get(info);
    if (!order) {
      order = definitionOrder(info.scope, info.scope.defs.keys());
      this.orders.set(info, order);
    }
    // leaves first, so that evaluation never recurses along a chain of intermediates
    for (const name of order) this.signal(inner, name);
    const out = info.statement.results.map((r) => this.signal(inner, r.text));
    if (info.nevers && info.nevers.length > 0) {
      // A library block's impossible combinations, stated on the arguments of this call.
      let never = this.alg.zero();
      for (const x of info.nevers) never = this.alg.or(never, this.expr(inner, x));
      env.impossible.push(never);
    }
    env.calls.set(e, out);
    return out;
  }

  /** The function true exactly on the clause's minterms, over the scope's inputs. */
  set(env: Env<V>, c: SetClause): V {
    const a = this.alg;
    const k = env.inputs.length;
    const negated: (V | undefined)[] = [];
    const lit = (j: number, plain: boolean) => {
      if (plain) return env.inputs[j]!;
      return (negated[j] ??= a.not(env.inputs[j]!));
    };
    let acc = a.zero();
    for (const it of c.items) {
      for (const cube of rangeToCubes(it.lo, it.hi, k)) {
        let term = a.one();
        for (let p = 0; p < k; p++) {
          if (cube.mask & (1 << p)) term = a.and(term, lit(k - 1 - p, (cube.value & (1 << p)) !== 0));
        }
        acc = a.or(acc, term);
      }
    }
    return acc;
  }
}

function support(checked: CheckedProgram): (e: Expr | "all") => number {
  const design = checked.design;
  const all = design.inputs.length >= 32 ? 0xffffffff : (2 ** design.inputs.length - 1);
  const memo = new Map<string, number>();
  const ofSignal = (name: string): number => {
    const entry = design.signals.get(name)!;
    if (entry.role === "input") return 2 ** entry.index;
    const hit = memo.get(name);
    if (hit !== undefined) return hit;
    const def = design.defs.get(name)!;
    const v = def.statement.value;
    const s = v.kind === "sets" || v.dc ? all : ofExpr(v.expr);
    memo.set(name, s);
    return s;
  };
  const ofExpr = (e: Expr): number => {
    switch (e.kind) {
      case "const":
        return 0;
      case "ref":
        return ofSignal(e.name);
      case "not":
        return ofExpr(e.operand);
      case "and":
      case "or":
      case "xor":
      case "call": {
        const parts = e.kind === "call" ? e.args : e.operands;
        let s = 0;
        for (const p of parts) s = or32(s, ofExpr(p));
        return s;
      }
    }
  };
  for (const name of definitionOrder(design, design.defs.keys())) ofSignal(name);
  return (e) => (e === "all" ? all : ofExpr(e));
}

// Support masks use bit i for input i; designs have at most 30 inputs, so 32-bit operations suffice.
function or32(a: number, b: number): number {
  return (a | b) >>> 0;
}

function bitsOf(mask: number, n: number): number[] {
  const out: number[] = [];
  for (let i = 0; i < n; i++) if (Math.floor(mask / 2 ** i) % 2 === 1) out.push(i);
  return out;
}

/**
 * The design's definitions that call, directly or through other blocks, a
 * library block with never lines: they are worked out for every output, so
 * that each output gets the impossible combinations of every such call.
 */
function carriers(checked: CheckedProgram): string[] {
  const memo = new Map<BlockInfo, boolean>();
  const calls = (scope: Scope, blocks: Map<string, BlockInfo>, name: string): boolean => {
    const v = scope.defs.get(name)!.statement.value;
    if (v.kind !== "expr") return false;
    for (const b of callsOfExpr(v.expr)) {
      const info = blocks.get(b);
      if (info && carries(info, blocks)) return true;
    }
    return false;
  };
  const carries = (info: BlockInfo, outer: Map<string, BlockInfo>): boolean => {
    const hit = memo.get(info);
    if (hit !== undefined) return hit;
    memo.set(info, false); // blocks are not recursive (checked), so this is never read as an answer
    const inner = info.blocks ?? outer;
    const yes = (info.nevers?.length ?? 0) > 0 || [...info.scope.defs.keys()].some((n) => calls(info.scope, inner, n));
    memo.set(info, yes);
    return yes;
  };
  return [...checked.design.defs.keys()].filter((n) => calls(checked.design, checked.blocks, n));
}

/**
 * Every impossible combination of the design, in this environment: its own
 * never lines and those the library blocks it calls bring with them.
 */
function impossibleOf<V>(alg: Algebra<V>, ev: Evaluator<V>, env: Env<V>, checked: CheckedProgram, forced: string[]): V {
  const roots = new Set(forced);
  for (const e of checked.nevers) for (const r of refsOfExpr(e)) roots.add(r);
  // leaves first, so that evaluation never recurses along a chain of intermediates
  for (const name of definitionOrder(checked.design, roots)) ev.signal(env, name);
  let never = alg.zero();
  for (const e of checked.nevers) never = alg.or(never, ev.expr(env, e));
  for (const v of env.impossible) never = alg.or(never, v);
  return never;
}

/**
 * Builds the FunctionSpec of a checked program. Diagnostics for outputs that
 * exceed maxInputsPerOutput (default 30) or maxCubes (default 20000 product
 * terms), and for ON/DC overlaps, are appended; the spec is then incomplete
 * and the caller must not use it.
 */
export function elaborate(checked: CheckedProgram, limits: Required<LanguageLimits>, diagnostics: Diagnostic[]): FunctionSpec {
  const design = checked.design;
  const inputs = design.inputs.map((x) => x.text);
  const n = inputs.length;
  const supportOf = support(checked);
  const forced = carriers(checked);
  let neverSupport = 0;
  for (const e of checked.nevers) neverSupport = or32(neverSupport, supportOf(e));
  for (const name of forced) {
    const v = design.defs.get(name)!.statement.value;
    if (v.kind === "expr") neverSupport = or32(neverSupport, supportOf(v.expr));
  }
  const hasNever = checked.nevers.length > 0 || forced.length > 0;

  type Ctx = { alg: Algebra<unknown>; ev: Evaluator<unknown>; env: Env<unknown>; never?: unknown };
  const contexts = new Map<string, Ctx>();
  const contextFor = (vars: number[] | null): Ctx => {
    const key = vars ? vars.join(",") : "cubes";
    let c = contexts.get(key);
    if (!c) {
      const alg = (vars ? tableAlgebra(vars, n) : cubeAlgebra(n, limits.maxCubes)) as Algebra<unknown>;
      const env: Env<unknown> = {
        scope: design, inputs: inputs.map((_, i) => (vars && !vars.includes(i) ? null : alg.input(i))),
        memo: new Map(), calls: new Map(), blocks: checked.blocks, impossible: [],
      };
      c = { alg, ev: new Evaluator(alg), env };
      contexts.set(key, c);
    }
    return c;
  };

  const outputs: OutputSpec[] = [];
  for (const o of design.outputs) {
    const def = design.defs.get(o.text);
    if (!def) continue;
    const v = def.statement.value;
    const sup = or32(v.kind === "sets" || v.dc ? supportOf("all") : supportOf(v.expr), neverSupport);
    const vars = bitsOf(sup, n);
    const at = def.statement.targets[def.index]!;
    if (vars.length > limits.maxInputsPerOutput) {
      diagnostics.push(
        error(
          `output '${o.text}' depends on ${vars.length} inputs; the limit is ${limits.maxInputsPerOutput} inputs per output (maxInputsPerOutput). Give it fewer inputs: split the condition across outputs or blocks of fewer inputs`,
          at.range,
        ),
      );
      continue;
    }
    const ctx = contextFor(n <= TRUTH_TABLE_MAX_INPUTS ? bitsOf(supportOf("all"), n) : vars.length <= TRUTH_TABLE_MAX_INPUTS ? vars : null);
    const { alg, ev, env } = ctx;
    try {
      if (hasNever) ctx.never ??= impossibleOf(alg, ev, env, checked, forced);
      // leaves first, so that evaluation never recurses along a chain of intermediates
      for (const name of definitionOrder(design, [o.text])) if (name !== o.text) ev.signal(env, name);
      outputs.push(elaborateOutput(o, def, alg, ev, env, hasNever ? ctx.never : null, diagnostics));
    } catch (e) {
      if (!(e instanceof CubeLimitError)) throw e;
      diagnostics.push(
        error(
          `output '${o.text}' needs more than ${e.limit} product terms while being worked out over ${vars.length} inputs (maxCubes); give it fewer inputs (functions like parity over many inputs need a great many product terms in any two-level form)`,
          at.range,
        ),
      );
    }
  }
  return { inputs, outputs };
}

function elaborateOutput<V>(
  o: Name,
  def: Definition,
  alg: Algebra<V>,
  ev: Evaluator<V>,
  env: Env<V>,
  never: V | null,
  diagnostics: Diagnostic[],
): OutputSpec {
  const v = def.statement.value;
  let on: V;
  let dc: V = alg.zero();
  const overlap = (a: V, b: V, clause: SetClause, other: string) => {
    const m = alg.someMinterm(alg.and(a, b));
    if (m !== null) {
      diagnostics.push(
        error(`output '${o.text}': minterm ${m} is in both ${other}(...) and dc(...); a minterm is either ${other === "on" ? "required" : "excluded"} or a don't-care`, clause.range),
      );
    }
  };
  if (v.kind === "expr") {
    on = ev.definition(env, def);
    if (v.dc) {
      // an expression with dc(...) gives the value everywhere except at the don't-cares
      dc = ev.set(env, v.dc);
      on = alg.and(on, alg.not(dc));
    }
  } else {
    const onC = v.clauses.find((c) => c.kind === "on");
    const offC = v.clauses.find((c) => c.kind === "off");
    const dcC = v.clauses.find((c) => c.kind === "dc");
    if (dcC) dc = ev.set(env, dcC);
    if (onC) {
      on = ev.set(env, onC);
      if (dcC) overlap(on, dc, dcC, "on");
    } else if (offC) {
      const off = ev.set(env, offC);
      if (dcC) overlap(off, dc, dcC, "off");
      on = alg.not(alg.or(off, dc));
    } else {
      on = alg.zero();
    }
  }
  if (never !== null) {
    on = alg.and(on, alg.not(never));
    dc = alg.or(dc, never);
  }
  return { name: o.text, on: alg.toCubes(on), dc: alg.toCubes(dc) };
}

/** Warns when the never lines (the design's and its library blocks') rule out every input combination. */
export function checkNeverCoverage(checked: CheckedProgram, limits: Required<LanguageLimits>, diagnostics: Diagnostic[], neverRanges: Name["range"][]): void {
  const forced = carriers(checked);
  if (checked.nevers.length === 0 && forced.length === 0) return;
  const n = checked.design.inputs.length;
  const alg = cubeAlgebra(n, limits.maxCubes) as Algebra<unknown>;
  const ev = new Evaluator(alg);
  const env: Env<unknown> = {
    scope: checked.design, inputs: checked.design.inputs.map((_, i) => alg.input(i)),
    memo: new Map(), calls: new Map(), blocks: checked.blocks, impossible: [],
  };
  try {
    const never = impossibleOf(alg, ev, env, checked, forced);
    if (alg.isZero(alg.not(never))) {
      const at = neverRanges[0] ?? checked.design.defs.get(forced[0]!)!.statement.range;
      const whose = checked.nevers.length > 0 ? "the never lines" : "the never lines of the library blocks used";
      diagnostics.push(warning(`${whose} rule out every input combination, so every output is a don't-care everywhere`, at));
    }
  } catch (e) {
    if (!(e instanceof CubeLimitError)) throw e;
  }
}
