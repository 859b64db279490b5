/**
 * What an import hands back: the design source it made, or located reasons
 * why it made none. Imports never throw on any text and never return half a
 * design: one error and the source is null.
 */
import type { Diagnostic } from "../lang/index";

/**
 * A located message. Line and column (1-based, end exclusive) point into the
 * imported text, as the language's own diagnostics do. Truth-table messages
 * about one row, column or cell also carry them in table terms.
 */
export interface ImportDiagnostic extends Diagnostic {
  /** Truth tables: the row, counted as a spreadsheet does (1 is the header row). */
  row?: number;
  /** Truth tables: the table column, 1-based. */
  col?: number;
  /** Truth tables: that column's name, when it has one. */
  colName?: string;
}

export interface ImportResult {
  /** The design source in the Fanbound language; null when any diagnostic is an error. */
  source: string | null;
  /** Inputs in minterm bit order (the first is the most significant bit); empty when refused. */
  inputs: string[];
  /** Outputs in their order; empty when refused. */
  outputs: string[];
  /** Errors (nothing imported) and warnings (imported, but worth a look), ordered by position. */
  diagnostics: ImportDiagnostic[];
}

/** At most this many errors are listed; a last one says how many more there were. */
export const MAX_IMPORT_DIAGNOSTICS = 50;

export function refused(diagnostics: ImportDiagnostic[]): ImportResult {
  return { source: null, inputs: [], outputs: [], diagnostics: capped(sortImportDiagnostics(diagnostics)) };
}

export function hasImportErrors(ds: readonly ImportDiagnostic[]): boolean {
  return ds.some((d) => d.severity === "error");
}

export function sortImportDiagnostics(ds: ImportDiagnostic[]): ImportDiagnostic[] {
  return [...ds].sort(
    (a, b) =>
      a.line - b.line ||
      a.column - b.column ||
      (a.severity === b.severity ? 0 : a.severity === "error" ? -1 : 1),
  );
}

function capped(ds: ImportDiagnostic[]): ImportDiagnostic[] {
  if (ds.length <= MAX_IMPORT_DIAGNOSTICS) return ds;
  const last = ds[MAX_IMPORT_DIAGNOSTICS - 1]!;
  const more = ds.length - (MAX_IMPORT_DIAGNOSTICS - 1);
  return [
    ...ds.slice(0, MAX_IMPORT_DIAGNOSTICS - 1),
    {
      severity: "error",
      message: `and ${more} more problems like these; fix the ones above and import again`,
      line: last.line,
      column: last.column,
      endLine: last.endLine,
      endColumn: last.endColumn,
    },
  ];
}

/** Line and column (1-based) of character offsets in one text; each look-up is a binary search. */
export class LineIndex {
  private readonly starts: number[] = [0];
  constructor(text: string) {
    for (let i = 0; i < text.length; i++) if (text.charCodeAt(i) === 10) this.starts.push(i + 1);
  }
  at(offset: number): { line: number; column: number } {
    let lo = 0;
    let hi = this.starts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.starts[mid]! <= offset) lo = mid;
      else hi = mid - 1;
    }
    return { line: lo + 1, column: offset - this.starts[lo]! + 1 };
  }
}

/** Words the Fanbound language reserves; a column or port with such a name must be renamed. */
export { KEYWORDS } from "../lang/index";

/** A name the language accepts: letters, digits and _, not starting with a digit. */
export const NAME_PATTERN = /^[A-Za-z_][A-Za-z0-9_]*$/;
