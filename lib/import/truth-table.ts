/**
 * Truth tables (CSV, or cells pasted from a spreadsheet) to a design source.
 *
 * Layout: the first row names the columns, input columns first, then the
 * outputs; by default only the last column is an output. Each cell is 0, 1
 * or -: on an input, - stands for both values (the row covers every
 * combination it expands to); on an output it is a don't-care. Combinations
 * that no row lists are 0 on every output, and the source says so.
 *
 * The table is refused as a whole, with a located message per problem, when
 * a cell is not 0, 1 or -, a row has the wrong number of cells, a column name
 * is missing, repeated or not a name the language takes, an input column
 * stands after an output, there are more inputs than the language allows, the
 * text is over IMPORT_MAX_CHARS, or two rows that overlap (after expanding -)
 * give different values to an output.
 */
import Papa from "papaparse";
import {
  cubeIntersect,
  fullMask,
  popcount,
  tableFromCubes,
  tableMinterms,
  TRUTH_TABLE_MAX_INPUTS,
  type Cube,
} from "../logic/index";
import { DEFAULT_LIMITS, KEYWORDS } from "../lang/index";
import {
  hasImportErrors,
  LineIndex,
  NAME_PATTERN,
  refused,
  sortImportDiagnostics,
  type ImportDiagnostic,
  type ImportResult,
} from "./diagnostics";
import { indexItems, joinedLength, productText, wrapJoin } from "./source";

/** Longest accepted text, in characters: 4 MiB (4,194,304), enough for the full table of 16 inputs and a dozen outputs. */
export const IMPORT_MAX_CHARS = 4 * 1024 * 1024;
/** Most data rows (the header not counted): 65,536, a full table of 16 inputs. */
export const TABLE_MAX_ROWS = 65_536;
/** Most input columns: the language's own limit (DEFAULT_LIMITS.maxInputsPerOutput, 30). */
export const TABLE_MAX_INPUTS = DEFAULT_LIMITS.maxInputsPerOutput;
/** Most output columns: one statement each, within the language's statement limit (2,000) less the two declarations. */
export const TABLE_MAX_OUTPUTS = DEFAULT_LIMITS.maxStatements - 2;
/**
 * Work allowed to the overlap check (rows visited while splitting the table on
 * its inputs); a table that needs more is refused with advice instead of
 * holding the caller. 40 million.
 */
export const OVERLAP_CHECK_BUDGET = 40_000_000;

export interface TruthTableOptions {
  /**
   * Names of the output columns. They must be the last columns of the table
   * (in any order here; the source keeps the table's order). Default: the
   * last column only.
   */
  outputs?: readonly string[];
  /** Cell separator. Default: tab when the header row has one (cells pasted from a spreadsheet), else comma, else semicolon. */
  delimiter?: "," | "\t" | ";";
  /** Where the table came from (a file name), for the comment at the top of the source. */
  name?: string;
}

type Cell = 0 | 1 | 2; // 2: don't-care

interface Row {
  /** Spreadsheet row number (1 is the header). */
  row: number;
  cube: Cube;
  /** Output values as a string of '0', '1', '-' (one character per output): equal rows compare in one step. */
  vals: string;
  /** Text position of each cell: [line, column, endLine, endColumn]. */
  at: Array<[number, number, number, number]>;
}

