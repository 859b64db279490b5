/**
 * The canonical printer. Canonical form: one statement per line; ' for NOT;
 * * + ^ for AND, OR, XOR with single spaces; the fewest parentheses the
 * precedence needs (chains of one associative operator are flattened);
 * comments kept where they were; at most one blank line in a row; block
 * bodies indented by two spaces.
 */
import type { Expr, Program, Rhs, SetClause, Statement } from "./ast";

const PREC = { or: 1, xor: 2, and: 3, not: 4, const: 5, ref: 5, call: 5 } as const;
const OP = { or: " + ", xor: " ^ ", and: " * " } as const;

/** An expression in canonical form. */
export function formatExpr(e: Expr): string {
  return fmt(e, 0);
}

function fmt(e: Expr, min: number): string {
  const s = raw(e);
  return PREC[e.kind] < min ? `(${s})` : s;
}

function raw(e: Expr): string {
  switch (e.kind) {
    case "const":
      return String(e.value);
    case "ref":
      return e.name;
    case "call":
      return `${e.block.text}(${e.args.map((a) => fmt(a, 0)).join(", ")})`;
    case "not":
      return PREC[e.operand.kind] >= PREC.not ? `${raw(e.operand)}'` : `(${raw(e.operand)})'`;
    case "and":
    case "or":
    case "xor":
      return e.operands.map((o) => fmt(o, PREC[e.kind])).join(OP[e.kind]);
  }
}

function clause(c: SetClause): string {
  return `${c.kind}(${c.items.map((i) => (i.lo === i.hi ? String(i.lo) : `${i.lo}..${i.hi}`)).join(", ")})`;
}

function rhs(v: Rhs): string {
  if (v.kind === "expr") return fmt(v.expr, 0) + (v.dc ? " " + clause(v.dc) : "");
  const order = { on: 0, off: 0, dc: 1 } as const;
  return [...v.clauses].sort((a, b) => order[a.kind] - order[b.kind]).map(clause).join(" ");
}

function names(ns: { text: string }[]): string {
  return ns.map((n) => n.text).join(", ");
}

function statementText(s: Exclude<Statement, { kind: "block" }>): string {
  switch (s.kind) {
    case "inputs":
      return `inputs ${names(s.names)}`;
    case "outputs":
      return `outputs ${names(s.names)}`;
    case "never":
      return `never ${fmt(s.condition, 0)}`;
    case "use":
      return `use ${s.name.text} from "${s.library}"${s.revision === null ? "" : ` at ${s.revision}`}`;
    case "assign": {
      const target = s.tuple ? `(${names(s.targets)})` : s.targets[0]!.text;
      return `${s.isLet ? "let " : ""}${target} = ${rhs(s.value)}`;
    }
  }
}

interface Unit {
  text: string;
  start: number;
  end: number;
  indent: number;
  trailing: string[];
}

/** Prints a parsed program in canonical form (see the module comment). */
export function formatProgram(p: Program): string {
  const units: Unit[] = [];
  const blockSpans: [number, number][] = [];
  const add = (text: string, start: number, end: number, indent: number) => units.push({ text, start, end, indent, trailing: [] });
  for (const s of p.statements) {
    if (s.kind === "block") {
      const results = s.results.length === 1 ? s.results[0]!.text : `(${names(s.results)})`;
      add(`block ${s.name.text}(${names(s.params)}) -> ${results}`, s.headerRange.line, s.headerRange.endLine, 0);
      for (const b of s.body) {
        if (b.kind !== "block") add(statementText(b), b.range.line, b.range.endLine, 1);
      }
      add("end", s.range.endLine, s.range.endLine, 0);
      blockSpans.push([s.headerRange.endLine, s.range.endLine]);
    } else {
      add(statementText(s), s.range.line, s.range.endLine, 0);
    }
  }
  for (const c of p.comments) {
    const line = c.range.line;
    if (c.trailing) {
      const owner = units.find((u) => u.start <= line && line <= u.end);
      if (owner) {
        owner.trailing.push(c.text);
        continue;
      }
    }
    const inBlock = blockSpans.some(([a, b]) => a < line && line < b);
    add(c.text, line, line, inBlock ? 1 : 0);
  }
  units.sort((a, b) => a.start - b.start || a.end - b.end);
  const blanks = new Set(p.blankLines);
  const out: string[] = [];
  let prevEnd = -1;
  for (const u of units) {
    if (prevEnd >= 0) {
      for (let l = prevEnd + 1; l < u.start; l++) {
        if (blanks.has(l)) {
          out.push("");
          break;
        }
      }
    }
    const trailing = u.trailing.length > 0 ? "  " + u.trailing.join(" ") : "";
    out.push("  ".repeat(u.indent) + u.text + trailing);
    prevEnd = Math.max(prevEnd, u.end);
  }
  return out.length === 0 ? "" : out.join("\n") + "\n";
}
