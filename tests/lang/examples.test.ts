// The demo sources in lib/lang/examples: each compiles cleanly, formats to a
// fixed point with the same function, and the decoders match tables computed here.
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { compileSource, formatSource, parseSource } from "../../lib/lang/index";
import type { Cube, FunctionSpec } from "../../lib/logic/index";

const dir = path.join(import.meta.dirname, "../../lib/lang/examples");
const read = (name: string) => readFileSync(path.join(dir, name), "utf8");
const member = (cs: Cube[], m: number) => cs.some((c) => ((m ^ c.value) & c.mask) === 0);
const onSet = (spec: FunctionSpec, name: string) => {
  const o = spec.outputs.find((x) => x.name === name)!;
  const n = spec.inputs.length;
  return [...Array(2 ** n).keys()].filter((m) => member(o.on, m));
};
const dcSet = (spec: FunctionSpec, name: string) => {
  const o = spec.outputs.find((x) => x.name === name)!;
  const n = spec.inputs.length;
  return [...Array(2 ** n).keys()].filter((m) => member(o.dc, m));
};

describe("examples", () => {
  const files = readdirSync(dir).filter((f) => f.endsWith(".fnb"));
  it("are all there", () => {
    expect(files.sort()).toEqual(["chamber-interlock.fnb", "fault-priority.fnb", "level-display.fnb", "paddle-driver.fnb", "status-lamps.fnb"]);
  });
  for (const f of files) {
    it(`${f} compiles with no diagnostics and formats to a fixed point with the same function`, () => {
      const src = read(f);
      const r = compileSource(src);
      expect(r.diagnostics).toEqual([]);
      const once = formatSource(src) as { text: string };
      expect(formatSource(once.text)).toEqual(once);
      const again = compileSource(once.text);
      expect(again.diagnostics).toEqual([]);
      const spec = r.spec!;
      for (const o of spec.outputs) {
        expect(onSet(again.spec!, o.name)).toEqual(onSet(spec, o.name));
        expect(dcSet(again.spec!, o.name)).toEqual(dcSet(spec, o.name));
      }
    });
  }

  it("level display drives the usual 7-segment patterns for 0 to 9, 10 to 15 don't-care", () => {
    // segment table for digits 0-9, 6 with its top bar and 9 with its bottom bar (from memory, common practice)
    const lit: Record<string, number[]> = {
      seg_a: [0, 2, 3, 5, 6, 7, 8, 9],
      seg_b: [0, 1, 2, 3, 4, 7, 8, 9],
      seg_c: [0, 1, 3, 4, 5, 6, 7, 8, 9],
      seg_d: [0, 2, 3, 5, 6, 8, 9],
      seg_e: [0, 2, 6, 8],
      seg_f: [0, 4, 5, 6, 8, 9],
      seg_g: [2, 3, 4, 5, 6, 8, 9],
    };
    const spec = compileSource(read("level-display.fnb")).spec!;
    for (const [seg, digits] of Object.entries(lit)) {
      expect(onSet(spec, seg), seg).toEqual(digits);
      expect(dcSet(spec, seg), seg).toEqual([10, 11, 12, 13, 14, 15]);
    }
  });

  it("fault priority encoder names the most urgent line (brute force over 256 patterns)", () => {
    const spec = compileSource(read("fault-priority.fnb")).spec!;
    const [c2, c1, c0, valid] = ["code2", "code1", "code0", "valid"].map((o) => new Set(onSet(spec, o)));
    for (let m = 0; m < 256; m++) {
      // f7 is declared first, so it is bit 7 of the minterm
      const top = m === 0 ? 0 : 31 - Math.clz32(m);
      expect(valid!.has(m)).toBe(m !== 0);
      expect([c2!.has(m), c1!.has(m), c0!.has(m)]).toEqual([(top & 4) !== 0, (top & 2) !== 0, (top & 1) !== 0]);
    }
  });

  it("paddle driver energises exactly one coil of the selected paddle when enabled", () => {
    const spec = compileSource(read("paddle-driver.fnb")).spec!;
    const order = ["ul", "ur", "ll", "lr"];
    for (let m = 0; m < 16; m++) {
      const enable = (m & 8) !== 0;
      const raise = (m & 4) !== 0;
      const sel = m & 3;
      order.forEach((p, k) => {
        expect(onSet(spec, `raise_${p}`).includes(m)).toBe(enable && raise && sel === k);
        expect(onSet(spec, `lower_${p}`).includes(m)).toBe(enable && !raise && sel === k);
      });
    }
  });

  it("chamber interlock never permits a gate while the emergency stop is pressed", () => {
    const spec = compileSource(read("chamber-interlock.fnb")).spec!;
    // estop is the last input, so bit 0 of the minterm
    for (const o of ["open_upper", "open_lower", "paddles_upper", "paddles_lower"]) {
      expect(onSet(spec, o).some((m) => (m & 1) === 1), o).toBe(false);
    }
    expect(onSet(spec, "alarm").filter((m) => (m & 1) === 1).length).toBeGreaterThan(0);
  });
});

describe("the language reference", () => {
  const md = readFileSync(path.join(import.meta.dirname, "../../lib/lang/REFERENCE.md"), "utf8");
  const blocks = [...md.matchAll(/```fanbound\n([\s\S]*?)```/g)].map((m) => m[1]!);
  it("has Fanbound examples", () => {
    expect(blocks.length).toBeGreaterThan(8);
  });
  it("shows only examples that parse", () => {
    for (const b of blocks) expect(parseSource(b).diagnostics, b).toEqual([]);
  });
  it("ends with a complete example that compiles with no diagnostics", () => {
    expect(compileSource(blocks[blocks.length - 1]!).diagnostics).toEqual([]);
    expect(compileSource(blocks[0]!).diagnostics).toEqual([]);
  });
});