/** Reads a truth table and writes the design source; see the module comment for the rules. */
export function importTruthTable(text: string, options: TruthTableOptions = {}): ImportResult {
  if (text.length > IMPORT_MAX_CHARS) {
    return refused([
      {
        severity: "error",
        message: `the table is ${text.length.toLocaleString("en")} characters long; the limit is ${IMPORT_MAX_CHARS.toLocaleString("en")} (IMPORT_MAX_CHARS). Split the outputs over several tables, or merge rows with - where an input does not matter`,
        line: 1, column: 1, endLine: 1, endColumn: 2,
      },
    ]);
  }
  // One kind of line break: papaparse takes the first it sees for the whole text.
  const body = text.replace(/^\uFEFF/, "").replace(/\r\n?/g, "\n");
  const lines = new LineIndex(body);
  const firstLine = body.slice(0, body.indexOf("\n") === -1 ? body.length : body.indexOf("\n"));
  const delimiter = options.delimiter ?? (firstLine.includes("\t") ? "\t" : firstLine.includes(",") ? "," : firstLine.includes(";") ? ";" : ",");

  const records: Array<{ cells: string[]; start: number; end: number; quoteError: number | null }> = [];
  let previous = 0;
  let tooMany = false;
  let filled = 0;
  Papa.parse<string[]>(body, {
    delimiter,
    newline: "\n",
    quoteChar: '"',
    step(results, parser) {
      const end = results.meta.cursor;
      const quote = results.errors.find((e) => e.type === "Quotes");
      records.push({ cells: results.data, start: previous, end, quoteError: quote ? (quote.index ?? previous) : null });
      previous = end;
      if (!results.data.every((c) => c.trim() === "")) filled++;
      if (filled > TABLE_MAX_ROWS + 1) {
        tooMany = true;
        parser.abort();
      }
    },
  });
  const isBlank = (r: { cells: string[] }) => r.cells.every((c) => c.trim() === "");
  const dataCount = records.slice(1).filter((r) => !isBlank(r)).length;
  if (tooMany || dataCount > TABLE_MAX_ROWS) {
    return refused([
      {
        severity: "error",
        message: `the table has more than ${TABLE_MAX_ROWS.toLocaleString("en")} rows (TABLE_MAX_ROWS); merge rows with - where an input does not matter, or split the table`,
        line: 1, column: 1, endLine: 1, endColumn: 2,
      },
    ]);
  }

  const diags: ImportDiagnostic[] = [];
  const header = records[0];
  if (!header || isBlank(header)) {
    return refused([{ severity: "error", message: "the table is empty: the first row must name the columns, inputs first, then the outputs", line: 1, column: 1, endLine: 1, endColumn: 1 }]);
  }
  const cellSpans = (r: (typeof records)[number]) => spans(body, r.start, r.end, delimiter, lines);

  // ---- the header --------------------------------------------------------------
  const headerAt = cellSpans(header);
  if (header.quoteError !== null) {
    diags.push(quoteDiag(header.quoteError, 1, lines));
    return refused(diags);
  }
  const names = header.cells.map((c) => c.trim());
  const width = names.length;
  const reserved = new Set<string>(KEYWORDS);
  const seen = new Map<string, number>();
  names.forEach((name, i) => {
    const at = headerAt[i] ?? headerAt[headerAt.length - 1]!;
    const loc = { line: at[0], column: at[1], endLine: at[2], endColumn: at[3], row: 1, col: i + 1 };
    if (name === "") {
      diags.push({ severity: "error", message: `column ${i + 1} has no name; write its signal name in the first row`, ...loc });
      return;
    }
    if (!NAME_PATTERN.test(name)) {
      diags.push({
        severity: "error",
        message: `column ${i + 1} is named "${name}", which is not a signal name: use letters, digits and _, not starting with a digit (for example ${suggestName(name)})`,
        ...loc, colName: name,
      });
      return;
    }
    if (reserved.has(name)) {
      diags.push({ severity: "error", message: `column ${i + 1} is named "${name}", a reserved word of the language; rename it (for example ${name}_sig)`, ...loc, colName: name });
      return;
    }
    const before = seen.get(name);
    if (before !== undefined) {
      diags.push({ severity: "error", message: `column ${i + 1} is named "${name}" like column ${before}; give each column its own name`, ...loc, colName: name });
      return;
    }
    seen.set(name, i + 1);
  });

  // ---- which columns are outputs -------------------------------------------------
  const headerLoc = { line: headerAt[0]![0], column: headerAt[0]![1], endLine: headerAt[headerAt.length - 1]![2], endColumn: headerAt[headerAt.length - 1]![3], row: 1 };
  let outputCount = 1;
  if (options.outputs && options.outputs.length > 0) {
    const wanted = options.outputs.map((o) => o.trim());
    const listed = new Set<string>();
    for (const o of wanted) {
      if (!names.includes(o)) {
        diags.push({ severity: "error", message: `the outputs name "${o}", which is not a column; the columns are ${names.filter(Boolean).join(", ")}`, ...headerLoc });
      } else if (listed.has(o)) {
        diags.push({ severity: "error", message: `the outputs name "${o}" twice; list each output once`, ...headerLoc });
      }
      listed.add(o);
    }
    outputCount = listed.size;
    const firstOutput = names.findIndex((n) => listed.has(n));
    for (let i = firstOutput + 1; firstOutput >= 0 && i < width; i++) {
      if (!listed.has(names[i]!)) {
        const at = headerAt[i]!;
        diags.push({
          severity: "error",
          message: `column ${i + 1} (${names[i]}) stands after the output column ${names[firstOutput]}; inputs come first: move it before the outputs, or list it as an output too`,
          line: at[0], column: at[1], endLine: at[2], endColumn: at[3], row: 1, col: i + 1, colName: names[i],
        });
      }
    }
  }
  const inputCount = width - outputCount;
  if (inputCount < 1 && !hasImportErrors(diags)) {
    diags.push({ severity: "error", message: "the table has no input columns; put the input columns first and the output columns last", ...headerLoc });
  }
  if (inputCount > TABLE_MAX_INPUTS) {
    const at = headerAt[TABLE_MAX_INPUTS]!;
    diags.push({
      severity: "error",
      message: `the table has ${inputCount} input columns; the language takes at most ${TABLE_MAX_INPUTS} inputs per design (maxInputsPerOutput). Split the table into designs of fewer inputs`,
      line: at[0], column: at[1], endLine: at[2], endColumn: at[3], row: 1, col: TABLE_MAX_INPUTS + 1, colName: names[TABLE_MAX_INPUTS],
    });
  }
  if (outputCount > TABLE_MAX_OUTPUTS) {
    diags.push({ severity: "error", message: `the table has ${outputCount} output columns; at most ${TABLE_MAX_OUTPUTS} fit one design (the language's statement limit). Split the outputs over several designs`, ...headerLoc });
  }
  if (hasImportErrors(diags)) return refused(diags);
  const inputs = names.slice(0, inputCount);
  const outputs = names.slice(inputCount);
  const n = inputs.length;

  // ---- the rows --------------------------------------------------------------------
  const rows: Row[] = [];
  for (let r = 1; r < records.length; r++) {
    const rec = records[r]!;
    if (isBlank(rec)) continue;
    const rowNo = r + 1;
    if (rec.quoteError !== null) {
      diags.push(quoteDiag(rec.quoteError, rowNo, lines));
      continue;
    }
    const at = cellSpans(rec);
    if (rec.cells.length !== width) {
      const first = at[0]!;
      const last = at[at.length - 1]!;
      diags.push({
        severity: "error",
        message: `row ${rowNo} has ${rec.cells.length} cell${rec.cells.length === 1 ? "" : "s"} and the header ${width}; give every row one cell per column (${names.join(", ")})`,
        line: first[0], column: first[1], endLine: last[2], endColumn: last[3], row: rowNo,
      });
      continue;
    }
    let value = 0;
    let mask = 0;
    let vals = "";
    let ok = true;
    for (let c = 0; c < width; c++) {
      const raw = rec.cells[c]!.trim();
      const cell = cellValue(raw);
      if (cell === null) {
        const span = at[c]!;
        const what = raw === "" ? "is empty" : `holds "${raw.length > 20 ? raw.slice(0, 20) + "…" : raw}"`;
        diags.push({
          severity: "error",
          message: `row ${rowNo}, column ${names[c]}: the cell ${what}; write 0, 1 or -${c < n ? " (- on an input stands for both values)" : " (- on an output leaves it open)"}`,
          line: span[0], column: span[1], endLine: span[2], endColumn: span[3], row: rowNo, col: c + 1, colName: names[c],
        });
        ok = false;
        continue;
      }
      if (c < n) {
        const bit = 2 ** (n - 1 - c);
        if (cell !== 2) {
          mask += bit;
          if (cell === 1) value += bit;
        }
      } else {
        vals += cell === 2 ? "-" : String(cell);
      }
    }
    if (ok) rows.push({ row: rowNo, cube: { value: value >>> 0, mask: mask >>> 0 }, vals, at });
  }
  // Rows with bad cells are left out of the overlap check, which still runs, so every problem shows at once.
  if (rows.length === 0 && !hasImportErrors(diags)) {
    return refused([{ severity: "error", message: "the table has a header but no rows; add one row per input combination under it", ...headerLoc }]);
  }

  // ---- rows that contradict each other ------------------------------------------------
  const overlap = rows.length ? findContradictions(rows, n) : [];
  if (overlap === "budget") {
    return refused([...diags, {
      severity: "error",
      message: "the rows overlap in too many ways to check them for contradictions in reasonable time; write fewer rows with - on the inputs, or give the combinations one row each",
      ...headerLoc,
    }]);
  }
  for (const { first, second, region } of overlap) {
    const k = [...first.vals].findIndex((v, i) => v !== second.vals[i]);
    const span = second.at[n + k]!;
    diags.push({
      severity: "error",
      message: `rows ${first.row} and ${second.row} contradict each other: both cover ${describeCube(region, inputs)}, but give ${outputs[k]} ${first.vals[k]} and ${second.vals[k]}. Make them agree, or change a - on an input so the rows no longer overlap`,
      line: span[0], column: span[1], endLine: span[2], endColumn: span[3], row: second.row, col: n + k + 1, colName: outputs[k],
    });
  }
  if (hasImportErrors(diags)) return refused(diags);

  // ---- the source -----------------------------------------------------------------------
  const warnings: ImportDiagnostic[] = [];
  const listed = coveredCount(rows.map((r) => r.cube), n);
  const total = 2 ** n;
  const unlisted = listed === null ? null : total - listed;
  if (unlisted !== null && unlisted > 0) {
    warnings.push({
      severity: "warning",
      message: `the rows cover ${listed!.toLocaleString("en")} of the ${total.toLocaleString("en")} input combinations; the other ${unlisted.toLocaleString("en")} are taken as 0 on every output (add rows with - on the outputs to leave them open instead)`,
      ...headerLoc,
    });
  }
  const head = [`// Truth table imported${options.name ? ` from ${oneLine(options.name)}` : ""}: ${rows.length} row${rows.length === 1 ? "" : "s"}, ${n} input${n === 1 ? "" : "s"}, ${outputs.length} output${outputs.length === 1 ? "" : "s"}`];
  if (unlisted === null || unlisted > 0) head.push("// Input combinations no row lists are 0 on every output.");
  const body2: string[] = [wrapJoin("inputs ", inputs, ", "), wrapJoin("outputs ", outputs, ", "), ""];
  for (let k = 0; k < outputs.length; k++) {
    const on = distinctCubes(rows.filter((r) => r.vals[k] === "1").map((r) => r.cube));
    const dc = distinctCubes(rows.filter((r) => r.vals[k] === "-").map((r) => r.cube));
    const line = outputStatement(outputs[k]!, on, dc, inputs);
    if (typeof line !== "string") {
      const firstDc = rows.find((r) => r.vals[k] === "-")!;
      const span = firstDc.at[n + k]!;
      return refused([{
        severity: "error",
        message: `the rows with - on ${outputs[k]} leave ${line.dcCount.toLocaleString("en")} input combinations open, more than a design source can list as don't-cares; give ${outputs[k]} 0 or 1 on most of them`,
        line: span[0], column: span[1], endLine: span[2], endColumn: span[3], row: firstDc.row, col: n + k + 1, colName: outputs[k],
      }]);
    }
    body2.push(line);
  }
  const source = [...head, ...body2].join("\n") + "\n";
  if (source.length > DEFAULT_LIMITS.maxSourceLength) {
    return refused([{
      severity: "error",
      message: `the table makes a design source of ${source.length.toLocaleString("en")} characters, over the language's limit of ${DEFAULT_LIMITS.maxSourceLength.toLocaleString("en")}; split the outputs over several tables, or merge rows with - where an input does not matter`,
      ...headerLoc,
    }]);
  }
  return { source, inputs, outputs, diagnostics: sortImportDiagnostics(warnings) };
}

