// Truth tables in and out. The expected functions come from brute force in
// the tests (helpers.ts) or from worked examples named beside each check; the
// round trips run on random functions (fast-check).
import fc from "fast-check";
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  importTruthTable,
  IMPORT_MAX_CHARS,
  TABLE_CSV_MAX_INPUTS,
  TABLE_MAX_INPUTS,
  TableReader,
  truthTableCsv,
  type ImportDiagnostic,
} from "../../lib/import/index";
import { compileSource } from "../../lib/lang/index";
import { bruteTable, specOf } from "./helpers";

/** The only error of a refused import (fails when there is none or more than one). */
function onlyError(text: string, options?: Parameters<typeof importTruthTable>[1]): ImportDiagnostic {
  const r = importTruthTable(text, options);
  expect(r.source).toBeNull();
  const errors = r.diagnostics.filter((d) => d.severity === "error");
  expect(errors, JSON.stringify(r.diagnostics)).toHaveLength(1);
  return errors[0]!;
}

function imported(text: string, options?: Parameters<typeof importTruthTable>[1]) {
  const r = importTruthTable(text, options);
  expect(r.diagnostics.filter((d) => d.severity === "error"), r.source ?? "").toEqual([]);
  expect(r.source).not.toBeNull();
  return { ...r, spec: specOf(r.source!) };
}

