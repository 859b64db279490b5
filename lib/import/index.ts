/**
 * Bringing designs in: truth tables (CSV, or cells pasted from a spreadsheet)
 * and Verilog modules of continuous assignments become design sources in the
 * Fanbound language; a design's truth table goes back out as CSV in the same
 * layout. Pure: text in, text and located diagnostics out; never throws on
 * any input.
 */
export type { ImportDiagnostic, ImportResult } from "./diagnostics";
export { MAX_IMPORT_DIAGNOSTICS } from "./diagnostics";
export {
  importTruthTable,
  IMPORT_MAX_CHARS,
  TABLE_MAX_ROWS,
  TABLE_MAX_INPUTS,
  TABLE_MAX_OUTPUTS,
  OVERLAP_CHECK_BUDGET,
  type TruthTableOptions,
} from "./truth-table";
export { importVerilog, type VerilogOptions } from "./verilog";
export { TableReader, truthTableCsv, TABLE_CSV_MAX_INPUTS, type TableValue } from "./table";

import type { ImportResult } from "./diagnostics";
import { importTruthTable } from "./truth-table";
import { importVerilog } from "./verilog";

/** The kinds of text an import reads. */
export type ImportKind = "csv" | "verilog";

/**
 * Imports `text` of the given kind. `outputs` (truth tables only) names the
 * output columns; default the last column. `name` is where the text came
 * from, for the comment at the top of the source.
 */
export function importDesign(kind: ImportKind, text: string, options: { outputs?: readonly string[]; name?: string } = {}): ImportResult {
  return kind === "csv" ? importTruthTable(text, options) : importVerilog(text, { name: options.name });
}

/** The kind a file name suggests: .v (and .vh, .sv is not Verilog-2005) is Verilog, anything else a table. */
export function kindOfFile(fileName: string): ImportKind {
  return /\.(v|vh|verilog)$/i.test(fileName) ? "verilog" : "csv";
}
