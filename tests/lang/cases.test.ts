// Golden cases: tests/lang/cases/NAME.fnb with the expected NAME.json beside it.
// Expected values in the JSON files were worked out by hand (positions counted
// by hand, 1-based with exclusive ends; tables from the equations by hand).
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { compileSource, formatSource, parseSource } from "../../lib/lang/index";
import { tableFromCubes, tableMinterms } from "../../lib/logic/index";
import { programSummary } from "./summary";

interface Expected {
  summary?: string[];
  diagnostics: { severity: string; line: number; column: number; endLine: number; endColumn: number; message: string }[];
  table?: { inputs: string[]; outputs: { name: string; on: number[]; dc: number[] }[] };
  format?: string;
}

const dir = path.join(import.meta.dirname, "cases");
const names = readdirSync(dir)
  .filter((f) => f.endsWith(".fnb"))
  .map((f) => f.slice(0, -4))
  .sort();

describe("golden cases", () => {
  it("has cases", () => {
    expect(names.length).toBeGreaterThan(30);
  });
  for (const name of names) {
    it(name, () => {
      const source = readFileSync(path.join(dir, name + ".fnb"), "utf8");
      const expected = JSON.parse(readFileSync(path.join(dir, name + ".json"), "utf8")) as Expected;
      const result = compileSource(source);
      const got = result.diagnostics.map(({ severity, line, column, endLine, endColumn }) => ({ severity, line, column, endLine, endColumn }));
      const want = expected.diagnostics.map(({ severity, line, column, endLine, endColumn }) => ({ severity, line, column, endLine, endColumn }));
      expect(got).toEqual(want);
      expected.diagnostics.forEach((d, i) => expect(result.diagnostics[i]!.message).toContain(d.message));
      if (expected.summary) expect(programSummary(parseSource(source).program)).toEqual(expected.summary);
      if (expected.table) {
        expect(result.spec).not.toBeNull();
        const spec = result.spec!;
        const n = spec.inputs.length;
        expect({
          inputs: spec.inputs,
          outputs: spec.outputs.map((o) => ({
            name: o.name,
            on: tableMinterms(tableFromCubes(o.on, n), n),
            dc: tableMinterms(tableFromCubes(o.dc, n), n),
          })),
        }).toEqual(expected.table);
      }
      if (expected.format !== undefined) {
        const f = formatSource(source);
        expect(f).toEqual({ text: expected.format });
      }
    });
  }
});
