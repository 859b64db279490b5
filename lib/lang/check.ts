/**
 * Meaning checks on a parsed program: names, declarations, assignments,
 * block calls, minterm indices and cycles. Produces the resolved scopes that
 * elaboration walks.
 */
import { MAX_INPUTS } from "../logic/index";
import type { Expr, Name, Program, Range, Rhs, SetClause, Statement } from "./ast";
import { error, warning, type Diagnostic } from "./diagnostics";
import { depthFirst } from "./graph";

export type AssignStatement = Extract<Statement, { kind: "assign" }>;
export type BlockStatement = Extract<Statement, { kind: "block" }>;

/** Where a signal's value comes from: an assignment, and which of its targets. */
export interface Definition {
  statement: AssignStatement;
  index: number;
}

export interface SignalEntry {
  role: "input" | "output" | "let";
  name: Name;
  /** Position among the scope's inputs (declared order) for inputs. */
  index: number;
}

export interface Scope {
  kind: "design" | "block";
  inputs: Name[];
  outputs: Name[];
  signals: Map<string, SignalEntry>;
  defs: Map<string, Definition>;
}

export interface BlockInfo {
  statement: BlockStatement;
  scope: Scope;
  /**
   * The blocks its body's calls name. Absent for the design's own blocks
   * (they see the design's blocks); a library block sees the blocks of its
   * own source only.
   */
  blocks?: Map<string, BlockInfo>;
  /** A library block's never lines, over its own inputs: impossible combinations it brings to every call. */
  nevers?: Expr[];
  /** Where a library block came from. */
  library?: { library: string; revision: number };
}

export interface CheckedProgram {
  design: Scope;
  /** The design's own blocks and the library blocks its use lines brought in, by name. */
  blocks: Map<string, BlockInfo>;
  nevers: Expr[];
}

/** Library blocks of a program's use lines, as lib/lang/imports.ts resolved them. */
export interface Imports {
  /** Resolved blocks by the name on their use line. */
  blocks: Map<string, BlockInfo>;
  /** Names whose use line failed (already reported): calls to them raise no further error. */
  failed: Set<string>;
}

const roleWord = { input: "an input", output: "an output", let: "an intermediate" } as const;

function lineOf(r: Range): number {
  return r.line;
}

/**
 * Runs every meaning check. Diagnostics are appended to `diagnostics`.
 * `imports` are the library blocks of the use lines (none by default).
 */
export function checkProgram(program: Program, diagnostics: Diagnostic[], imports: Imports = { blocks: new Map(), failed: new Set() }): CheckedProgram {
  const blocks = new Map<string, BlockInfo>();
  const imported = new Set<string>([...imports.blocks.keys(), ...imports.failed]);
  const nevers: Expr[] = [];

  for (const s of program.statements) {
    if (s.kind !== "block") continue;
    const prior = blocks.get(s.name.text);
    if (prior || imported.has(s.name.text)) {
      const where = prior ? `line ${lineOf(prior.statement.name.range)}` : "the use line";
      diagnostics.push(error(`block '${s.name.text}' is defined twice (first at ${where}); rename one of them`, s.name.range));
      continue;
    }
    blocks.set(s.name.text, { statement: s, scope: emptyScope("block", s.params, s.results) });
  }

  const ctx: Ctx = { blocks, library: imports.blocks, failed: imports.failed, diagnostics };

  for (const info of blocks.values()) {
    const b = info.statement;
    info.scope = checkScope(ctx, "block", b.params, b.results, b.body, `block '${b.name.text}'`);
  }

  const inputs: Name[] = [];
  const outputs: Name[] = [];
  for (const s of program.statements) {
    if (s.kind === "inputs") inputs.push(...s.names);
    if (s.kind === "outputs") outputs.push(...s.names);
    if (s.kind === "never") nevers.push(s.condition);
  }
  if (inputs.length > MAX_INPUTS) {
    diagnostics.push(
      error(
        `the design declares ${inputs.length} inputs; the limit is ${MAX_INPUTS} inputs per design (MAX_INPUTS). Split the design, or move a part into a design of its own`,
        inputs[MAX_INPUTS]!.range,
      ),
    );
  }
  const design = checkScope(ctx, "design", inputs, outputs, program.statements, "the design");
  if (outputs.length === 0) {
    diagnostics.push(error("the design declares no outputs, so there is nothing to minimize; add an outputs line such as `outputs alarm` and an equation for each output", firstRange(program)));
  }
  checkBlockRecursion(ctx);
  return { design, blocks: new Map([...imports.blocks, ...blocks]), nevers };
}

function firstRange(p: Program): Range {
  const s = p.statements[0];
  return s ? (s.kind === "block" ? s.headerRange : s.range) : { line: 1, column: 1, endLine: 1, endColumn: 1 };
}

