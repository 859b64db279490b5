// The import and table commands, run as a user would (npm run -s cli -- ...).
import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { bruteTable, specOf } from "./helpers";

const cli = (args: string[], input?: string) => {
  const r = spawnSync("npm", ["run", "-s", "cli", "--", ...args], { encoding: "utf8", input });
  return { code: r.status, out: r.stdout, err: r.stderr };
};
const dir = mkdtempSync(path.join(tmpdir(), "fanbound-import-cli-"));

describe("cli import and table --format csv", () => {
  it("imports a CSV with --outputs and prints the source, exit 0", () => {
    const r = cli(["import", "lib/import/examples/sluice-alarm.csv", "--outputs", "alarm,horn"]);
    expect(r.code).toBe(0);
    expect(r.out).toContain("inputs sluice_open, pound_high, flow, override_key\noutputs alarm, horn\n");
    expect(specOf(r.out).outputs.map((o) => o.name)).toEqual(["alarm", "horn"]);
  });

  it("takes the last column as the only output without --outputs", () => {
    const r = cli(["import", "lib/import/examples/sluice-alarm.csv"]);
    expect(r.code).toBe(0);
    expect(r.out).toContain("inputs sluice_open, pound_high, flow, override_key, alarm\noutputs horn\n");
  });

  it("imports a Verilog file by its .v name", () => {
    const r = cli(["import", "lib/import/examples/weir-horn.v"]);
    expect(r.code).toBe(0);
    expect(r.out).toContain("// Imported from Verilog module weir_horn (weir-horn.v)");
  });

  it("prints refusals as JSON on standard error with exit 1, and nothing on standard output", () => {
    const r = cli(["import", "-"], "a,b,y\n0,1,1\n0,1,0\n");
    expect(r.code).toBe(1);
    expect(r.out).toBe("");
    const j = JSON.parse(r.err) as { ok: boolean; diagnostics: Array<Record<string, unknown>> };
    expect(j.ok).toBe(false);
    expect(j.diagnostics[0]).toMatchObject({ severity: "error", row: 3, col: 3, colName: "y" });
  });

  it("table --format csv writes a file that imports back to the same function", () => {
    const source = "inputs a, b, c\noutputs f, g\nf = a * b' + c\ng = on(1, 3) dc(6, 7)\n";
    const fnb = path.join(dir, "lamp.fnb");
    writeFileSync(fnb, source);
    const t = cli(["table", fnb, "--format", "csv"]);
    expect(t.code).toBe(0);
    // by hand: minterm 5 = a=1, b=0, c=1 -> f=1, g=0
    expect(t.out.split("\r\n")[6]).toBe("1,0,1,1,0");
    const csv = path.join(dir, "lamp.csv");
    writeFileSync(csv, t.out);
    const back = cli(["import", csv, "--outputs", "f,g"]);
    expect(back.code).toBe(0);
    expect(bruteTable(specOf(back.out))).toEqual(bruteTable(specOf(source)));
  });

  it("refuses bad arguments with the usage, exit 2", () => {
    expect(cli(["import"]).code).toBe(2);
    expect(cli(["import", "x.v", "--outputs", "y"]).code).toBe(2);
    expect(cli(["table", "x.fnb", "--format", "xml"]).code).toBe(2);
  });
});
