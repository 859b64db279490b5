/**
 * The typed syntax tree of a Fanbound source. Every node carries its source
 * range: lines and columns are 1-based and the end is exclusive (the column
 * just after the last character), the same convention as Diagnostic.
 */

export interface Range {
  line: number;
  column: number;
  endLine: number;
  endColumn: number;
}

export interface Name {
  text: string;
  range: Range;
}

export type Expr =
  | { kind: "const"; value: number; range: Range }
  | { kind: "ref"; name: string; range: Range }
  | { kind: "not"; operand: Expr; range: Range }
  | { kind: "and" | "xor" | "or"; operands: Expr[]; range: Range }
  | { kind: "call"; block: Name; args: Expr[]; range: Range };

/** One element of on(...), off(...) or dc(...): a minterm index or an inclusive range lo..hi. */
export interface IndexItem {
  lo: number;
  hi: number;
  range: Range;
}

export interface SetClause {
  kind: "on" | "off" | "dc";
  items: IndexItem[];
  range: Range;
}

export type Rhs =
  | { kind: "expr"; expr: Expr; dc: SetClause | null; range: Range }
  | { kind: "sets"; clauses: SetClause[]; range: Range };

export type Statement =
  | { kind: "inputs"; names: Name[]; range: Range }
  | { kind: "outputs"; names: Name[]; range: Range }
  /** `f = ...`, `let t = ...`, `(s, c) = blk(a, b)` and `let (s, c) = blk(a, b)`. */
  | { kind: "assign"; isLet: boolean; tuple: boolean; targets: Name[]; value: Rhs; range: Range }
  | { kind: "never"; condition: Expr; range: Range }
  | { kind: "block"; name: Name; params: Name[]; results: Name[]; body: Statement[]; range: Range; headerRange: Range }
  /** `use name from "library" at 3`; revisionRange is the number's range (null without `at`). */
  | { kind: "use"; name: Name; library: string; libraryRange: Range; revision: number | null; revisionRange: Range | null; range: Range };

export interface Comment {
  /** Text including the leading //. */
  text: string;
  range: Range;
  /** True when code precedes the comment on its line. */
  trailing: boolean;
}

export interface Program {
  statements: Statement[];
  comments: Comment[];
  /** Source lines that are blank (no tokens, no comment), used by the formatter to keep paragraph breaks. */
  blankLines: number[];
}
