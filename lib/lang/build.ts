/**
 * The CST visitor: turns one parsed line into a typed AST statement with
 * source ranges. No checks of meaning happen here.
 */
import type { CstElement, CstNode, IToken } from "chevrotain";
import type { Expr, IndexItem, Name, Range, Rhs, SetClause, Statement } from "./ast";
import { lineParser } from "./grammar";

type Ctx = Record<string, CstElement[] | undefined>;

export function tokenRange(t: IToken): Range {
  return { line: t.startLine!, column: t.startColumn!, endLine: t.endLine!, endColumn: t.endColumn! + 1 };
}

function nodeRange(n: CstNode): Range {
  const l = n.location!;
  return { line: l.startLine!, column: l.startColumn!, endLine: l.endLine!, endColumn: l.endColumn! + 1 };
}

function tokens(ctx: Ctx, key: string): IToken[] {
  return (ctx[key] ?? []) as IToken[];
}

function nodes(ctx: Ctx, key: string): CstNode[] {
  return (ctx[key] ?? []) as CstNode[];
}

function nameOf(t: IToken): Name {
  return { text: t.image, range: tokenRange(t) };
}

function span(a: Range, b: Range): Range {
  return { line: a.line, column: a.column, endLine: b.endLine, endColumn: b.endColumn };
}

/** Block headers are statements of their own here; parse.ts groups a block's lines. */
export type LineStatement =
  | Exclude<Statement, { kind: "block" }>
  | { kind: "blockHeader"; name: Name; params: Name[]; results: Name[]; range: Range }
  | { kind: "end"; range: Range };

const BaseVisitor = lineParser().getBaseCstVisitorConstructor();

class AstBuilder extends BaseVisitor {
  constructor() {
    super();
    this.validateVisitor();
  }

  /** Visits a node, handing the node itself on so that each method can read its location. */
  private v(node: CstNode): unknown {
    return this.visit(node, node);
  }

  statement(ctx: Ctx): LineStatement {
    const [child] = Object.values(ctx).flat() as CstNode[];
    return this.v(child!) as LineStatement;
  }

  nameList(ctx: Ctx): Name[] {
    return tokens(ctx, "Identifier").map(nameOf);
  }

  inputsDecl(ctx: Ctx, node: CstNode): LineStatement {
    return { kind: "inputs", names: this.v(nodes(ctx, "nameList")[0]!) as Name[], range: nodeRange(node) };
  }

  outputsDecl(ctx: Ctx, node: CstNode): LineStatement {
    return { kind: "outputs", names: this.v(nodes(ctx, "nameList")[0]!) as Name[], range: nodeRange(node) };
  }

  target(ctx: Ctx): { names: Name[]; tuple: boolean } {
    const list = nodes(ctx, "nameList")[0];
    if (list) return { names: this.v(list) as Name[], tuple: true };
    return { names: [nameOf(tokens(ctx, "Identifier")[0]!)], tuple: false };
  }

  letStmt(ctx: Ctx, node: CstNode): LineStatement {
    return this.assignLike(ctx, node, true);
  }

  assignment(ctx: Ctx, node: CstNode): LineStatement {
    return this.assignLike(ctx, node, false);
  }

  private assignLike(ctx: Ctx, node: CstNode, isLet: boolean): LineStatement {
    const t = this.v(nodes(ctx, "target")[0]!) as { names: Name[]; tuple: boolean };
    const value = this.v(nodes(ctx, "rhs")[0]!) as Rhs;
    return { kind: "assign", isLet, tuple: t.tuple, targets: t.names, value, range: nodeRange(node) };
  }

  neverStmt(ctx: Ctx, node: CstNode): LineStatement {
    return { kind: "never", condition: this.v(nodes(ctx, "expression")[0]!) as Expr, range: nodeRange(node) };
  }

  blockHeader(ctx: Ctx, node: CstNode): LineStatement {
    const list = nodes(ctx, "nameList")[0];
    return {
      kind: "blockHeader",
      name: nameOf(tokens(ctx, "Identifier")[0]!),
      params: list ? (this.v(list) as Name[]) : [],
      results: this.v(nodes(ctx, "blockResults")[0]!) as Name[],
      range: nodeRange(node),
    };
  }