interface Ctx {
  /** The design's own blocks. */
  blocks: Map<string, BlockInfo>;
  /** Library blocks brought in by use lines. */
  library: Map<string, BlockInfo>;
  /** Use lines that failed (reported already). */
  failed: Set<string>;
  diagnostics: Diagnostic[];
}

function blockNamed(ctx: Ctx, name: string): BlockInfo | undefined {
  return ctx.blocks.get(name) ?? ctx.library.get(name);
}

function emptyScope(kind: Scope["kind"], inputs: Name[], outputs: Name[]): Scope {
  return { kind, inputs, outputs, signals: new Map(), defs: new Map() };
}

function checkScope(ctx: Ctx, kind: Scope["kind"], inputs: Name[], outputs: Name[], statements: Statement[], label: string): Scope {
  const d = ctx.diagnostics;
  const scope = emptyScope(kind, inputs, outputs);
  const inputWord = kind === "design" ? "input" : "parameter";
  const outputWord = kind === "design" ? "output" : "result";

  const declare = (name: Name, role: SignalEntry["role"], index: number): boolean => {
    const prior = scope.signals.get(name.text);
    if (prior && role === "let" && prior.role === "output") {
      d.push(error(`'${name.text}' is ${kind === "design" ? "an output" : "a block result"}; assign it without let: ${name.text} = ...`, name.range));
      return false;
    }
    if (prior) {
      d.push(
        error(
          `'${name.text}' is declared twice: it is already ${roleWord[prior.role]} (line ${lineOf(prior.name.range)}); remove one or rename it`,
          name.range,
        ),
      );
      return false;
    }
    scope.signals.set(name.text, { role, name, index });
    return true;
  };
  inputs.forEach((n, i) => declare(n, "input", i));
  outputs.forEach((n) => declare(n, "output", -1));

  const assigns = statements.filter((s): s is AssignStatement => s.kind === "assign");
  let usesSets = false;

  for (const s of assigns) {
    // a malformed right side is reported, but its targets still count as assigned to avoid follow-on errors
    checkRhsShape(ctx, scope, s);
    s.targets.forEach((t, index) => {
      if (s.isLet) {
        const wasOutput = scope.signals.get(t.text)?.role === "output";
        // `let f = ...` on an output is reported once and then counts as its assignment
        if (!declare(t, "let", -1) && !wasOutput) return;
      } else {
        const entry = scope.signals.get(t.text);
        if (!entry) {
          d.push(
            error(
              `'${t.text}' is not declared; add it to ${kind === "design" ? "the outputs line" : "the block's results after ->"}, or write let ${t.text} = ... for an intermediate`,
              t.range,
            ),
          );
          return;
        }
        if (entry.role === "input") {
          d.push(error(`'${t.text}' is ${inputWord === "input" ? "an input" : "a block parameter"} and cannot be assigned; assign an ${outputWord} or an intermediate instead`, t.range));
          return;
        }
        if (entry.role === "let") {
          const first = scope.defs.get(t.text);
          d.push(error(`'${t.text}' is assigned twice (first at line ${first ? lineOf(first.statement.range) : lineOf(entry.name.range)}); keep one assignment`, t.range));
          return;
        }
      }
      const prior = scope.defs.get(t.text);
      if (prior) {
        d.push(error(`'${t.text}' is assigned twice (first at line ${lineOf(prior.statement.range)}); keep one assignment`, t.range));
        return;
      }
      scope.defs.set(t.text, { statement: s, index });
    });
  }

  const used = new Set<string>();
  const walk = (e: Expr, topCall: boolean) => {
    switch (e.kind) {
      case "const":
        if (e.value !== 0 && e.value !== 1) {
          d.push(error(`only the constants 0 and 1 may appear in an expression; minterm numbers go inside on(...), off(...) or dc(...)`, e.range));
        }
        return;
      case "ref": {
        const entry = scope.signals.get(e.name);
        if (!entry) {
          d.push(error(`'${e.name}' is not declared; declare it on the ${kind === "design" ? "inputs line" : "block header"} or define it with let ${e.name} = ...`, e.range));
          return;
        }
        used.add(e.name);
        if (entry.role === "output") {
          const def = scope.defs.get(e.name);
          if (def && hasDontCares(def.statement.value)) {
            d.push(
              error(
                `${outputWord} '${e.name}' has don't-cares, so its value is not fixed where it is read; define the fixed part with let and read that instead`,
                e.range,
              ),
            );
          }
        }
        return;
      }
      case "not":
        walk(e.operand, false);
        return;
      case "and":
      case "or":
      case "xor":
        for (const o of e.operands) walk(o, false);
        return;
      case "call": {
        for (const a of e.args) walk(a, false);
        if (ctx.failed.has(e.block.text)) return;
        const b = blockNamed(ctx, e.block.text);
        if (!b) {
          d.push(error(`there is no block named '${e.block.text}'; define it with block ${e.block.text}(...) -> ... and end`, e.block.range));
          return;
        }
        const h = b.statement;
        if (e.args.length !== h.params.length) {
          d.push(
            error(
              `block '${h.name.text}' takes ${h.params.length} input${h.params.length === 1 ? "" : "s"} (${h.params.map((p) => p.text).join(", ")}) but is given ${e.args.length}`,
              e.range,
            ),
          );
        }
        if (!topCall && h.results.length !== 1) {
          d.push(
            error(
              `block '${h.name.text}' gives ${h.results.length} results (${h.results.map((r) => r.text).join(", ")}); call it on a line of its own: (${h.results.map((r) => r.text).join(", ")}) = ${h.name.text}(...)`,
              e.range,
            ),
          );
        }
        return;
      }
    }
  };

  for (const s of statements) {
    if (s.kind === "assign") {
      const v = s.value;
      if (v.kind === "expr") {
        walk(v.expr, s.tuple && v.expr.kind === "call");
        if (s.tuple && v.expr.kind === "call") checkTupleArity(ctx, s, v.expr);
        if (v.dc) {
          usesSets = true;
          checkClause(d, v.dc, inputs.length, inputWord);
        }
      } else {
        usesSets = true;
        for (const c of v.clauses) checkClause(d, c, inputs.length, inputWord);
      }
    } else if (s.kind === "never") {
      walk(s.condition, false);
    }
  }

  checkCycles(d, scope);

  for (const o of outputs) {
    if (scope.signals.get(o.text)?.name !== o) continue;
    if (!scope.defs.has(o.text)) {
      d.push(
        error(
          kind === "design"
            ? `output '${o.text}' is never assigned; add a line ${o.text} = ...`
            : `result '${o.text}' of ${label} is never assigned; add a line ${o.text} = ... inside the block`,
          o.range,
        ),
      );
    }
  }
  if (!usesSets) {
    for (const i of inputs) {
      if (scope.signals.get(i.text)?.name !== i) continue;
      if (!used.has(i.text)) d.push(warning(`${inputWord} '${i.text}' is declared but never used`, i.range));
    }
  }
  for (const [name, entry] of scope.signals) {
    if (entry.role === "let" && !used.has(name)) {
      d.push(warning(`intermediate '${name}' is never used; remove it or use it in an equation`, entry.name.range));
    }
  }
  return scope;
}

