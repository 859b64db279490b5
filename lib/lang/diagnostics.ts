import type { Range } from "./ast";

/** A located message. Lines and columns are 1-based; the end is exclusive. */
export interface Diagnostic {
  severity: "error" | "warning";
  message: string;
  line: number;
  column: number;
  endLine: number;
  endColumn: number;
}

export function error(message: string, range: Range): Diagnostic {
  return { severity: "error", message, ...pick(range) };
}

export function warning(message: string, range: Range): Diagnostic {
  return { severity: "warning", message, ...pick(range) };
}

function pick(r: Range): Range {
  return { line: r.line, column: r.column, endLine: r.endLine, endColumn: r.endColumn };
}

/** Diagnostics ordered by position, errors before warnings at the same place. */
export function sortDiagnostics(ds: Diagnostic[]): Diagnostic[] {
  return [...ds].sort(
    (a, b) =>
      a.line - b.line ||
      a.column - b.column ||
      (a.severity === b.severity ? 0 : a.severity === "error" ? -1 : 1),
  );
}

/** Line and column (1-based) of a character offset in the source. */
export function positionAt(source: string, offset: number): { line: number; column: number } {
  let line = 1;
  let lineStart = 0;
  const end = Math.min(offset, source.length);
  for (let i = 0; i < end; i++) {
    if (source.charCodeAt(i) === 10) {
      line++;
      lineStart = i + 1;
    }
  }
  return { line, column: end - lineStart + 1 };
}

export function spanRange(a: Range, b: Range): Range {
  return { line: a.line, column: a.column, endLine: b.endLine, endColumn: b.endColumn };
}
