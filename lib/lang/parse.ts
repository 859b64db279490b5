/**
 * Source text → AST with syntax diagnostics.
 *
 * The token stream is cut into logical lines first (a newline ends a
 * statement unless the line ends with an operator, a comma, '(' or '=', or
 * leaves a parenthesis open, and the next line does not itself start a
 * statement), and
 * each line is parsed on its own. A mistake therefore yields exactly one
 * diagnostic and never disturbs the lines after it. Block headers and `end`
 * are line statements too; grouping them into blocks happens here.
 */
import { EOF, type IToken } from "chevrotain";
import type { Comment, Program, Range, Statement } from "./ast";
import { buildStatement, tokenRange, type LineStatement } from "./build";
import { error, positionAt, type Diagnostic } from "./diagnostics";
import { lineParser } from "./grammar";
import { withDefaults, type LanguageLimits } from "./limits";
import { Bang, Block, CONTINUES_LINE, Quote, Tilde, Comma, End, Equals, Identifier, Inputs, Let, lexer, LParen, Never, Newline, Outputs, RParen, Use } from "./tokens";

export interface ParseResult {
  /** The statements that parsed; lines with errors are left out. */
  program: Program;
  /** Syntax and structure diagnostics (all errors). */
  diagnostics: Diagnostic[];
  /** False when a size limit stopped parsing before any statement was read. */
  complete: boolean;
}

/**
 * Parses a Fanbound source. Never throws; every diagnostic range lies inside
 * the source. A byte-order mark (U+FEFF) at the very start is ignored, and
 * positions count from the character after it, as editors show the text. Limits used: maxSourceLength (default 200000 characters) and
 * maxStatements (default 2000).
 */
export function parseSource(text: string, options?: LanguageLimits): ParseResult {
  // A UTF-8 byte-order mark, which some editors write at the start of a file, is not part of the text.
  const source = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const limits = withDefaults(options);
  const diagnostics: Diagnostic[] = [];
  const empty: Program = { statements: [], comments: [], blankLines: [] };
  if (source.length > limits.maxSourceLength) {
    const p = positionAt(source, limits.maxSourceLength);
    diagnostics.push(
      error(
        `the source is ${source.length} characters long; the limit is ${limits.maxSourceLength} (maxSourceLength). Split the design into smaller designs`,
        { line: p.line, column: p.column, endLine: p.line, endColumn: p.column },
      ),
    );
    return { program: empty, diagnostics, complete: false };
  }

  const lexed = lexer.tokenize(source);
  const badLines = new Set<number>();
  for (const e of lexed.errors) {
    const line = e.line ?? 1;
    const column = e.column ?? 1;
    badLines.add(line);
    diagnostics.push(error(e.message, { line, column, endLine: line, endColumn: column + e.length }));
  }

  const physical: IToken[][] = [];
  let current: IToken[] = [];
  for (const t of lexed.tokens) {
    if (t.tokenType === Newline) {
      if (current.length > 0) physical.push(current);
      current = [];
    } else {
      current.push(t);
    }
  }
  if (current.length > 0) physical.push(current);
  const lines: IToken[][] = [];
  let open = 0;
  for (const p of physical) {
    const last = lines[lines.length - 1];
    const continues = last !== undefined && (open > 0 || CONTINUES_LINE.has(last[last.length - 1]!.tokenType));
    if (continues && !startsStatement(p)) {
      last.push(...p);
    } else {
      lines.push([...p]);
      open = 0;
    }
    for (const t of p) open = t.tokenType === LParen ? open + 1 : t.tokenType === RParen ? Math.max(0, open - 1) : open;
  }

  if (lines.length > limits.maxStatements) {
    const first = lines[limits.maxStatements]![0]!;
    diagnostics.push(
      error(
        `the source has ${lines.length} statements; the limit is ${limits.maxStatements} (maxStatements). Move reusable parts into blocks or split the design`,
        tokenRange(first),
      ),
    );
    return { program: empty, diagnostics, complete: false };
  }

  const parser = lineParser();
  const lineStatements: LineStatement[] = [];
  for (const line of lines) {
    const startLine = line[0]!.startLine!;
    const endLine = line[line.length - 1]!.endLine!;
    let skip = false;
    for (let l = startLine; l <= endLine; l++) if (badLines.has(l)) skip = true;
    if (skip) continue;
    const tooDeep = nestingError(line, limits.maxNesting);
    if (tooDeep) {
      diagnostics.push(tooDeep);
      continue;
    }
    parser.input = line;
    const cst = parser.statement();
    if (parser.errors.length > 0) {
      const e = parser.errors[0]!;
      const tok = e.token;
      const range =
        tok.tokenType === EOF || !Number.isFinite(tok.startOffset) ? tokenRange(line[line.length - 1]!) : tokenRange(tok);
      diagnostics.push(error(e.message, range));
      continue;
    }
    lineStatements.push(buildStatement(cst));
  }

  const statements = groupBlocks(lineStatements, diagnostics);

  const codeLines = new Set<number>();
  for (const t of lexed.tokens) if (t.tokenType !== Newline) codeLines.add(t.startLine!);
  const comments: Comment[] = (lexed.groups.comments ?? []).map((t) => ({
    text: t.image.replace(/\s+$/, ""),
    range: tokenRange(t),
    trailing: codeLines.has(t.startLine!),
  }));
  const commentLines = new Set(comments.map((c) => c.range.line));
  const lineCount = source.split("\n").length;
  const blankLines: number[] = [];
  for (let l = 1; l <= lineCount; l++) if (!codeLines.has(l) && !commentLines.has(l) && !badLines.has(l)) blankLines.push(l);

  return { program: { statements, comments, blankLines }, diagnostics, complete: true };
}

