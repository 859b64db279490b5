/**
 * One Verilog module (IEEE 1364-2005) of continuous assignments over one-bit
 * signals, to a design source.
 *
 * The subset: `module` with ANSI or non-ANSI ports; `input`, `output` and
 * `wire` declarations of scalar nets (optionally `input wire` / `output
 * wire`); `assign` statements and net declaration assignments (`wire w =
 * ...;`) whose targets are whole signals; expressions of `~`, `&`, `^`, `~^`
 * / `^~`, `|`, parentheses, names and the constants 1'b0 and 1'b1; comments
 * `//` and `/* *\/`; the directives `timescale and `default_nettype, which do
 * not change the logic. Inputs keep their port order, and so do outputs;
 * wires become `let` intermediates.
 *
 * Everything else (vectors, bit-selects, concatenations, reg, always and
 * initial blocks, instances, delays, parameters, functions, other operators,
 * a second module, ...) is refused with a diagnostic at its line and column
 * that names the construct: the import never guesses what a file means.
 */
import { DEFAULT_LIMITS, formatExpr, KEYWORDS, type Expr } from "../lang/index";
import { NAME_PATTERN, refused, sortImportDiagnostics, type ImportDiagnostic, type ImportResult } from "./diagnostics";
import { IMPORT_MAX_CHARS } from "./truth-table";
import { wrapJoin } from "./source";

export interface VerilogOptions {
  /** Where the module came from (a file name), for the comment at the top of the source. */
  name?: string;
}

// ---- tokens -------------------------------------------------------------------------------

type Kind = "id" | "num" | "op" | "eof" | "bad";

interface Token {
  kind: Kind;
  text: string;
  line: number;
  column: number;
  endLine: number;
  endColumn: number;
  /** For "bad" tokens: what the construct is, for the message. */
  what?: string;
}

/** Operators and punctuation, longest first so `~^` is read before `~`. */
const OPS = [
  "<<<", ">>>", "===", "!==",
  "~^", "^~", "~&", "~|", "&&", "||", "==", "!=", "<=", ">=", "<<", ">>", "**", "(*", "*)", "->",
  "(", ")", ",", ";", "=", "~", "&", "|", "^", "!", "<", ">", "+", "-", "*", "/", "%", "?", ":", "[", "]", "{", "}", "#", "@", ".",
];

/** Directives that leave the logic of a module of assignments as it is. */
const HARMLESS_DIRECTIVES = new Set(["timescale", "default_nettype", "resetall", "celldefine", "endcelldefine"]);