describe("truth table import", () => {
  it("reads the full-adder table to sum = a ^ b ^ cin and carry = majority", () => {
    // The full adder's truth table: a textbook fact (sum is the odd parity of
    // the three inputs, carry-out is 1 when at least two inputs are 1).
    const csv = [
      "a,b,cin,sum,carry",
      "0,0,0,0,0", "0,0,1,1,0", "0,1,0,1,0", "0,1,1,0,1",
      "1,0,0,1,0", "1,0,1,0,1", "1,1,0,0,1", "1,1,1,1,1",
    ].join("\n");
    const r = imported(csv, { outputs: ["sum", "carry"] });
    expect(r.inputs).toEqual(["a", "b", "cin"]);
    expect(r.outputs).toEqual(["sum", "carry"]);
    const t = bruteTable(r.spec);
    for (let m = 0; m < 8; m++) {
      const ones = (m & 1) + ((m >> 1) & 1) + ((m >> 2) & 1);
      expect(t[0]![m]).toBe(String(ones % 2));
      expect(t[1]![m]).toBe(ones >= 2 ? "1" : "0");
    }
  });

  it("keeps the input order: the first column is the most significant bit", () => {
    // Only a=1, b=0 is 1: minterm 2 with a as the high bit (the bit order of lib/logic and the equation language).
    const r = imported("a,b,y\n0,0,0\n0,1,0\n1,0,1\n1,1,0\n");
    expect(bruteTable(r.spec)[0]).toEqual(["0", "0", "1", "0"]);
    expect(r.source).toContain("inputs a, b\n");
  });

  it("expands - on an input to both values and keeps - on an output open", () => {
    // 8-line priority encoder style rows, checked by hand: y = 1 for a=1 (any b, c), dc for a=0, b=1.
    const r = imported("a,b,c,y\n1,-,-,1\n0,1,-,-\n0,0,0,0\n0,0,1,0\n");
    expect(bruteTable(r.spec)[0]).toEqual(["0", "0", "-", "-", "1", "1", "1", "1"]);
  });

  it("takes the last column as the only output by default", () => {
    const r = imported("a,b,y,z\n0,0,0,1\n0,1,1,1\n1,0,0,0\n1,1,1,0\n");
    expect(r.inputs).toEqual(["a", "b", "y"]);
    expect(r.outputs).toEqual(["z"]);
  });

  it("reads cells pasted from a spreadsheet (tab-separated, CRLF) and ;-separated files", () => {
    const tsv = imported("a\tb\ty\r\n0\t0\t1\r\n0\t1\t0\r\n1\t0\t0\r\n1\t1\t1\r\n");
    expect(bruteTable(tsv.spec)[0]).toEqual(["1", "0", "0", "1"]);
    const semi = imported("a;b;y\n0;0;1\n0;1;0\n1;0;0\n1;1;1\n");
    expect(bruteTable(semi.spec)[0]).toEqual(["1", "0", "0", "1"]);
  });

  it("trims spaces, skips blank lines and a byte-order mark, and reads quoted cells", () => {
    const r = imported('\uFEFF a , b , y \n\n 0, "0",1\n0,1,0\n\n1,0,0\n1,1,1\n,,\n');
    expect(bruteTable(r.spec)[0]).toEqual(["1", "0", "0", "1"]);
  });

  it("takes unlisted combinations as 0 and says so, in a warning and in the source", () => {
    const r = imported("a,b,y\n1,1,1\n0,0,-\n");
    expect(bruteTable(r.spec)[0]).toEqual(["-", "0", "0", "1"]);
    const w = r.diagnostics.filter((d) => d.severity === "warning");
    expect(w).toHaveLength(1);
    expect(w[0]!.message).toContain("cover 2 of the 4 input combinations; the other 2 are taken as 0");
    expect(r.source).toContain("// Input combinations no row lists are 0 on every output.");
  });

  it("writes the shorter spelling: an equation for wide tables, on/off lists for narrow ones", () => {
    // 24 inputs: a list could not be written; the row's product is short.
    const names = Array.from({ length: 24 }, (_, i) => `x${i}`);
    const row1 = names.map((_, i) => (i === 0 ? "1" : i === 23 ? "0" : "-"));
    const r = imported(`${names.join(",")},y\n${row1.join(",")},1\n`);
    expect(r.source).toContain("y = x0 * x23'");
    const o = r.spec.outputs[0]!;
    // minterm with x0=1, x23=0 is in; with x23=1 it is out (by the row)
    const m1 = 2 ** 23;
    expect(o.on.some((c) => ((m1 ^ c.value) & c.mask) === 0)).toBe(true);
    expect(o.on.some((c) => (((m1 | 1) ^ c.value) & c.mask) === 0)).toBe(false);
    // 3 inputs, ON everywhere but 0: off(0) is shorter than on(1..7)? equal length; on(...) wins ties
    const narrow = imported("a,b,c,y\n0,0,0,0\n0,0,1,1\n0,1,-,1\n1,-,-,1\n");
    expect(narrow.source).toMatch(/y = (on\(1\.\.7\)|off\(0\))/);
  });

  it("reads the Ferrow sluice alarm table shipped with the demo", () => {
    const text = readFileSync("lib/import/examples/sluice-alarm.csv", "utf8");
    const r = imported(text, { outputs: ["alarm", "horn"], name: "sluice-alarm.csv" });
    expect(r.source!.split("\n")[0]).toBe("// Truth table imported from sluice-alarm.csv: 9 rows, 4 inputs, 2 outputs");
    const t = bruteTable(r.spec);
    // Row "0,1,0,1,1,-": sluice shut, pound high, no flow, key turned -> lamp on, horn open (minterm 0b0101 = 5)
    expect(t[0]![5]).toBe("1");
    expect(t[1]![5]).toBe("-");
    // Row "1,-,0,0,1,1": open and blocked, no key -> horn (minterms 8 and 12)
    expect([t[1]![8], t[1]![12]]).toEqual(["1", "1"]);
  });
});

