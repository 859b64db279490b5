// The command line with --library NAME=DIR: use lines answered from local
// folders (DIR/BLOCK/N.fnb), in check, table, minimize, map and compare. The expected
// function is the blocks' own truth tables composed in this file.
import { spawnSync } from "node:child_process";
import { mkdirSync, mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { compileSource } from "../../lib/lang/index";
import { tableFromCubes, tableMinterms } from "../../lib/logic/index";

const VOTE_1 = "inputs a, b, c\noutputs m\nm = a * b + a * c + b * c\n";
const VOTE_2 = "inputs a, b, c\noutputs m\nm = a * b * c\n";
const DESIGN = (at: number) =>
  `inputs s1, s2, s3, lower_shut, estop\noutputs open_upper\nuse vote2of3 from "lock-blocks" at ${at}\nopen_upper = estop' * lower_shut * vote2of3(s1, s2, s3)\n`;

let dir: string;
let lib: string;

const cli = (args: string[], input?: string, env: Record<string, string> = {}) => {
  const r = spawnSync(process.execPath, ["lib/cli/run.mjs", ...args], { encoding: "utf8", input, env: { ...process.env, FANBOUND_URL: "", FANBOUND_TOKEN: "", ...env } });
  return { code: r.status, out: r.stdout, err: r.stderr };
};

/** open_upper from the vote block's own table and the design's wiring (s1 s2 s3 lower_shut estop, s1 the most significant bit). */
function expected(vote: string): number[] {
  const spec = compileSource(vote).spec!;
  const on = new Set(tableMinterms(tableFromCubes(spec.outputs[0]!.on, 3), 3));
  const out: number[] = [];
  for (let m = 0; m < 32; m++) {
    const [s1, s2, s3, lower, estop] = [4, 3, 2, 1, 0].map((k) => (m >> k) & 1) as [number, number, number, number, number];
    if (lower && !estop && on.has(s1 * 4 + s2 * 2 + s3)) out.push(m);
  }
  return out;
}

beforeAll(() => {
  dir = mkdtempSync(path.join(tmpdir(), "fanbound-lib-"));
  lib = path.join(dir, "lock-blocks");
  mkdirSync(path.join(lib, "vote2of3"), { recursive: true });
  writeFileSync(path.join(lib, "vote2of3", "1.fnb"), VOTE_1);
  writeFileSync(path.join(lib, "vote2of3", "2.fnb"), VOTE_2);
  writeFileSync(path.join(dir, "gate.fnb"), DESIGN(1));
  writeFileSync(path.join(dir, "gate-2.fnb"), DESIGN(2));
});

describe("cli --library NAME=DIR", () => {
  it("check resolves the use line from the folder, and says what to give without it", () => {
    expect(JSON.parse(cli(["check", path.join(dir, "gate.fnb"), "--library", `lock-blocks=${lib}`]).out)).toEqual({ ok: true, diagnostics: [] });
    const without = cli(["check", path.join(dir, "gate.fnb")]);
    expect(without.code).toBe(1);
    const d = JSON.parse(without.out).diagnostics[0];
    expect(d).toMatchObject({ line: 3, column: 1, message: expect.stringContaining('give --library lock-blocks=DIR') });
  });

  it("table gives the composed function at the pinned revision; at 2 the stricter one", () => {
    // Worked by hand for revision 1: lower_shut = 1, estop = 0 and two of s1 s2 s3 → 01110, 10110, 11010, 11110.
    expect(expected(VOTE_1)).toEqual([14, 22, 26, 30]);
    const one = JSON.parse(cli(["table", path.join(dir, "gate.fnb"), `--library=lock-blocks=${lib}`]).out);
    expect(one.outputs[0]).toEqual({ name: "open_upper", on: expected(VOTE_1), dc: [] });
    const two = JSON.parse(cli(["table", "-", "--library", `lock-blocks=${lib}`], DESIGN(2)).out);
    expect(two.outputs[0].on).toEqual(expected(VOTE_2));
  });

  it("a missing revision names the file looked for and the revisions there", () => {
    const r = cli(["check", "-", "--library", `lock-blocks=${lib}`], DESIGN(7));
    expect(JSON.parse(r.out).diagnostics[0].message).toContain(`no revision 7 (no file ${path.join(lib, "vote2of3", "7.fnb")}); its revisions are 1, 2 (write at 2 for the latest)`);
  });

  it("minimize covers exactly the composed ON-set", () => {
    const r = cli(["minimize", path.join(dir, "gate.fnb"), "--library", `lock-blocks=${lib}`]);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.out).outputs[0] as { cubes: string[] };
    // Cubes print as strings over the inputs in order: 0, 1 or - per input.
    const covered: number[] = [];
    for (let m = 0; m < 32; m++) {
      const bits = m.toString(2).padStart(5, "0");
      if (out.cubes.some((c) => [...c].every((ch, i) => ch === "-" || ch === bits[i]))) covered.push(m);
    }
    expect(covered).toEqual(expected(VOTE_1));
  });

  it("map's netlist, simulated gate by gate here, computes the composed function", () => {
    const r = cli(["map", path.join(dir, "gate.fnb"), "--family", "ttl-std-5v", "--library", `lock-blocks=${lib}`]);
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.out) as { inputs: string[]; outputs: Array<{ name: string; net: string }>; gates: Array<{ type: string; inputs: string[]; output: string }> };
    const on: number[] = [];
    for (let m = 0; m < 32; m++) {
      const v = new Map<string, boolean>(doc.inputs.map((name, i) => [name, ((m >> (4 - i)) & 1) === 1]));
      let pending = [...doc.gates];
      while (pending.length) {
        const next = pending.filter((g) => !g.inputs.every((x) => v.has(x)));
        for (const g of pending.filter((g) => g.inputs.every((x) => v.has(x)))) {
          const xs = g.inputs.map((x) => v.get(x)!);
          const and = xs.every(Boolean);
          const or = xs.some(Boolean);
          const xor = xs.filter(Boolean).length % 2 === 1;
          const table: Record<string, boolean> = { AND: and, NAND: !and, OR: or, NOR: !or, XOR: xor, XNOR: !xor, NOT: !xs[0], BUF: xs[0]! };
          v.set(g.output, table[g.type]!);
        }
        expect(next.length).toBeLessThan(pending.length);
        pending = next;
      }
      if (v.get(doc.outputs[0]!.net)) on.push(m);
    }
    expect(on).toEqual(expected(VOTE_1));
  });

  it("compare maps each file with its own revision of the block: the same figures as map of each, and NEW − OLD", () => {
    const lib_ = ["--library", `lock-blocks=${lib}`];
    const stats = (file: string) => {
      const r = cli(["map", path.join(dir, file), "--family", "cmos-hc-5v", ...lib_]);
      expect(r.code).toBe(0);
      return (JSON.parse(r.out) as { stats: { gates: number; depth: number } }).stats;
    };
    const r = cli(["compare", path.join(dir, "gate.fnb"), path.join(dir, "gate-2.fnb"), "--family", "cmos-hc-5v", ...lib_]);
    expect(r.code).toBe(0);
    const report = JSON.parse(r.out) as { from: { gates: number }; to: { gates: number }; delta: { gates: number } };
    const [one, two] = [stats("gate.fnb"), stats("gate-2.fnb")];
    expect(report.from).toEqual(one);
    expect(report.to).toEqual(two);
    expect(report.delta.gates).toBe(two.gates - one.gates);
    // Revision 2's stricter vote (all three) is one product of five literals where revision 1 needs three: fewer gates.
    expect(two.gates).toBeLessThan(one.gates);
    const without = cli(["compare", path.join(dir, "gate.fnb"), path.join(dir, "gate-2.fnb"), "--family", "cmos-hc-5v"]);
    expect(without.code).toBe(1);
    expect(JSON.parse(without.out).diagnostics[0].message).toContain("give --library lock-blocks=DIR");
  });

  it("refuses a --library that is not NAME=DIR of a folder", () => {
    const r = cli(["check", path.join(dir, "gate.fnb"), "--library", "lock-blocks"]);
    expect(r.code).toBe(2);
    expect(r.err).toContain("--library takes NAME=DIR");
    const missing = cli(["table", path.join(dir, "gate.fnb"), "--library", `lock-blocks=${path.join(dir, "nowhere")}`]);
    expect(missing.code).toBe(2);
    expect(missing.err).toContain("is not a folder");
  });
});