  blockResults(ctx: Ctx): Name[] {
    const list = nodes(ctx, "nameList")[0];
    if (list) return this.v(list) as Name[];
    return [nameOf(tokens(ctx, "Identifier")[0]!)];
  }

  endStmt(_ctx: Ctx, node: CstNode): LineStatement {
    return { kind: "end", range: nodeRange(node) };
  }

  useStmt(ctx: Ctx, node: CstNode): LineStatement {
    const lib = tokens(ctx, "String")[0]!;
    const rev = tokens(ctx, "Number")[0];
    return {
      kind: "use",
      name: nameOf(tokens(ctx, "Identifier")[0]!),
      library: lib.image.slice(1, -1),
      libraryRange: tokenRange(lib),
      revision: rev ? Number(rev.image) : null,
      revisionRange: rev ? tokenRange(rev) : null,
      range: nodeRange(node),
    };
  }

  rhs(ctx: Ctx, node: CstNode): Rhs {
    const clauses = nodes(ctx, "setClause").map((n) => this.v(n) as SetClause);
    const e = nodes(ctx, "expression")[0];
    if (e) return { kind: "expr", expr: this.v(e) as Expr, dc: clauses[0] ?? null, range: nodeRange(node) };
    return { kind: "sets", clauses, range: nodeRange(node) };
  }

  setClause(ctx: Ctx, node: CstNode): SetClause {
    const kind = ctx.Kw_on ? "on" : ctx.Kw_off ? "off" : "dc";
    return { kind, items: nodes(ctx, "indexItem").map((n) => this.v(n) as IndexItem), range: nodeRange(node) };
  }

  indexItem(ctx: Ctx, node: CstNode): IndexItem {
    const [lo, hi] = tokens(ctx, "Number");
    const a = Number(lo!.image);
    return { lo: a, hi: hi ? Number(hi.image) : a, range: nodeRange(node) };
  }

  expression(ctx: Ctx): Expr {
    return this.v(nodes(ctx, "orExpr")[0]!) as Expr;
  }

  private nary(kind: "or" | "xor" | "and", parts: CstNode[], node: CstNode): Expr {
    const operands = parts.map((p) => this.v(p) as Expr);
    if (operands.length === 1) return operands[0]!;
    return { kind, operands, range: nodeRange(node) };
  }

  orExpr(ctx: Ctx, node: CstNode): Expr {
    return this.nary("or", nodes(ctx, "xorExpr"), node);
  }

  xorExpr(ctx: Ctx, node: CstNode): Expr {
    return this.nary("xor", nodes(ctx, "andExpr"), node);
  }

  andExpr(ctx: Ctx, node: CstNode): Expr {
    return this.nary("and", nodes(ctx, "unary"), node);
  }

  unary(ctx: Ctx, node: CstNode): Expr {
    let e = this.v(nodes(ctx, "postfix")[0]!) as Expr;
    const prefix = tokens(ctx, "Bang").length + tokens(ctx, "Tilde").length;
    const range = nodeRange(node);
    for (let i = 0; i < prefix; i++) e = { kind: "not", operand: e, range };
    return e;
  }

  postfix(ctx: Ctx, node: CstNode): Expr {
    let e = this.v(nodes(ctx, "atom")[0]!) as Expr;
    const quotes = tokens(ctx, "Quote");
    for (const q of quotes) e = { kind: "not", operand: e, range: span(e.range, tokenRange(q)) };
    void node;
    return e;
  }

  atom(ctx: Ctx, node: CstNode): Expr {
    const range = nodeRange(node);
    const num = tokens(ctx, "Number")[0];
    if (num) return { kind: "const", value: Number(num.image), range };
    const id = tokens(ctx, "Identifier")[0];
    if (id) {
      if (ctx.LParen) {
        const args = nodes(ctx, "expression").map((n) => this.v(n) as Expr);
        return { kind: "call", block: nameOf(id), args, range };
      }
      return { kind: "ref", name: id.image, range };
    }
    return this.v(nodes(ctx, "expression")[0]!) as Expr;
  }
}

let builder: AstBuilder | null = null;

/** Builds the AST statement of one successfully parsed line. */
export function buildStatement(cst: CstNode): LineStatement {
  builder ??= new AstBuilder();
  return builder.visit(cst) as LineStatement;
}