describe("truth table refusals: each names the row, the column and what to change", () => {
  it("a cell that is not 0, 1 or -", () => {
    const d = onlyError("a,b,y\n0,0,1\n0,x,1\n");
    expect(d).toMatchObject({ row: 3, col: 2, colName: "b", line: 3, column: 3, endColumn: 4 });
    expect(d.message).toBe('row 3, column b: the cell holds "x"; write 0, 1 or - (- on an input stands for both values)');
  });
  it("an empty cell on an output", () => {
    const d = onlyError("a,b,y\n0,0,\n");
    expect(d).toMatchObject({ row: 2, col: 3, colName: "y" });
    expect(d.message).toBe("row 2, column y: the cell is empty; write 0, 1 or - (- on an output leaves it open)");
  });
  it("a row with the wrong number of cells", () => {
    const d = onlyError("a,b,y\n0,0,1\n1,1\n");
    expect(d).toMatchObject({ row: 3, line: 3, column: 1 });
    expect(d.message).toBe("row 3 has 2 cells and the header 3; give every row one cell per column (a, b, y)");
  });
  it("a missing column name", () => {
    const d = onlyError("a,,y\n0,0,1\n");
    expect(d).toMatchObject({ row: 1, col: 2 });
    expect(d.message).toBe("column 2 has no name; write its signal name in the first row");
  });
  it("a repeated column name", () => {
    const d = onlyError("a,b,a,y\n0,0,0,1\n");
    expect(d).toMatchObject({ row: 1, col: 3, colName: "a" });
    expect(d.message).toBe('column 3 is named "a" like column 1; give each column its own name');
  });
  it("a column name the language does not take, with a suggestion", () => {
    const d = onlyError("gate shut,b,y\n0,0,1\n");
    expect(d).toMatchObject({ row: 1, col: 1, colName: "gate shut" });
    expect(d.message).toBe('column 1 is named "gate shut", which is not a signal name: use letters, digits and _, not starting with a digit (for example gate_shut)');
  });
  it("a reserved word as a column name", () => {
    const d = onlyError("on,b,y\n0,0,1\n");
    expect(d.message).toBe('column 1 is named "on", a reserved word of the language; rename it (for example on_sig)');
  });
  it("an output that is not a column, and an input after the outputs", () => {
    expect(onlyError("a,b,y\n0,0,1\n", { outputs: ["z"] }).message).toBe('the outputs name "z", which is not a column; the columns are a, b, y');
    const d = onlyError("a,y,b\n0,0,1\n", { outputs: ["y"] });
    expect(d).toMatchObject({ row: 1, col: 3, colName: "b" });
    expect(d.message).toBe("column 3 (b) stands after the output column y; inputs come first: move it before the outputs, or list it as an output too");
  });
  it("no input column", () => {
    expect(onlyError("y\n1\n").message).toBe("the table has no input columns; put the input columns first and the output columns last");
  });
  it("more inputs than the language allows (its own limit)", () => {
    const names = Array.from({ length: TABLE_MAX_INPUTS + 1 }, (_, i) => `x${i}`);
    const d = onlyError(`${names.join(",")},y\n${names.map(() => "0").join(",")},1\n`);
    expect(TABLE_MAX_INPUTS).toBe(30); // the language's 30 inputs per design (lib/lang/REFERENCE.md)
    expect(d).toMatchObject({ row: 1, col: 31, colName: "x30" });
    expect(d.message).toBe("the table has 31 input columns; the language takes at most 30 inputs per design (maxInputsPerOutput). Split the table into designs of fewer inputs");
  });
  it("a file over the size limit", () => {
    const d = onlyError("a,y\n" + "0,0\n".repeat(IMPORT_MAX_CHARS / 4 + 1));
    expect(d.message).toMatch(/^the table is 4,194,3\d\d characters long; the limit is 4,194,304 \(IMPORT_MAX_CHARS\)/);
  });
  it("more rows than TABLE_MAX_ROWS", () => {
    const d = onlyError("a,y\n" + "0,0\n".repeat(65_537));
    expect(d.message).toBe("the table has more than 65,536 rows (TABLE_MAX_ROWS); merge rows with - where an input does not matter, or split the table");
  });
  it("two rows for the same combination with different outputs", () => {
    const d = onlyError("a,b,y\n0,1,1\n1,1,0\n0,1,0\n");
    expect(d).toMatchObject({ row: 4, col: 3, colName: "y", line: 4, column: 5 });
    expect(d.message).toBe("rows 2 and 4 contradict each other: both cover a=0, b=1 (combination 1), but give y 1 and 0. Make them agree, or change a - on an input so the rows no longer overlap");
  });
  it("rows that overlap only once - is expanded", () => {
    const d = onlyError("a,b,c,y\n1,-,0,1\n-,1,0,-\n0,0,0,0\n");
    expect(d).toMatchObject({ row: 3, col: 4 });
    expect(d.message).toBe("rows 2 and 3 contradict each other: both cover a=1, b=1, c=0 (combination 6), but give y 1 and -. Make them agree, or change a - on an input so the rows no longer overlap");
  });
  it("a quoted cell that is not closed", () => {
    const d = onlyError('a,b,y\n0,"1,1\n');
    expect(d).toMatchObject({ row: 2 });
    expect(d.message).toBe('row 2: a quoted cell is not closed properly; close the " or remove it (cells hold only 0, 1 or -)');
  });
  it("an empty text and a header without rows", () => {
    expect(onlyError("").message).toBe("the table is empty: the first row must name the columns, inputs first, then the outputs");
    expect(onlyError("a,y\n").message).toBe("the table has a header but no rows; add one row per input combination under it");
  });
  it("checks the good rows for contradictions even when other rows have bad cells", () => {
    const r = importTruthTable("g,e,y\n0,1,1\n-,1,0\n1,0,x\n");
    expect(r.diagnostics.map((d) => [d.row, d.colName, d.message.slice(0, 30)])).toEqual([
      [3, "y", "rows 2 and 3 contradict each o"],
      [4, "y", 'row 4, column y: the cell hold'],
    ]);
  });
  it("lists every problem at once and imports nothing", () => {
    const r = importTruthTable("a,b,y\n0,2,1\n1,1\n1,0,q\n");
    expect(r.source).toBeNull();
    expect(r.inputs).toEqual([]);
    expect(r.diagnostics.map((d) => d.row)).toEqual([2, 3, 4]);
  });
});