const NOTS = new Set([Bang, Tilde, Quote]);

/** Parsing, printing and elaborating recurse along nesting, so it is bounded (maxNesting). */
function nestingError(line: IToken[], limit: number): Diagnostic | null {
  let depth = 0;
  let run = 0;
  for (const t of line) {
    if (t.tokenType === LParen) depth++;
    else if (t.tokenType === RParen) depth = Math.max(0, depth - 1);
    run = NOTS.has(t.tokenType) ? run + 1 : 0;
    if (depth > limit) {
      return error(`parentheses nest more than ${limit} deep here; the limit is ${limit} (maxNesting). Name inner parts with let`, tokenRange(t));
    }
    if (run > limit) {
      return error(`more than ${limit} NOT signs in a row; the limit is ${limit} (maxNesting). Two NOTs cancel, so remove pairs of them`, tokenRange(t));
    }
  }
  return null;
}

const STARTERS = new Set([Inputs, Outputs, Let, Never, Block, End, Use]);

/**
 * True when a physical line reads as the start of a statement (a keyword that
 * begins one, `name =` or `(names) =`). Such a line is never taken as the
 * continuation of a line that ended with an operator, so a dangling operator
 * gives one error on its own line.
 */
function startsStatement(p: IToken[]): boolean {
  const first = p[0]!;
  if (STARTERS.has(first.tokenType)) return true;
  if (first.tokenType === Identifier) return p[1]?.tokenType === Equals;
  if (first.tokenType === LParen) {
    const close = p.findIndex((t) => t.tokenType === RParen);
    return close > 0 && p[close + 1]?.tokenType === Equals && p.slice(1, close).every((t) => t.tokenType === Identifier || t.tokenType === Comma);
  }
  return false;
}

const notInBlock: Record<string, string> = {
  inputs: "inputs are declared once for the design; a block's inputs are its parameters",
  outputs: "outputs are declared once for the design; a block's results follow -> in its header",
  never: "impossible combinations belong to the design, not to a block; move this never line out of the block",
  use: "library blocks are brought in at the top of the design, not inside a block",
};

function groupBlocks(lines: LineStatement[], diagnostics: Diagnostic[]): Statement[] {
  const top: Statement[] = [];
  let open: Extract<Statement, { kind: "block" }> | null = null;
  const close = (at: Range | null) => {
    if (!open) return;
    if (at) open.range = { ...open.range, endLine: at.endLine, endColumn: at.endColumn };
    top.push(open);
    open = null;
  };
  for (const s of lines) {
    if (s.kind === "blockHeader") {
      if (open) {
        const o: Extract<Statement, { kind: "block" }> = open;
        diagnostics.push(
          error(`block '${s.name.text}' starts before block '${o.name.text}' has ended; add end after the body of '${o.name.text}'`, s.range),
        );
        close(null);
      }
      open = { kind: "block", name: s.name, params: s.params, results: s.results, body: [], range: s.range, headerRange: s.range };
      continue;
    }
    if (s.kind === "end") {
      if (!open) diagnostics.push(error("end without a block to close; remove it or add a block header above", s.range));
      else close(s.range);
      continue;
    }
    if (open) {
      const o: Extract<Statement, { kind: "block" }> = open;
      const why = notInBlock[s.kind];
      if (why) {
        diagnostics.push(error(`not allowed inside block '${o.name.text}': ${why}`, s.range));
        continue;
      }
      o.body.push(s);
    } else {
      top.push(s);
    }
  }
  if (open) {
    const o: Extract<Statement, { kind: "block" }> = open;
    diagnostics.push(error(`block '${o.name.text}' has no end; add a line with end after its body`, o.headerRange));
    close(null);
  }
  return top;
}
