/**
 * A design's truth table, from its elaborated specification: one row per
 * input combination in minterm order, inputs then outputs, '-' where an
 * output is a don't-care. The CSV has the layout importTruthTable reads, so
 * importing a downloaded table gives back the same function.
 */
import { cubeContains, tableFromCubes, tableGet, TRUTH_TABLE_MAX_INPUTS, type FunctionSpec, type TruthTable } from "../logic/index";

/** Full-table CSV files stop at this many inputs: 16 (65,536 rows, the import's TABLE_MAX_ROWS). */
export const TABLE_CSV_MAX_INPUTS = 16;

/** One output's value at a minterm: '1', '0', or '-' for a don't-care. */
export type TableValue = "0" | "1" | "-";

/** Looks up output values one minterm at a time; bit-parallel tables up to TRUTH_TABLE_MAX_INPUTS inputs, cube scans beyond. */
export class TableReader {
  readonly inputs: readonly string[];
  readonly outputs: readonly string[];
  /** Number of rows: 2^inputs. */
  readonly rowCount: number;
  private readonly tables: Array<{ on: TruthTable; dc: TruthTable }> | null;

  constructor(private readonly spec: FunctionSpec) {
    const n = spec.inputs.length;
    this.inputs = spec.inputs;
    this.outputs = spec.outputs.map((o) => o.name);
    this.rowCount = 2 ** n;
    this.tables = n <= TRUTH_TABLE_MAX_INPUTS ? spec.outputs.map((o) => ({ on: tableFromCubes(o.on, n), dc: tableFromCubes(o.dc, n) })) : null;
  }

  /** Output k at minterm m. */
  value(k: number, m: number): TableValue {
    if (this.tables) {
      const t = this.tables[k]!;
      return tableGet(t.dc, m) ? "-" : tableGet(t.on, m) ? "1" : "0";
    }
    const o = this.spec.outputs[k]!;
    return o.dc.some((c) => cubeContains(c, m)) ? "-" : o.on.some((c) => cubeContains(c, m)) ? "1" : "0";
  }

  /** The input bits of minterm m, first input first (the most significant bit). */
  inputBits(m: number): Array<"0" | "1"> {
    const n = this.inputs.length;
    const out: Array<"0" | "1"> = [];
    for (let i = 0; i < n; i++) out.push(Math.floor(m / 2 ** (n - 1 - i)) % 2 ? "1" : "0");
    return out;
  }

  /** Rows first .. first+count-1 (clipped to the table): input bits, then output values. */
  rows(first: number, count: number): Array<{ minterm: number; inputs: Array<"0" | "1">; outputs: TableValue[] }> {
    const out = [];
    const end = Math.min(this.rowCount, first + count);
    for (let m = Math.max(0, first); m < end; m++) {
      out.push({ minterm: m, inputs: this.inputBits(m), outputs: this.outputs.map((_, k) => this.value(k, m)) });
    }
    return out;
  }
}

/**
 * The whole truth table as CSV (comma-separated, CRLF line ends as RFC 4180
 * has them): a header of the input and output names, then 2^n rows.
 * Throws a RangeError past TABLE_CSV_MAX_INPUTS inputs; callers check first.
 */
export function truthTableCsv(spec: FunctionSpec): string {
  const n = spec.inputs.length;
  if (n > TABLE_CSV_MAX_INPUTS) {
    throw new RangeError(`the table of ${n} inputs has ${2 ** n} rows; files stop at ${TABLE_CSV_MAX_INPUTS} inputs`);
  }
  const reader = new TableReader(spec);
  const lines = [[...spec.inputs, ...reader.outputs].join(",")];
  const k = reader.outputs.length;
  for (let m = 0; m < reader.rowCount; m++) {
    const cells = reader.inputBits(m) as string[];
    for (let j = 0; j < k; j++) cells.push(reader.value(j, m));
    lines.push(cells.join(","));
  }
  return lines.join("\r\n") + "\r\n";
}