// ---- round trips on random functions -------------------------------------------------------

/** A random function as rows of '0' | '1' | '-' per output and minterm. */
const randomTable = fc
  .record({ n: fc.integer({ min: 1, max: 6 }), k: fc.integer({ min: 1, max: 3 }), seed: fc.array(fc.integer({ min: 0, max: 9 }), { minLength: 64 * 3, maxLength: 64 * 3 }) })
  .map(({ n, k, seed }) => ({
    n,
    k,
    values: Array.from({ length: k }, (_, j) => Array.from({ length: 2 ** n }, (_, m) => { const s = seed[j * 64 + m]!; return s < 4 ? "0" : s < 8 ? "1" : "-"; })),
  }));

function csvOf(t: { n: number; k: number; values: string[][] }): string {
  const names = [...Array.from({ length: t.n }, (_, i) => `in${i}`), ...Array.from({ length: t.k }, (_, j) => `out${j}`)];
  const rows = [names.join(",")];
  for (let m = 0; m < 2 ** t.n; m++) {
    const bits = Array.from({ length: t.n }, (_, i) => String((m >> (t.n - 1 - i)) & 1));
    rows.push([...bits, ...t.values.map((v) => v[m]!)].join(","));
  }
  return rows.join("\r\n") + "\r\n";
}