function tokenize(text: string, diags: ImportDiagnostic[]): Token[] {
  const out: Token[] = [];
  let i = 0;
  let line = 1;
  let col = 1;
  const advance = (count: number) => {
    for (let k = 0; k < count; k++) {
      if (text.charCodeAt(i) === 10) {
        line++;
        col = 1;
      } else col++;
      i++;
    }
  };
  const emit = (kind: Kind, start: { i: number; line: number; col: number }, what?: string) => {
    out.push({ kind, text: text.slice(start.i, i), line: start.line, column: start.col, endLine: line, endColumn: col, ...(what ? { what } : {}) });
  };
  while (i < text.length) {
    const ch = text[i]!;
    const start = { i, line, col };
    if (/\s/.test(ch)) {
      advance(1);
      continue;
    }
    if (text.startsWith("//", i)) {
      while (i < text.length && text[i] !== "\n") advance(1);
      continue;
    }
    if (text.startsWith("/*", i)) {
      const end = text.indexOf("*/", i + 2);
      if (end === -1) {
        diags.push({ severity: "error", message: "this /* comment is never closed; end it with */", line, column: col, endLine: line, endColumn: col + 2 });
        return [...out, { kind: "eof", text: "", line, column: col, endLine: line, endColumn: col }];
      }
      advance(end + 2 - i);
      continue;
    }
    if (ch === "`") {
      advance(1);
      while (i < text.length && /[A-Za-z0-9_$]/.test(text[i]!)) advance(1);
      const name = text.slice(start.i + 1, i);
      if (HARMLESS_DIRECTIVES.has(name)) {
        while (i < text.length && text[i] !== "\n") advance(1);
        continue;
      }
      emit("bad", start, name ? `the compiler directive \`${name}` : "a stray `");
      continue;
    }
    if (/[A-Za-z_]/.test(ch)) {
      while (i < text.length && /[A-Za-z0-9_$]/.test(text[i]!)) advance(1);
      emit("id", start);
      continue;
    }
    if (ch === "\\") {
      while (i < text.length && !/\s/.test(text[i]!)) advance(1);
      emit("bad", start, "an escaped identifier");
      continue;
    }
    if (ch === "$") {
      advance(1);
      while (i < text.length && /[A-Za-z0-9_$]/.test(text[i]!)) advance(1);
      emit("bad", start, `the system task or function ${text.slice(start.i, i)}`);
      continue;
    }
    if (ch === '"') {
      advance(1);
      while (i < text.length && text[i] !== '"' && text[i] !== "\n") advance(text[i] === "\\" ? 2 : 1);
      if (text[i] === '"') advance(1);
      emit("bad", start, "a string");
      continue;
    }
    if (/[0-9']/.test(ch)) {
      // A number: size, base and digits (IEEE 1364-2005 3.5.1), spaces allowed around the base.
      const m = /^([0-9][0-9_]*)?(\s*'\s*[sS]?[bBoOdDhH]\s*[0-9a-fA-FxXzZ?_]+)?/.exec(text.slice(i))!;
      const len = m[0].length || 1;
      advance(len);
      emit("num", start);
      continue;
    }
    const op = OPS.find((o) => text.startsWith(o, i));
    if (op) {
      advance(op.length);
      emit(op === "(*" ? "bad" : "op", start, op === "(*" ? "an attribute (* ... *)" : undefined);
      continue;
    }
    advance(1);
    emit("bad", start, `the character "${ch}"`);
  }
  out.push({ kind: "eof", text: "", line, column: col, endLine: line, endColumn: col });
  return out;
}

// ---- what is outside the subset, by keyword ---------------------------------------------------

const GATES = ["and", "nand", "or", "nor", "xor", "xnor", "buf", "not", "bufif0", "bufif1", "notif0", "notif1", "pullup", "pulldown",
  "nmos", "pmos", "rnmos", "rpmos", "cmos", "rcmos", "tran", "rtran", "tranif0", "tranif1", "rtranif0", "rtranif1"];
const NET_TYPES = ["tri", "tri0", "tri1", "triand", "trior", "trireg", "wand", "wor", "supply0", "supply1", "uwire"];
const CONSTRUCTS: Record<string, string> = {
  reg: "reg variables", integer: "integer variables", real: "real variables", realtime: "realtime variables", time: "time variables",
  always: "always blocks", initial: "initial blocks", function: "functions", task: "tasks", parameter: "parameters",
  localparam: "parameters", defparam: "parameter overrides (defparam)", specparam: "specify parameters", generate: "generate blocks",
  genvar: "generate variables", specify: "specify blocks", primitive: "user-defined primitives", event: "events", inout: "inout ports",
  signed: "signed declarations", macromodule: "macromodules", config: "configurations", library: "library declarations",
  begin: "procedural blocks", if: "procedural statements", case: "procedural statements", for: "procedural statements",
  force: "procedural statements", release: "procedural statements", deassign: "procedural statements", fork: "procedural blocks",
  wait: "procedural statements", repeat: "procedural statements", while: "procedural statements", forever: "procedural statements",
  scalared: "vectored nets", vectored: "vectored nets",
};
for (const g of GATES) CONSTRUCTS[g] = `gate instances (${g})`;
for (const t of NET_TYPES) CONSTRUCTS[t] = `${t} nets (only wire is imported)`;

/** Verilog-2005 reserved words (IEEE 1364-2005 annex B); none of them can name a signal. */
const VERILOG_KEYWORDS = new Set([
  "always", "and", "assign", "automatic", "begin", "buf", "bufif0", "bufif1", "case", "casex", "casez", "cell", "cmos", "config",
  "deassign", "default", "defparam", "design", "disable", "edge", "else", "end", "endcase", "endconfig", "endfunction", "endgenerate",
  "endmodule", "endprimitive", "endspecify", "endtable", "endtask", "event", "for", "force", "forever", "fork", "function", "generate",
  "genvar", "highz0", "highz1", "if", "ifnone", "incdir", "include", "initial", "inout", "input", "instance", "integer", "join", "large",
  "liblist", "library", "localparam", "macromodule", "medium", "module", "nand", "negedge", "nmos", "nor", "noshowcancelled", "not",
  "notif0", "notif1", "or", "output", "parameter", "pmos", "posedge", "primitive", "pull0", "pull1", "pulldown", "pullup",
  "pulsestyle_onevent", "pulsestyle_ondetect", "rcmos", "real", "realtime", "reg", "release", "repeat", "rnmos", "rpmos", "rtran",
  "rtranif0", "rtranif1", "scalared", "showcancelled", "signed", "small", "specify", "specparam", "strong0", "strong1", "supply0",
  "supply1", "table", "task", "time", "tran", "tranif0", "tranif1", "tri", "tri0", "tri1", "triand", "trior", "trireg", "unsigned",
  "use", "uwire", "vectored", "wait", "wand", "weak0", "weak1", "while", "wire", "wor", "xnor", "xor",
]);

/** Operators outside the subset, named for the message. */
const OTHER_OPERATORS: Record<string, string> = {
  "!": "the logical NOT operator !", "&&": "the logical AND operator &&", "||": "the logical OR operator ||",
  "==": "the equality operator ==", "!=": "the inequality operator !=", "===": "the case equality operator ===", "!==": "the case inequality operator !==",
  "<": "the comparison <", ">": "the comparison >", "<=": "the comparison <=", ">=": "the comparison >=",
  "+": "the arithmetic operator +", "-": "the arithmetic operator -", "*": "the arithmetic operator *", "/": "the arithmetic operator /",
  "%": "the arithmetic operator %", "**": "the power operator **", "<<": "the shift <<", ">>": "the shift >>", "<<<": "the shift <<<", ">>>": "the shift >>>",
  "?": "the conditional operator ? :", ":": "the conditional operator ? :", "~&": "the reduction operator ~&", "~|": "the reduction operator ~|",
  "[": "a bit-select or part-select", "{": "a concatenation", "#": "a delay (#)", "@": "an event control (@)", ".": "a hierarchical name",
};

// ---- parsing ------------------------------------------------------------------------------------

/** Thrown inside the parser to stop at the first construct outside the subset in one item. */
class Refusal {
  constructor(readonly diagnostic: ImportDiagnostic) {}
}

interface Signal {
  name: string;
  kind: "input" | "output" | "wire";
  at: Token;
  /** Position in the port list, for inputs and outputs. */
  port: number;
}

interface Driver {
  target: Token;
  expr: Expr;
  /** Names read by the expression, with the token of each first use. */
  reads: Token[];
}

/** Deepest nesting of parentheses and NOT signs in one expression: the language's own (DEFAULT_LIMITS.maxNesting, 64). */
const MAX_NESTING = DEFAULT_LIMITS.maxNesting;

class Parser {
  private pos = 0;
  private depth = 0;
  private reads: Token[] = [];
  constructor(private readonly toks: Token[]) {}

  peek(k = 0): Token {
    return this.toks[Math.min(this.pos + k, this.toks.length - 1)]!;
  }
  next(): Token {
    const t = this.peek();
    if (this.pos < this.toks.length - 1) this.pos++;
    return t;
  }
  is(text: string, k = 0): boolean {
    const t = this.peek(k);
    return (t.kind === "op" || t.kind === "id") && t.text === text;
  }
  atEnd(): boolean {
    return this.peek().kind === "eof";
  }

  refuse(t: Token, message: string): never {
    throw new Refusal({ severity: "error", message, line: t.line, column: t.column, endLine: t.endLine, endColumn: t.endColumn });
  }

  /** A refusal naming what the token starts, with `context` saying what was expected instead. */
  unexpected(t: Token, context: string): never {
    if (t.kind === "bad") this.refuse(t, `${t.what} is outside the imported subset; ${context}`);
    if (t.kind === "eof") this.refuse(t, `the file ends here; ${context}`);
    if (t.kind === "id" && CONSTRUCTS[t.text]) this.refuse(t, `${CONSTRUCTS[t.text]} are outside the imported subset (continuous assign over one-bit inputs, outputs and wires); ${context}`);
    if (t.kind === "op" && OTHER_OPERATORS[t.text]) this.refuse(t, `${OTHER_OPERATORS[t.text]} is outside the imported subset (~, &, ^, ~^, | and parentheses)`);
    this.refuse(t, `"${t.text}" is not expected here; ${context}`);
  }

  expect(text: string, context: string): Token {
    if (!this.is(text)) this.unexpected(this.peek(), context);
    return this.next();
  }

  /** A signal name: a simple identifier that both Verilog and the language accept. */
  name(context: string): Token {
    const t = this.peek();
    if (t.kind !== "id" || VERILOG_KEYWORDS.has(t.text)) this.unexpected(t, context);
    if (!NAME_PATTERN.test(t.text)) this.refuse(t, `the name ${t.text} has a $, which design sources do not take; rename the signal with letters, digits and _`);
    if ((KEYWORDS as readonly string[]).includes(t.text)) {
      this.refuse(t, `the name ${t.text} is a reserved word of the Fanbound language; rename the signal in the Verilog file (for example ${t.text}_sig)`);
    }
    return this.next();
  }

  /** Skips to just past the next `;` at this level (or to endmodule), after a refused item. */
  recover(): void {
    let nest = 0;
    while (!this.atEnd()) {
      const t = this.peek();
      if (t.kind === "id" && t.text === "endmodule") return;
      if (t.kind === "id" && /^(begin|case|casex|casez|fork|function|task|generate|specify|primitive|table)$/.test(t.text)) nest++;
      if (t.kind === "id" && /^(end|endcase|join|endfunction|endtask|endgenerate|endspecify|endprimitive|endtable)$/.test(t.text)) {
        nest = Math.max(0, nest - 1);
        this.next();
        if (nest === 0 && !this.is(";") && !this.is("else")) return;
        continue;
      }
      this.next();
      if (t.kind === "op" && t.text === ";" && nest === 0) return;
    }
  }

  // expr := xor {'|' xor}; xor := and {('^'|'~^'|'^~') and}; and := unary {'&' unary}
  // (IEEE 1364-2005 table 5-4: unary operators bind tightest, then binary &, then ^ ~^ ^~, then |; all left-associative)
  expression(): { expr: Expr; reads: Token[] } {
    this.reads = [];
    this.depth = 0;
    const expr = this.or();
    return { expr, reads: this.reads };
  }

  private or(): Expr {
    let left = this.xor();
    while (this.is("|")) {
      this.next();
      left = bin("or", left, this.xor());
    }
    return left;
  }

  private xor(): Expr {
    let left = this.and();
    while (this.is("^") || this.is("~^") || this.is("^~")) {
      const op = this.next().text;
      const right = this.and();
      left = op === "^" ? bin("xor", left, right) : not(bin("xor", left, right));
    }
    return left;
  }

  private and(): Expr {
    let left = this.unary();
    while (this.is("&")) {
      this.next();
      left = bin("and", left, this.unary());
    }
    return left;
  }

  private unary(): Expr {
    const t = this.peek();
    if (this.is("~")) {
      this.next();
      if (++this.depth > MAX_NESTING) this.refuse(t, `more than ${MAX_NESTING} NOT signs or parentheses nest here (the language's limit); simplify the expression or split it with a wire`);
      // IEEE 1364-2005 A.8.3: a unary operator takes a primary, so ~~a is not Verilog; ~(~a) is.
      if (this.is("~")) this.refuse(this.peek(), "two ~ in a row are not Verilog (a unary operator takes a primary); write ~(~x)");
      const operand = this.primary();
      this.depth--;
      return not(operand);
    }
    if (t.kind === "op" && ["&", "|", "^", "~&", "~|", "~^", "^~"].includes(t.text)) {
      this.refuse(t, `the reduction operator ${t.text} is outside the imported subset (the signals are one bit wide: write the operand itself, or ~ for the inverted forms)`);
    }
    return this.primary();
  }

  private primary(): Expr {
    const t = this.peek();
    if (this.is("(")) {
      this.next();
      if (++this.depth > MAX_NESTING) this.refuse(t, `more than ${MAX_NESTING} NOT signs or parentheses nest here (the language's limit); simplify the expression or split it with a wire`);
      const e = this.or();
      this.depth--;
      this.expect(")", "close the parenthesis with )");
      return e;
    }
    if (t.kind === "num") return { kind: "const", value: this.constant(this.next()), range: NO_RANGE };
    if (t.kind === "id" && !VERILOG_KEYWORDS.has(t.text)) {
      const id = this.name("expected a signal name");
      if (this.is("[")) this.refuse(this.peek(), `a bit-select or part-select (${id.text}[...]) is outside the imported subset: signals are one bit wide`);
      if (this.is("(")) this.refuse(this.peek(), `a function call (${id.text}(...)) is outside the imported subset`);
      if (this.is(".")) this.refuse(this.peek(), `a hierarchical name (${id.text}. ...) is outside the imported subset`);
      this.reads.push(id);
      return { kind: "ref", name: id.text, range: NO_RANGE };
    }
    this.unexpected(t, "expected a signal name, 1'b0, 1'b1, ~ or (");
  }

  /** The value of a one-bit constant; anything else is refused with what to write instead. */
  private constant(t: Token): 0 | 1 {
    const m = /^([0-9][0-9_]*)?\s*'\s*([sS]?)([bBoOdDhH])\s*([0-9a-fA-FxXzZ?_]+)$/.exec(t.text);
    if (!m) this.refuse(t, `the number ${t.text} has no size and base; write 1'b0 or 1'b1`);
    const size = m[1] === undefined ? null : Number(m[1].replace(/_/g, ""));
    const digits = m[4]!.replace(/_/g, "");
    if (/[xXzZ?]/.test(digits)) this.refuse(t, `the constant ${t.text} holds an unknown (x) or high-impedance (z) bit; design sources have only 0 and 1: write 1'b0 or 1'b1`);
    if (size !== 1) this.refuse(t, `the constant ${t.text} is ${size === null ? "unsized" : `${size} bits wide`}; signals are one bit wide here: write 1'b0 or 1'b1`);
    if (m[2]) this.refuse(t, `the constant ${t.text} is signed; write 1'b0 or 1'b1`);
    const base = { b: 2, o: 8, d: 10, h: 16 }[m[3]!.toLowerCase() as "b" | "o" | "d" | "h"];
    const valid = ({ 2: /^[01]+$/, 8: /^[0-7]+$/, 10: /^[0-9]+$/, 16: /^[0-9a-fA-F]+$/ } as Record<number, RegExp>)[base]!;
    if (!valid.test(digits)) this.refuse(t, `the constant ${t.text} has digits its base does not have; write 1'b0 or 1'b1`);
    const value = parseInt(digits, base);
    if (value !== 0 && value !== 1) this.refuse(t, `the constant ${t.text} does not fit one bit; write 1'b0 or 1'b1`);
    return value as 0 | 1;
  }
}

const NO_RANGE = { line: 0, column: 0, endLine: 0, endColumn: 0 };

function bin(kind: "and" | "or" | "xor", a: Expr, b: Expr): Expr {
  // Left-associative chains of one operator become one n-ary node, as the language prints them.
  const operands = a.kind === kind ? [...a.operands, b] : [a, b];
  return { kind, operands, range: NO_RANGE };
}

function not(e: Expr): Expr {
  return { kind: "not", operand: e, range: NO_RANGE };
}

// ---- the module ---------------------------------------------------------------------------------

/** Reads one Verilog module of continuous assignments and writes the design source; see the module comment. */
export function importVerilog(text: string, options: VerilogOptions = {}): ImportResult {
  if (text.length > IMPORT_MAX_CHARS) {
    return refused([{
      severity: "error",
      message: `the file is ${text.length.toLocaleString("en")} characters long; the limit is ${IMPORT_MAX_CHARS.toLocaleString("en")} (IMPORT_MAX_CHARS)`,
      line: 1, column: 1, endLine: 1, endColumn: 2,
    }]);
  }
  const diags: ImportDiagnostic[] = [];
  const toks = tokenize(text.replace(/\r\n?/g, "\n"), diags);
  if (diags.length) return refused(diags);
  const p = new Parser(toks);

  const refuseAt = (f: () => void) => {
    try {
      f();
      return true;
    } catch (e) {
      if (!(e instanceof Refusal)) throw e;
      diags.push(e.diagnostic);
      return false;
    }
  };

  // ---- module header ----
  let moduleName = "";
  const signals = new Map<string, Signal>();
  const portOrder: Token[] = [];
  let ansi = false;
  const declare = (t: Token, kind: Signal["kind"], port: number) => {
    const had = signals.get(t.text);
    if (had) {
      // `output y; wire y;` (either order) names the port's net type: allowed in Verilog, and nothing changes.
      if (!ansi && kind === "wire" && had.kind !== "wire") return;
      if (!ansi && kind !== "wire" && had.kind === "wire" && had.port < 0) {
        signals.set(t.text, { name: t.text, kind, at: t, port });
        return;
      }
      p.refuse(t, `${t.text} is declared twice (first at line ${had.at.line}); declare each signal once`);
    }
    signals.set(t.text, { name: t.text, kind, at: t, port });
  };

  const headerOk = refuseAt(() => {
    if (p.atEnd()) p.refuse(p.peek(), "the file has no module; import a file with one module of assign statements");
    p.expect("module", "the file must start with module (comments and `timescale may come first)");
    moduleName = p.name("expected the module's name").text;
    if (p.is("#")) p.refuse(p.peek(), "module parameters (#(...)) are outside the imported subset");
    if (p.is("(")) {
      p.next();
      if (!p.is(")")) {
        ansi = p.is("input") || p.is("output") || p.is("inout");
        let dir: "input" | "output" | null = null;
        for (;;) {
          if (ansi) {
            if (p.is("input") || p.is("output")) {
              dir = p.next().text as "input" | "output";
              if (p.is("wire")) p.next();
              if (p.is("[")) p.refuse(p.peek(), "vector ports ([msb:lsb]) are outside the imported subset: every port is one bit");
            } else if (p.peek().kind === "id" && CONSTRUCTS[p.peek().text]) {
              p.unexpected(p.peek(), "ports are input or output, one bit each");
            }
            const t = p.name("expected a port name");
            declare(t, dir!, portOrder.length);
            portOrder.push(t);
          } else {
            portOrder.push(p.name("expected a port name (in a non-ANSI header, only the names; declare them input or output inside)"));
            if (p.is("[")) p.unexpected(p.peek(), "ports are whole signals");
          }
          if (p.is(",")) {
            p.next();
            continue;
          }
          break;
        }
      }
      p.expect(")", "close the port list with )");
    }
    p.expect(";", "end the module header with ;");
  });
  if (!headerOk) return refused(diags);

  // ---- items ----
  const drivers: Driver[] = [];
  const driven = new Map<string, Token>();
  const addDriver = (target: Token, parsed: { expr: Expr; reads: Token[] }) => {
    const s = signals.get(target.text);
    if (!s) return p.refuse(target, `${target.text} is not declared; declare it as an output or a wire before assigning it`);
    if (s.kind === "input") p.refuse(target, `${target.text} is an input and cannot be assigned; assign an output or a wire`);
    const before = driven.get(target.text);
    if (before) p.refuse(target, `${target.text} is already assigned at line ${before.line}; each output and wire gets exactly one assignment`);
    driven.set(target.text, target);
    drivers.push({ target, expr: parsed.expr, reads: parsed.reads });
  };

  let ended = false;
  while (!p.atEnd() && !ended) {
    const t = p.peek();
    const ok = refuseAt(() => {
      if (p.is("endmodule")) {
        p.next();
        ended = true;
        return;
      }
      if (p.is("input") || p.is("output")) {
        const dir = p.next().text as "input" | "output";
        if (ansi) p.refuse(t, `the header already declares the ports (ANSI style); a separate ${dir} declaration is not allowed there`);
        if (p.is("wire")) p.next();
        if (p.is("[")) p.refuse(p.peek(), `vector ${dir}s ([msb:lsb]) are outside the imported subset: every port is one bit`);
        if (p.is("reg")) p.unexpected(p.peek(), "outputs are nets driven by assign");
        for (;;) {
          const id = p.name(`expected the name of an ${dir}`);
          const port = portOrder.findIndex((q) => q.text === id.text);
          if (port < 0) p.refuse(id, `${id.text} is declared ${dir} but is not in the module's port list; add it to the list in the header`);
          declare(id, dir, port);
          if (p.is(",")) {
            p.next();
            continue;
          }
          break;
        }
        p.expect(";", "end the declaration with ;");
        return;
      }
      if (p.is("wire")) {
        p.next();
        if (p.is("[")) p.refuse(p.peek(), "vector wires ([msb:lsb]) are outside the imported subset: every wire is one bit");
        if (p.is("#")) p.refuse(p.peek(), "delays (#) are outside the imported subset");
        if (p.is("(")) p.refuse(p.peek(), "drive strengths are outside the imported subset");
        for (;;) {
          const id = p.name("expected the name of a wire");
          if (p.is("[")) p.refuse(p.peek(), "arrays of wires are outside the imported subset");
          declare(id, "wire", -1);
          if (p.is("=")) {
            p.next();
            addDriver(id, p.expression());
          }
          if (p.is(",")) {
            p.next();
            continue;
          }
          break;
        }
        p.expect(";", "end the declaration with ;");
        return;
      }
      if (p.is("assign")) {
        p.next();
        if (p.is("#")) p.refuse(p.peek(), "delays (#) are outside the imported subset: the import reads logic, not timing");
        if (p.is("(")) p.refuse(p.peek(), "drive strengths are outside the imported subset");
        for (;;) {
          if (p.is("{")) p.refuse(p.peek(), "an assignment to a concatenation ({...}) is outside the imported subset: assign each signal on its own");
          const target = p.name("expected the signal to assign");
          if (p.is("[")) p.refuse(p.peek(), `an assignment to a bit-select (${target.text}[...]) is outside the imported subset: signals are one bit wide`);
          p.expect("=", "write = after the assigned signal");
          addDriver(target, p.expression());
          if (p.is(",")) {
            p.next();
            continue;
          }
          break;
        }
        p.expect(";", "end the assignment with ;");
        return;
      }
      if (p.is("module") || p.is("macromodule")) p.refuse(t, "a module starts here before endmodule; import one module, ended by endmodule");
      const k = p.peek();
      if (k.kind === "id" && !VERILOG_KEYWORDS.has(k.text)) {
        p.refuse(k, `an instance of module ${k.text} is outside the imported subset; import a flat module of assign statements`);
      }
      p.unexpected(k, "the module body takes input, output and wire declarations and assign statements");
    });
    if (!ok) p.recover();
  }
  if (!ended && !diags.length) {
    const e = p.peek();
    diags.push({ severity: "error", message: "the module has no endmodule; end it with endmodule", line: e.line, column: e.column, endLine: e.endLine, endColumn: e.endColumn });
  }
  if (ended && !p.atEnd()) {
    const extra = p.peek();
    diags.push({
      severity: "error",
      message: p.is("module") ? "a second module starts here; import one module per file" : `text follows endmodule ("${extra.text}"); import one module per file`,
      line: extra.line, column: extra.column, endLine: extra.endLine, endColumn: extra.endColumn,
    });
  }
  if (diags.length) return refused(diags);

  // ---- meaning ----
  const refuseTok = (t: Token, message: string) => diags.push({ severity: "error", message, line: t.line, column: t.column, endLine: t.endLine, endColumn: t.endColumn });
  for (const q of portOrder) {
    const s = signals.get(q.text);
    if (!s || s.kind === "wire") refuseTok(q, `the port ${q.text} is never declared input or output; declare it in the module body`);
  }
  const inputs = [...signals.values()].filter((s) => s.kind === "input").sort((a, b) => a.port - b.port);
  const outputs = [...signals.values()].filter((s) => s.kind === "output").sort((a, b) => a.port - b.port);
  const nameTok = toks.find((t) => t.kind === "id" && t.text === moduleName)!;
  if (inputs.length === 0 && !diags.length) refuseTok(nameTok, `module ${moduleName} has no inputs; a design needs at least one input`);
  if (outputs.length === 0 && !diags.length) refuseTok(nameTok, `module ${moduleName} has no outputs; a design needs at least one output`);
  if (inputs.length > DEFAULT_LIMITS.maxInputsPerOutput) {
    refuseTok(inputs[DEFAULT_LIMITS.maxInputsPerOutput]!.at, `the module has ${inputs.length} inputs; the language takes at most ${DEFAULT_LIMITS.maxInputsPerOutput} inputs per design (maxInputsPerOutput). Split the module`);
  }
  for (const o of outputs) if (!driven.has(o.name)) refuseTok(o.at, `the output ${o.name} is never assigned; give it an assign statement`);
  for (const d of drivers) {
    for (const r of d.reads) {
      const s = signals.get(r.text);
      if (!s) refuseTok(r, `${r.text} is not declared; declare it as an input or a wire (implicit nets are not imported)`);
      else if (s.kind === "wire" && !driven.has(r.text)) refuseTok(r, `the wire ${r.text} is read but never assigned; assign it, or read another signal`);
    }
  }
  if (!diags.length) {
    const loop = findLoop(drivers, signals);
    if (loop) refuseTok(loop.at, `the assignments form a loop (${loop.names.join(" → ")}); combinational logic cannot depend on itself`);
  }
  if (diags.length) return refused(diags);

  const warnings: ImportDiagnostic[] = [];
  for (const s of signals.values()) {
    if (s.kind === "wire" && !driven.has(s.name) && !drivers.some((d) => d.reads.some((r) => r.text === s.name))) {
      warnings.push({ severity: "warning", message: `the wire ${s.name} is declared but neither assigned nor read; it is left out`, line: s.at.line, column: s.at.column, endLine: s.at.endLine, endColumn: s.at.endColumn });
    }
  }

  const lines = [
    `// Imported from Verilog module ${moduleName}${options.name ? ` (${options.name.replace(/[\r\n]+/g, " ").slice(0, 120)})` : ""}`,
    wrapJoin("inputs ", inputs.map((s) => s.name), ", "),
    wrapJoin("outputs ", outputs.map((s) => s.name), ", "),
    "",
  ];
  for (const d of drivers) {
    const isWire = signals.get(d.target.text)!.kind === "wire";
    lines.push(`${isWire ? "let " : ""}${d.target.text} = ${formatExpr(d.expr)}`);
  }
  const source = lines.join("\n") + "\n";
  if (source.length > DEFAULT_LIMITS.maxSourceLength) {
    return refused([{ severity: "error", message: `the module makes a design source of ${source.length.toLocaleString("en")} characters, over the language's limit of ${DEFAULT_LIMITS.maxSourceLength.toLocaleString("en")}; split the module`, line: 1, column: 1, endLine: 1, endColumn: 2 }]);
  }
  return { source, inputs: inputs.map((s) => s.name), outputs: outputs.map((s) => s.name), diagnostics: sortImportDiagnostics(warnings) };
}

/** A cycle among the assignments, found without recursion (chains of wires may be long). */
function findLoop(drivers: Driver[], signals: Map<string, Signal>): { at: Token; names: string[] } | null {
  const byTarget = new Map(drivers.map((d) => [d.target.text, d]));
  const state = new Map<string, 1 | 2>(); // 1: on the path, 2: done
  for (const start of drivers) {
    if (state.has(start.target.text)) continue;
    const path: Array<{ name: string; next: number; reads: string[] }> = [];
    const enter = (name: string) => {
      state.set(name, 1);
      const reads = (byTarget.get(name)?.reads ?? []).map((r) => r.text).filter((r) => signals.get(r)?.kind !== "input");
      path.push({ name, next: 0, reads });
    };
    enter(start.target.text);
    while (path.length) {
      const top = path[path.length - 1]!;
      if (top.next >= top.reads.length) {
        state.set(top.name, 2);
        path.pop();
        continue;
      }
      const r = top.reads[top.next++]!;
      const s = state.get(r);
      if (s === 1) {
        const from = path.findIndex((q) => q.name === r);
        const names = [...path.slice(from).map((q) => q.name), r];
        return { at: byTarget.get(r)!.target, names };
      }
      if (s === undefined && byTarget.has(r)) enter(r);
    }
  }
  return null;
}