function cellValue(text: string): Cell | null {
  // A quote after a space is not CSV quoting (RFC 4180), but its meaning is plain.
  const s = /^"[^"]*"$/.test(text) ? text.slice(1, -1).trim() : text;
  return s === "0" ? 0 : s === "1" ? 1 : s === "-" ? 2 : null;
}

function oneLine(s: string): string {
  return s.replace(/[\r\n]+/g, " ").slice(0, 120);
}

/** A name the language takes, made from a column title, for the advice in a message. */
function suggestName(s: string): string {
  let t = s.trim().replace(/[^A-Za-z0-9_]+/g, "_").replace(/^_+|_+$/g, "");
  if (!t) t = "signal";
  if (/^[0-9]/.test(t)) t = `s_${t}`;
  return t;
}

function quoteDiag(offset: number, row: number, lines: LineIndex): ImportDiagnostic {
  const p = lines.at(offset);
  return {
    severity: "error",
    message: `row ${row}: a quoted cell is not closed properly; close the " or remove it (cells hold only 0, 1 or -)`,
    line: p.line, column: p.column, endLine: p.line, endColumn: p.column + 1, row,
  };
}

/**
 * Text positions of the cells of one record between offsets start and end:
 * [line, column, endLine, endColumn] each, following quotes as CSV does.
 */
