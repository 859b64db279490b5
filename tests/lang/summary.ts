/**
 * An S-expression summary of a parsed program, written independently of the
 * formatter so that golden files check the tree shape, not the printer.
 */
import type { Expr, Program, Rhs, Statement } from "../../lib/lang/index";

export function exprSummary(e: Expr): string {
  switch (e.kind) {
    case "const":
      return String(e.value);
    case "ref":
      return e.name;
    case "not":
      return `(not ${exprSummary(e.operand)})`;
    case "and":
    case "or":
    case "xor":
      return `(${e.kind} ${e.operands.map(exprSummary).join(" ")})`;
    case "call":
      return `(call ${e.block.text}${e.args.map((a) => " " + exprSummary(a)).join("")})`;
  }
}

function rhsSummary(v: Rhs): string {
  if (v.kind === "expr") return exprSummary(v.expr) + (v.dc ? ` dc[${v.dc.items.map(item).join(" ")}]` : "");
  return v.clauses.map((c) => `${c.kind}[${c.items.map(item).join(" ")}]`).join(" ");
}

function item(i: { lo: number; hi: number }): string {
  return i.lo === i.hi ? String(i.lo) : `${i.lo}..${i.hi}`;
}

export function statementSummary(s: Statement): string {
  switch (s.kind) {
    case "inputs":
    case "outputs":
      return `${s.kind} ${s.names.map((n) => n.text).join(" ")}`;
    case "never":
      return `never ${exprSummary(s.condition)}`;
    case "use":
      return `use ${s.name.text} from ${s.library}${s.revision === null ? "" : ` at ${s.revision}`}`;
    case "block":
      return `block ${s.name.text}(${s.params.map((p) => p.text).join(" ")}) -> (${s.results.map((p) => p.text).join(" ")}) { ${s.body.map(statementSummary).join("; ")} }`;
    case "assign": {
      const t = s.tuple ? `(${s.targets.map((x) => x.text).join(" ")})` : s.targets[0]!.text;
      return `${s.isLet ? "let " : ""}${t} = ${rhsSummary(s.value)}`;
    }
  }
}

export function programSummary(p: Program): string[] {
  return p.statements.map(statementSummary);
}
