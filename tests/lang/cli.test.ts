// The check and table commands, run as a user would (npm run -s cli -- ...).
import { spawnSync } from "node:child_process";
import { describe, expect, it } from "vitest";

const cli = (args: string[], input?: string) => {
  const r = spawnSync("npm", ["run", "-s", "cli", "--", ...args], { encoding: "utf8", input });
  return { code: r.status, out: r.stdout, err: r.stderr };
};

describe("cli check and table", () => {
  it("check prints ok and no diagnostics for a clean file, exit 0", () => {
    const r = cli(["check", "lib/lang/examples/level-display.fnb"]);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out)).toEqual({ ok: true, diagnostics: [] });
  });
  it("check reads standard input with - and exits 1 on an error", () => {
    const r = cli(["check", "-"], "inputs a\noutputs f\nf = a +\n");
    expect(r.code).toBe(1);
    const j = JSON.parse(r.out) as { ok: boolean; diagnostics: Record<string, unknown>[] };
    expect(j.ok).toBe(false);
    // "+" sits at line 3, column 7 (counted by hand)
    expect(j.diagnostics).toHaveLength(1);
    expect(j.diagnostics[0]).toMatchObject({ severity: "error", line: 3, column: 7, endLine: 3, endColumn: 8 });
    expect(Object.keys(j.diagnostics[0]!).sort()).toEqual(["column", "endColumn", "endLine", "line", "message", "severity"]);
  });
  it("check exits 0 when there are only warnings", () => {
    const r = cli(["check", "-"], "inputs a, b\noutputs f\nf = a\n");
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out).ok).toBe(true);
  });
  it("table prints minterm indices in declared order", () => {
    const r = cli(["table", "-"], "inputs a, b, c\noutputs g\ng = on(1, 3, 5..7) dc(0, 2)\n");
    expect(r.code).toBe(0);
    // by hand from the lists
    expect(JSON.parse(r.out)).toEqual({ inputs: ["a", "b", "c"], outputs: [{ name: "g", on: [1, 3, 5, 6, 7], dc: [0, 2] }] });
  });
  it("table on a source with errors prints the check JSON and exits 1", () => {
    const r = cli(["table", "-"], "inputs a\noutputs f\n");
    expect(r.code).toBe(1);
    expect(JSON.parse(r.out).ok).toBe(false);
  });
  it("table refuses more than 20 inputs with a clear message", () => {
    const names = Array.from({ length: 21 }, (_, i) => `x${i}`);
    const r = cli(["table", "-"], `inputs ${names.join(", ")}\noutputs f\nf = ${names.join(" * ")}\n`);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/table output stops at 20 inputs.*minimize/);
  });
});