describe("round trips", () => {
  it("table → source → table gives back the same table, row for row", () => {
    fc.assert(
      fc.property(randomTable, (t) => {
        const csv = csvOf(t);
        const outputs = Array.from({ length: t.k }, (_, j) => `out${j}`);
        const r = importTruthTable(csv, { outputs });
        expect(r.diagnostics.filter((d) => d.severity === "error")).toEqual([]);
        const spec = specOf(r.source!);
        expect(bruteTable(spec)).toEqual(t.values);
        expect(truthTableCsv(spec)).toBe(csv);
      }),
      { numRuns: 150 },
    );
  });

  it("source → CSV → source gives back the same function", () => {
    const sources = fc
      .record({
        n: fc.integer({ min: 1, max: 7 }),
        outs: fc.array(fc.record({ on: fc.array(fc.nat(127), { maxLength: 40 }), dc: fc.array(fc.nat(127), { maxLength: 10 }), form: fc.constantFrom("on", "off") }), { minLength: 1, maxLength: 3 }),
      })
      .map(({ n, outs }) => {
        const size = 2 ** n;
        const lines = [`inputs ${Array.from({ length: n }, (_, i) => `v${i}`).join(", ")}`, `outputs ${outs.map((_, j) => `f${j}`).join(", ")}`];
        outs.forEach((o, j) => {
          const dc = [...new Set(o.dc.map((m) => m % size))];
          const on = [...new Set(o.on.map((m) => m % size))].filter((m) => !dc.includes(m));
          const main = on.length ? `${o.form}(${on.join(", ")})` : "0";
          lines.push(`f${j} = ${main}${dc.length ? ` dc(${dc.join(", ")})` : ""}`);
        });
        return lines.join("\n") + "\n";
      });
    fc.assert(
      fc.property(sources, (source) => {
        const spec = specOf(source);
        const back = importTruthTable(truthTableCsv(spec), { outputs: spec.outputs.map((o) => o.name) });
        expect(back.diagnostics.filter((d) => d.severity === "error")).toEqual([]);
        const again = specOf(back.source!);
        expect(again.inputs).toEqual(spec.inputs);
        expect(bruteTable(again)).toEqual(bruteTable(spec));
      }),
      { numRuns: 150 },
    );
  });

  it("compact tables with - on inputs: imported exactly when no two overlapping rows disagree", () => {
    // Brute force beside the importer: expand every row to its minterms and compare.
    const rowsArb = fc.record({
      n: fc.integer({ min: 1, max: 5 }),
      rows: fc.array(fc.record({ cells: fc.array(fc.constantFrom("0", "1", "-"), { minLength: 5, maxLength: 5 }), out: fc.constantFrom("0", "1", "-") }), { minLength: 1, maxLength: 8 }),
    });
    fc.assert(
      fc.property(rowsArb, ({ n, rows }) => {
        const names = Array.from({ length: n }, (_, i) => `i${i}`);
        const csv = [[...names, "y"].join(","), ...rows.map((r) => [...r.cells.slice(0, n), r.out].join(","))].join("\n");
        const want: (string | null)[] = Array.from({ length: 2 ** n }, () => null);
        let conflict = false;
        for (const r of rows) {
          for (let m = 0; m < 2 ** n; m++) {
            const fits = r.cells.slice(0, n).every((c, i) => c === "-" || c === String((m >> (n - 1 - i)) & 1));
            if (!fits) continue;
            if (want[m] !== null && want[m] !== r.out) conflict = true;
            want[m] = r.out;
          }
        }
        const res = importTruthTable(csv);
        if (conflict) {
          expect(res.source).toBeNull();
          expect(res.diagnostics.every((d) => d.message.includes("contradict each other"))).toBe(true);
        } else {
          expect(res.source).not.toBeNull();
          expect(bruteTable(specOf(res.source!))[0]).toEqual(want.map((v) => v ?? "0"));
        }
      }),
      { numRuns: 300 },
    );
  });
});

describe("the table view and file", () => {
  it("pages rows of a wide design without building the whole table", () => {
    // 24 inputs: 16,777,216 rows; page 3 of 256 rows starts at minterm 768.
    const names = Array.from({ length: 24 }, (_, i) => `x${i}`);
    const spec = specOf(`inputs ${names.join(", ")}\noutputs y\ny = x23 * x22' dc(769)\n`);
    const t = new TableReader(spec);
    expect(t.rowCount).toBe(2 ** 24);
    const page = t.rows(768, 256);
    expect(page).toHaveLength(256);
    expect(page[0]!.minterm).toBe(768);
    // 769 = ...1100000001: x23 = 1, x22 = 0 -> 1, but it is a don't-care
    expect(page[1]!.outputs).toEqual(["-"]);
    // 771 = 0b1100000011: x22 = 1 -> 0; 773 = 0b1100000101: x23 = 1, x22 = 0 -> 1
    expect(page[3]!.outputs).toEqual(["0"]);
    expect(page[5]!.outputs).toEqual(["1"]);
    expect(page[5]!.inputs.join("")).toBe("000000000000001100000101");
  });

  it("refuses a file past TABLE_CSV_MAX_INPUTS inputs", () => {
    const names = Array.from({ length: TABLE_CSV_MAX_INPUTS + 1 }, (_, i) => `x${i}`);
    const spec = compileSource(`inputs ${names.join(", ")}\noutputs y\ny = x0\n`).spec!;
    expect(() => truthTableCsv(spec)).toThrow(RangeError);
  });
});