function hasDontCares(v: Rhs): boolean {
  if (v.kind === "expr") return v.dc !== null;
  return v.clauses.some((c) => c.kind === "dc");
}

/** Checks the right side fits its left side; false (after a diagnostic) when it does not. */
function checkRhsShape(ctx: Ctx, scope: Scope, s: AssignStatement): boolean {
  const d = ctx.diagnostics;
  const v = s.value;
  if (s.tuple && !(v.kind === "expr" && v.expr.kind === "call" && v.dc === null)) {
    d.push(error(`several names on the left need a block call on the right, such as (s, c) = halfsum(a, b)`, v.range));
    return false;
  }
  if (v.kind === "expr" && v.dc && v.dc.kind !== "dc") {
    d.push(error(`only dc(...) may follow an expression; ${v.dc.kind}(...) stands on its own as f = ${v.dc.kind}(...)`, v.dc.range));
    return false;
  }
  const isOutput = !s.isLet && scope.signals.get(s.targets[0]!.text)?.role === "output";
  const dcClauses = v.kind === "expr" ? (v.dc ? [v.dc] : []) : v.clauses.filter((c) => c.kind === "dc");
  if (dcClauses.length > 0 && !(scope.kind === "design" && isOutput)) {
    d.push(
      error(
        scope.kind === "design"
          ? `don't-cares belong to outputs; an intermediate must be fully specified, so remove dc(...) here`
          : `a block's results must be fully specified; remove dc(...) here and give the don't-cares where the design assigns its output`,
        dcClauses[0]!.range,
      ),
    );
    return false;
  }
  if (v.kind === "sets") {
    const seen = new Map<string, SetClause>();
    for (const c of v.clauses) {
      if (seen.has(c.kind)) {
        d.push(error(`${c.kind}(...) appears twice; put all its minterms in one list`, c.range));
        return false;
      }
      seen.set(c.kind, c);
    }
    if (seen.has("on") && seen.has("off")) {
      d.push(error(`give either on(...) or off(...), not both; the other set follows from it`, seen.get("off")!.range));
      return false;
    }
  }
  return true;
}

