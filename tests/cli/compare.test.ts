import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { run as compareRun } from "../../lib/cli/commands/compare";
import { run as mapRun } from "../../lib/cli/commands/map";
import { run as minimizeRun } from "../../lib/cli/commands/minimize";

// The demo story's first and second cut of the chamber interlock: the second adds the impossible
// combination "level with both pounds", which frees minterms for the minimizer.
const NEW = readFileSync("lib/lang/examples/chamber-interlock.fnb", "utf8");
const OLD = NEW.split("\n").filter((l) => !/^\s*never\b/.test(l)).join("\n");
const FILES: Record<string, string> = { "old.fnb": OLD, "new.fnb": NEW };

function io() {
  const out: string[] = [];
  const err: string[] = [];
  return {
    io: { readSource: (f: string) => FILES[f] ?? (() => { throw Object.assign(new Error(`no ${f}`), { code: "ENOENT" }); })(), out: (t: string) => out.push(t), err: (t: string) => err.push(t) },
    out,
    err,
  };
}

async function mapStats(file: string, opts: string[]) {
  const t = io();
  expect(await mapRun([file, ...opts], t.io)).toBe(0);
  return JSON.parse(t.out.join("")).stats as Record<string, number | null | Record<string, number>>;
}

describe("compare command", () => {
  for (const opts of [["--family", "ttl-std-5v"], ["--family", "cmos-hc-5v", "--form", "nand", "--fanin", "2"], ["--family=lvcmos-3v3", "--fanout=3"]]) {
    it(`prints each side's map stats and their difference (${opts.join(" ")})`, async () => {
      const t = io();
      expect(await compareRun(["old.fnb", "new.fnb", ...opts], t.io)).toBe(0);
      const report = JSON.parse(t.out.join(""));
      expect(Object.keys(report).sort()).toEqual(["delta", "from", "outputs", "to"]);
      // The sides are exactly the stats two separate `map --format json` runs print.
      const a = await mapStats("old.fnb", opts);
      const b = await mapStats("new.fnb", opts);
      expect(report.from).toEqual(a);
      expect(report.to).toEqual(b);
      // Each delta is NEW − OLD of those two runs (the delay is map's criticalPathNs).
      const pairs: Array<[string, string]> = [["gates", "gates"], ["depth", "depth"], ["packages", "packages"], ["transistors", "transistors"],
        ["delayNs", "criticalPathNs"], ["staticMw", "staticMw"], ["dynamicMw", "dynamicMw"]];
      expect(Object.keys(report.delta).sort()).toEqual(pairs.map(([k]) => k).sort());
      for (const [k, m] of pairs) {
        const x = a[m] as number | null;
        const y = b[m] as number | null;
        if (x === null || y === null) expect(report.delta[k]).toBeNull();
        else expect(report.delta[k]).toBeCloseTo(y - x, 9);
      }
    });
  }

  it("lists each output's terms and literals as the minimizer reports them for each file", async () => {
    const t = io();
    expect(await compareRun(["old.fnb", "new.fnb", "--family", "ttl-std-5v"], t.io)).toBe(0);
    const report = JSON.parse(t.out.join(""));
    for (const [side, file] of [["from", "old.fnb"], ["to", "new.fnb"]] as const) {
      const m = io();
      expect(await minimizeRun([file], m.io)).toBe(0);
      const min = JSON.parse(m.out.join("")) as { outputs: Array<{ name: string; products: number; literals: number }> };
      expect(report.outputs.map((o: { name: string }) => o.name)).toEqual(min.outputs.map((o) => o.name));
      for (const o of min.outputs) {
        expect(report.outputs.find((r: { name: string }) => r.name === o.name)[side]).toEqual({ products: o.products, literals: o.literals });
      }
    }
  });

  it("reports a cover that shrank, worked by hand", async () => {
    // a·b + a·b'·c = a·b + a·c (x + x'y = x + y inside a), and adding a·c' covers every
    // combination with a = 1, so the cover becomes the single literal a (Boolean algebra, any textbook).
    FILES["two.fnb"] = "inputs a, b, c\noutputs f, g\nf = a * b + a * b' * c\ng = b * c\n";
    FILES["one.fnb"] = "inputs a, b, c\noutputs f, h\nf = a * b + a * b' * c + a * c'\nh = c\n";
    const t = io();
    expect(await compareRun(["two.fnb", "one.fnb", "--family", "cmos-hc-5v"], t.io)).toBe(0);
    const report = JSON.parse(t.out.join(""));
    expect(report.outputs).toEqual([
      { name: "f", from: { products: 2, literals: 4 }, to: { products: 1, literals: 1 } },
      { name: "h", from: null, to: { products: 1, literals: 1 } },
      { name: "g", from: { products: 1, literals: 2 }, to: null },
    ]);
  });

  it("exits 0 when the design grew: the calling script decides what fails", async () => {
    const t = io();
    expect(await compareRun(["new.fnb", "old.fnb", "--family", "ttl-std-5v"], t.io)).toBe(0);
    expect(JSON.parse(t.out.join("")).delta.gates).toBeGreaterThanOrEqual(0);
  });

  it("refuses a missing file name, a third file, --format and an unknown family with the usage", async () => {
    for (const [args, msg] of [
      [["old.fnb", "--family", "ttl-std-5v"], /NEW is missing/],
      [["old.fnb", "new.fnb", "x.fnb", "--family", "ttl-std-5v"], /one too many/],
      [["old.fnb", "new.fnb", "--family", "ttl-std-5v", "--format", "verilog"], /unknown option --format/],
      [["old.fnb", "new.fnb"], /--family is missing/],
    ] as const) {
      const t = io();
      expect(await compareRun([...args], t.io)).toBe(2);
      expect(t.err.join("")).toMatch(msg);
      expect(t.err.join("")).toMatch(/usage: npm run -s cli -- compare OLD NEW/);
    }
    const t = io();
    expect(await compareRun(["old.fnb", "new.fnb", "--family", "valve-logic"], t.io)).toBe(2);
    expect(t.err.join("")).toMatch(/unknown family "valve-logic"/);
  });

  it("a language error in one file names that file, exit 1", async () => {
    FILES["broken.fnb"] = "inputs a\noutputs f\nf = a * \n";
    const t = io();
    expect(await compareRun(["old.fnb", "broken.fnb", "--family", "ttl-std-5v"], t.io)).toBe(1);
    const r = JSON.parse(t.out.join(""));
    expect(r).toMatchObject({ ok: false, file: "broken.fnb" });
    expect(r.diagnostics.length).toBeGreaterThan(0);
  });
});
