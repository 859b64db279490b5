/**
 * The Fanbound equation language: parse, check, elaborate and format.
 * Pure: no I/O. Two entry points for most callers, compileSource and
 * formatSource; the stages are exported for the editor and the tests.
 */
import type { FunctionSpec } from "../logic/index";
import type { Program } from "./ast";
import { checkProgram, hasErrors } from "./check";
import { sortDiagnostics, type Diagnostic } from "./diagnostics";
import { checkNeverCoverage, elaborate } from "./elaborate";
import { formatProgram } from "./format";
import { withDefaults, type LanguageLimits } from "./limits";
import { parseSource } from "./parse";
import { checkBlockSource, importBlocks } from "./imports";
import type { LibraryResolver, UsedBlock } from "./library";

export type { Diagnostic } from "./diagnostics";
export type { Program, Statement, Expr, Rhs, SetClause, IndexItem, Name, Range, Comment } from "./ast";
export type { LanguageLimits } from "./limits";
export { DEFAULT_LIMITS } from "./limits";
export { parseSource, type ParseResult } from "./parse";
export { KEYWORDS } from "./tokens";
export { formatExpr } from "./format";
export { symbolTable, type SymbolInfo } from "./symbols";
export { highlightToHtml } from "./highlight";
export { findUses, resolverFrom, requestKey, type LibraryAnswer, type LibraryRequest, type LibraryResolver, type UseLine, type UsedBlock } from "./library";

/** Options of {@link compileSource}: the size limits, and where library blocks come from. */
export interface CompileOptions extends LanguageLimits {
  /**
   * Answers the source's `use` lines with the source of each block revision.
   * Without it, every `use` line is an error saying where library blocks can
   * be used (the server, the CLI).
   */
  resolve?: LibraryResolver;
}

export interface CompiledSource {
  /** Errors and warnings, ordered by position. */
  diagnostics: Diagnostic[];
  /** The elaborated function; null when any diagnostic is an error. */
  spec: FunctionSpec | null;
  /**
   * The statements that parsed (lines with syntax errors are left out, so the
   * editor can still offer names); null only when a size limit stopped parsing.
   */
  ast: Program | null;
  /** The library blocks the use lines brought in (those that resolved), in source order. */
  libraries: UsedBlock[];
}

/**
 * Parses, checks and elaborates a source. Meaning checks run only when the
 * source has no syntax errors, so one mistake gives one diagnostic.
 * Limits default to DEFAULT_LIMITS (200000 characters, 2000 statements,
 * 30 inputs per output, nesting 64 deep, 20000 product terms). Never throws on any text.
 */
export function compileSource(source: string, options?: CompileOptions): CompiledSource {
  try {
    return compileUnguarded(source, options);
  } catch (e) {
    if (!(e instanceof RangeError)) throw e;
    return { diagnostics: [tooDeep()], spec: null, ast: null, libraries: [] };
  }
}

// Recursion follows the nesting of expressions and block calls; maxNesting bounds
// one line, and this catches what is left (long chains of blocks calling blocks).
function tooDeep(): Diagnostic {
  return {
    severity: "error",
    message: "the design nests too deeply to work out (blocks calling blocks, or very deep expressions); flatten it with let",
    line: 1,
    column: 1,
    endLine: 1,
    endColumn: 1,
  };
}

function compileUnguarded(source: string, options?: CompileOptions): CompiledSource {
  const { resolve, ...rest } = options ?? {};
  const limits = withDefaults(rest);
  const parsed = parseSource(source, limits);
  const diagnostics = [...parsed.diagnostics];
  const ast = parsed.complete ? parsed.program : null;
  const done = (spec: FunctionSpec | null, libraries: UsedBlock[]): CompiledSource => ({ diagnostics: sortDiagnostics(diagnostics), spec, ast, libraries });
  if (hasErrors(diagnostics)) return done(null, []);
  const imports = importBlocks(parsed.program, resolve, limits, diagnostics);
  const checked = checkProgram(parsed.program, diagnostics, imports);
  if (hasErrors(diagnostics)) return done(null, imports.used);
  const spec = elaborate(checked, limits, diagnostics);
  const neverRanges = parsed.program.statements.filter((s) => s.kind === "never").map((s) => s.range);
  checkNeverCoverage(checked, limits, diagnostics, neverRanges);
  return done(hasErrors(diagnostics) ? null : spec, imports.used);
}

/**
 * Checks a source that is to be published as a library block: it must compile
 * as a design of its own, use no library blocks itself, and give no dc(...)
 * on its outputs (impossible combinations are never lines). Returns the
 * errors (located in the block's source) and its ports: inputs and outputs in
 * declared order, the parameters and results of a call.
 */
export function checkLibraryBlock(source: string, options?: LanguageLimits): { diagnostics: Diagnostic[]; inputs: string[]; outputs: string[] } {
  const limits = withDefaults(options);
  try {
    const own = checkBlockSource(source, limits);
    // A source that passes the block checks must also work out (limits, overlaps) as a design.
    const compiled = hasErrors(own.diagnostics) ? null : compileSource(source, limits);
    const diagnostics = [...own.diagnostics, ...(compiled?.diagnostics ?? []).filter((x) => x.severity === "error")];
    return { diagnostics: sortDiagnostics(dedupe(diagnostics)), inputs: own.inputs, outputs: own.outputs };
  } catch (e) {
    if (!(e instanceof RangeError)) throw e;
    return { diagnostics: [tooDeep()], inputs: [], outputs: [] };
  }
}

function dedupe(ds: Diagnostic[]): Diagnostic[] {
  const seen = new Set<string>();
  return ds.filter((x) => {
    const k = JSON.stringify(x);
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}

/**
 * Prints the canonical form of a source: one statement per line, single
 * spaces around binary operators, postfix ' for NOT, the fewest parentheses,
 * comments kept, runs of blank lines shortened to one, block bodies indented
 * by two spaces. Formatting twice changes nothing and keeps every function.
 * Returns the syntax diagnostics instead when the source does not parse.
 */
export function formatSource(source: string): { text: string } | { diagnostics: Diagnostic[] } {
  try {
    const parsed = parseSource(source);
    if (hasErrors(parsed.diagnostics)) return { diagnostics: sortDiagnostics(parsed.diagnostics) };
    return { text: formatProgram(parsed.program) };
  } catch (e) {
    if (!(e instanceof RangeError)) throw e;
    return { diagnostics: [tooDeep()] };
  }
}