function checkTupleArity(ctx: Ctx, s: AssignStatement, call: Extract<Expr, { kind: "call" }>): void {
  const b = blockNamed(ctx, call.block.text);
  if (!b) return;
  const results = b.statement.results;
  if (results.length !== s.targets.length) {
    ctx.diagnostics.push(
      error(
        `block '${call.block.text}' gives ${results.length} result${results.length === 1 ? "" : "s"} (${results.map((r) => r.text).join(", ")}) but ${s.targets.length} name${s.targets.length === 1 ? " is" : "s are"} on the left`,
        s.range,
      ),
    );
  }
}

function checkClause(d: Diagnostic[], c: SetClause, k: number, inputWord: string): void {
  const size = 2 ** k;
  for (const it of c.items) {
    if (it.lo > it.hi) {
      d.push(error(`the range ${it.lo}..${it.hi} runs backwards; write ${it.hi}..${it.lo}`, it.range));
    } else if (it.hi >= size) {
      d.push(
        error(
          `minterm ${it.hi} is out of range: with ${k} ${inputWord}${k === 1 ? "" : "s"} the indices run from 0 to ${size - 1}`,
          it.range,
        ),
      );
    }
  }
}

function refsOf(e: Expr, out: Set<string>): void {
  switch (e.kind) {
    case "ref":
      out.add(e.name);
      return;
    case "not":
      refsOf(e.operand, out);
      return;
    case "and":
    case "or":
    case "xor":
      for (const o of e.operands) refsOf(o, out);
      return;
    case "call":
      for (const a of e.args) refsOf(a, out);
      return;
    case "const":
      return;
  }
}

function callsOf(e: Expr, out: Set<string>): void {
  switch (e.kind) {
    case "not":
      callsOf(e.operand, out);
      return;
    case "and":
    case "or":
    case "xor":
      for (const o of e.operands) callsOf(o, out);
      return;
    case "call":
      out.add(e.block.text);
      for (const a of e.args) callsOf(a, out);
      return;
    default:
      return;
  }
}

/** Blocks an expression calls, by name. */
export function callsOfExpr(e: Expr): Set<string> {
  const out = new Set<string>();
  callsOf(e, out);
  return out;
}

/** Signals an expression reads (inputs included). */
export function refsOfExpr(e: Expr): Set<string> {
  const out = new Set<string>();
  refsOf(e, out);
  return out;
}

/** Signals read by a definition's right side (inputs included). */
export function dependencies(def: Definition): Set<string> {
  const out = new Set<string>();
  const v = def.statement.value;
  if (v.kind === "expr") refsOf(v.expr, out);
  return out;
}

function checkCycles(d: Diagnostic[], scope: Scope): void {
  const reported = new Set<string>();
  const deps = (name: string) => [...dependencies(scope.defs.get(name)!)].filter((x) => scope.defs.has(x));
  depthFirst(scope.defs.keys(), deps, {
    onCycle(cycle) {
      if (cycle.some((c) => reported.has(c))) return;
      cycle.forEach((c) => reported.add(c));
      const head = cycle[0]!;
      const first = scope.defs.get(head)!;
      d.push(
        error(
          `'${head}' depends on itself: ${[...cycle, head].join(" → ")}; break the loop, since equations cannot feed back`,
          first.statement.targets[first.index]!.range,
        ),
      );
    },
  });
}

/** Definitions reachable from the roots, each after everything it reads (leaves first). */
export function definitionOrder(scope: Scope, roots: Iterable<string>): string[] {
  const order: string[] = [];
  const deps = (name: string) => [...dependencies(scope.defs.get(name)!)].filter((x) => scope.defs.has(x));
  depthFirst([...roots].filter((r) => scope.defs.has(r)), deps, { onFinish: (n) => order.push(n) });
  return order;
}

function checkBlockRecursion(ctx: Ctx): void {
  const calls = new Map<string, string[]>();
  for (const [name, info] of ctx.blocks) {
    const out = new Set<string>();
    for (const s of info.statement.body) if (s.kind === "assign" && s.value.kind === "expr") callsOf(s.value.expr, out);
    calls.set(name, [...out].filter((c) => ctx.blocks.has(c)));
  }
  const reported = new Set<string>();
  depthFirst(ctx.blocks.keys(), (n) => calls.get(n) ?? [], {
    onCycle(cycle) {
      if (cycle.some((c) => reported.has(c))) return;
      cycle.forEach((c) => reported.add(c));
      const head = cycle[0]!;
      ctx.diagnostics.push(
        error(`block '${head}' calls itself through ${[...cycle, head].join(" → ")}; blocks cannot be recursive`, ctx.blocks.get(head)!.statement.name.range),
      );
    },
  });
}

/** True when any diagnostic is an error. */
export function hasErrors(ds: readonly Diagnostic[]): boolean {
  return ds.some((x) => x.severity === "error");
}