function spans(text: string, start: number, end: number, delimiter: string, lines: LineIndex): Array<[number, number, number, number]> {
  let stop = end;
  if (stop > start && text.charCodeAt(stop - 1) === 10) stop--;
  const out: Array<[number, number, number, number]> = [];
  let cellStart = start;
  let inQuotes = false;
  const push = (a: number, b: number) => {
    const p = lines.at(a);
    const q = lines.at(Math.max(a, b));
    out.push([p.line, p.column, q.line, b > a ? q.column : q.column + 1]);
  };
  for (let i = start; i < stop; i++) {
    const ch = text[i];
    if (ch === '"') inQuotes = !inQuotes;
    else if (!inQuotes && ch === delimiter) {
      push(cellStart, i);
      cellStart = i + 1;
    }
  }
  push(cellStart, stop);
  return out;
}

/** Cubes without repeats and without those inside another one, in their first order. */
function distinctCubes(cubes: Cube[]): Cube[] {
  const seen = new Set<string>();
  const unique = cubes.filter((c) => {
    const k = `${c.mask}:${c.value}`;
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
  if (unique.length > 4000) return unique;
  return unique.filter((c, i) => !unique.some((d, j) => j !== i && covers(d, c) && (!covers(c, d) || j < i)));
}

function covers(a: Cube, b: Cube): boolean {
  return (a.mask & ~b.mask) === 0 && ((a.value ^ b.value) & a.mask) === 0;
}

/** "l3=1, l2=0" for a cube's literals; "every combination" for the empty cube. */
function describeCube(c: Cube, inputs: readonly string[]): string {
  const n = inputs.length;
  const parts: string[] = [];
  for (let i = 0; i < n; i++) {
    const bit = 2 ** (n - 1 - i);
    if (Math.floor(c.mask / bit) % 2) parts.push(`${inputs[i]}=${Math.floor(c.value / bit) % 2}`);
  }
  if (parts.length === 0) return "every input combination";
  if (parts.length === n) return `${parts.join(", ")} (combination ${c.value})`;
  return `${parts.join(", ")} (with any value of the other inputs)`;
}

// ---- contradictions ---------------------------------------------------------------------

interface Contradiction {
  first: Row;
  second: Row;
  region: Cube;
}

/** At most this many contradicting pairs are reported. */
const MAX_CONTRADICTIONS = 20;

/**
 * Pairs of rows whose input cubes overlap and whose outputs differ. The rows
 * are split on one input at a time (a row with - there goes both ways), and a
 * group whose rows all give the same outputs is left at once, so a consistent
 * table costs about rows × inputs. Returns "budget" past OVERLAP_CHECK_BUDGET.
 */
function findContradictions(rows: Row[], n: number): Contradiction[] | "budget" {
  // Identical rows say the same thing twice; keep the first.
  const byKey = new Map<string, Row>();
  for (const r of rows) {
    const k = `${r.cube.mask}:${r.cube.value}:${r.vals}`;
    if (!byKey.has(k)) byKey.set(k, r);
  }
  const distinct = [...byKey.values()];
  const found = new Map<string, Contradiction>();
  let work = 0;
  const stack: Array<{ list: Row[]; from: number }> = [{ list: distinct, from: 0 }];
  while (stack.length) {
    const { list, from } = stack.pop()!;
    if (found.size >= MAX_CONTRADICTIONS) break;
    work += list.length;
    if (work > OVERLAP_CHECK_BUDGET) return "budget";
    const v0 = list[0]!.vals;
    if (list.every((r) => r.vals === v0)) continue;
    let i = from;
    let bit = 0;
    for (; i < n; i++) {
      bit = 1 << (n - 1 - i);
      if (list.some((r) => (r.cube.mask & bit) !== 0)) break;
    }
    if (i === n) {
      // Every row here covers the same region: any two with different outputs contradict.
      const sorted = [...list].sort((a, b) => a.row - b.row);
      const a = sorted[0]!;
      for (const b of sorted.slice(1)) {
        if (b.vals === a.vals) continue;
        const key = `${a.row}:${b.row}`;
        if (!found.has(key)) found.set(key, { first: a, second: b, region: cubeIntersect(a.cube, b.cube)! });
        if (found.size >= MAX_CONTRADICTIONS) break;
      }
      continue;
    }
    const zero: Row[] = [];
    const one: Row[] = [];
    for (const r of list) {
      const lit = (r.cube.mask & bit) !== 0;
      const val = (r.cube.value & bit) !== 0;
      if (!lit || !val) zero.push(r);
      if (!lit || val) one.push(r);
    }
    if (one.length > 1) stack.push({ list: one, from: i + 1 });
    if (zero.length > 1) stack.push({ list: zero, from: i + 1 });
  }
  return [...found.values()].sort((x, y) => x.second.row - y.second.row || x.first.row - y.first.row);
}

/** How many input combinations the cubes cover together; null when that would take too long to count. */
function coveredCount(cubes: Cube[], n: number): number | null {
  if (n <= TRUTH_TABLE_MAX_INPUTS) {
    const t = tableFromCubes(cubes, n);
    let count = 0;
    for (let w = 0; w < t.length; w++) count += popcount(t[w]!);
    // Tables of fewer than 5 inputs fill part of one word only.
    return Math.min(count, 2 ** n);
  }
  // Wider: split on the inputs in order, as the overlap check does.
  let work = 0;
  const count = (list: Cube[], from: number): number | null => {
    work += list.length;
    if (work > OVERLAP_CHECK_BUDGET) return null;
    if (list.length === 0) return 0;
    const rest = 2 ** (n - from);
    const restMask = from >= n ? 0 : fullMask(n - from);
    if (list.some((c) => (c.mask & restMask) === 0)) return rest;
    const bit = 1 << (n - 1 - from);
    const zero = list.filter((c) => !(c.mask & bit) || !(c.value & bit));
    const one = list.filter((c) => !(c.mask & bit) || (c.value & bit));
    const a = count(zero, from + 1);
    if (a === null) return null;
    const b = count(one, from + 1);
    return b === null ? null : a + b;
  };
  return count(cubes, 0);
}

// ---- writing one output ---------------------------------------------------------------------

/** Minterm lists are enumerated only while they stay this long (more could not fit a source anyway). */
const LIST_BUDGET = DEFAULT_LIMITS.maxSourceLength / 2;

/**
 * The statement for one output: on(...) dc(...), off(...) dc(...) or a sum of
 * the rows' products with dc(...), whichever is shortest (on(...) on a tie).
 * `{dcCount}` when the don't-cares are too many to list.
 */
function outputStatement(name: string, on: Cube[], dc: Cube[], inputs: readonly string[]): string | { dcCount: number } {
  const n = inputs.length;
  const dcList = dc.length ? minterms(dc, n) : [];
  if (dcList === null) return { dcCount: dc.reduce((s, c) => s + 2 ** (n - popcount(c.mask)), 0) };
  const dcItems = indexItems(dcList);
  const dcLen = dcItems.length ? joinedLength(dcItems, ", ") + 5 : 0;

  type Option = { len: number; write: () => string };
  const options: Option[] = [];
  const onList = on.length ? minterms(on, n) : [];
  if (onList !== null) {
    const items = indexItems(onList);
    if (items.length === 0) {
      options.push({ len: dcItems.length ? dcLen : 1, write: () => (dcItems.length ? wrapJoin(`${name} = dc(`, dcItems, ", ", ")") : `${name} = 0`) });
    } else {
      options.push({ len: joinedLength(items, ", ") + 4 + dcLen, write: () => withDc(wrapJoin(`${name} = on(`, items, ", ", ")"), dcItems) });
    }
    if (n <= TRUTH_TABLE_MAX_INPUTS) {
      const off = offMinterms(on, dc, n);
      const offItems = indexItems(off);
      if (offItems.length > 0) {
        options.push({ len: joinedLength(offItems, ", ") + 5 + dcLen, write: () => withDc(wrapJoin(`${name} = off(`, offItems, ", ", ")"), dcItems) });
      } else {
        options.push({ len: 1 + dcLen, write: () => withDc(`${name} = 1`, dcItems) });
      }
    }
  }
  const products = on.map((c) => productText(c, inputs));
  if (products.length) {
    options.push({ len: joinedLength(products, " + ") + dcLen, write: () => withDc(wrapJoin(`${name} = `, products, " + "), dcItems) });
  }
  let best = options[0]!;
  for (const o of options.slice(1)) if (o.len < best.len) best = o;
  return best.write();
}

function withDc(statement: string, dcItems: string[]): string {
  return dcItems.length ? `${statement} ${wrapJoin("dc(", dcItems, ", ", ")")}` : statement;
}

/** Ascending distinct minterms of the cubes, or null when there are more than LIST_BUDGET. */
function minterms(cubes: Cube[], n: number): number[] | null {
  if (n <= TRUTH_TABLE_MAX_INPUTS) {
    const t = tableFromCubes(cubes, n);
    let count = 0;
    for (let w = 0; w < t.length; w++) count += popcount(t[w]!);
    if (count > LIST_BUDGET) return null;
    return tableMinterms(t, n);
  }
  let total = 0;
  for (const c of cubes) total += 2 ** (n - popcount(c.mask));
  if (total > LIST_BUDGET) return null;
  const out = new Set<number>();
  for (const c of cubes) {
    const free = (fullMask(n) & ~c.mask) >>> 0;
    let sub = 0;
    for (;;) {
      out.add(((c.value & c.mask) | sub) >>> 0);
      if (sub === free) break;
      sub = ((sub - free) & free) >>> 0;
    }
  }
  return [...out].sort((a, b) => a - b);
}

/** Minterms in neither the ON nor the DC cubes (n ≤ TRUTH_TABLE_MAX_INPUTS). */
function offMinterms(on: Cube[], dc: Cube[], n: number): number[] {
  const t = tableFromCubes([...on, ...dc], n);
  const out: number[] = [];
  const size = 2 ** n;
  for (let m = 0; m < size; m++) if (!((t[m >>> 5]! >>> (m & 31)) & 1)) out.push(m);
  return out;
}

export type { Cell as TruthTableCell };
