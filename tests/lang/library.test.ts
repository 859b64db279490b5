// Library blocks in the language core: use lines resolved through a resolver,
// elaborated into one flat function. The reference in every check is the
// block's own truth table (compileSource of the block's source alone), composed
// with the design's wiring by direct evaluation in this file — never the
// pipeline's answer for the design itself.
import { describe, expect, it } from "vitest";
import { checkLibraryBlock, compileSource, findUses, type LibraryAnswer, type LibraryRequest, type LibraryResolver } from "../../lib/lang/index";
import { tableFromCubes, tableMinterms, type Cube } from "../../lib/logic/index";
import { compileNow } from "../../lib/pipeline/index";
import { BUILT_IN_FAMILIES } from "../../lib/families/index";

const bit = (m: number, i: number, n: number) => ((m >>> (n - 1 - i)) & 1) === 1;
const member = (cs: Cube[], m: number) => cs.some((c) => ((m ^ c.value) & c.mask) === 0);

/** A block's own truth table: per output, ON and DC minterm sets over its inputs. */
function blockTable(source: string) {
  const r = compileSource(source);
  expect(r.diagnostics.filter((d) => d.severity === "error")).toEqual([]);
  const spec = r.spec!;
  const n = spec.inputs.length;
  return {
    n,
    on: spec.outputs.map((o) => new Set(tableMinterms(tableFromCubes(o.on, n), n))),
    dc: spec.outputs.map((o) => new Set(tableMinterms(tableFromCubes(o.dc, n), n))),
  };
}

/** Looks a block up in its table: the outputs' values, and whether the arguments meet its impossible combinations. */
function evalBlock(t: ReturnType<typeof blockTable>, args: boolean[]): { out: boolean[]; impossible: boolean } {
  let m = 0;
  for (const a of args) m = m * 2 + (a ? 1 : 0);
  // A block used by a design has no don't-cares of its own except its never lines (the checker refuses dc(...) on
  // a library block's outputs), so a don't-care here is an impossible combination of its inputs.
  const impossible = t.dc.some((d) => d.has(m));
  return { out: t.on.map((s) => s.has(m)), impossible };
}

/** A resolver over a fixed shelf: library → block → revision → source. */
function shelf(books: Record<string, Record<string, string[]>>): LibraryResolver & { asked: LibraryRequest[] } {
  const asked: LibraryRequest[] = [];
  const fn = ((r: LibraryRequest): LibraryAnswer => {
    asked.push(r);
    const lib = books[r.library];
    if (!lib) return { ok: false, message: `there is no library "${r.library}"` };
    const revs = lib[r.block];
    if (!revs) return { ok: false, message: `library "${r.library}" has no block '${r.block}'` };
    const n = r.revision ?? revs.length;
    const source = revs[n - 1];
    if (!source) return { ok: false, message: `'${r.block}' has no revision ${n}` };
    return { ok: true, source, revision: n, latest: revs.length };
  }) as LibraryResolver & { asked: LibraryRequest[] };
  fn.asked = asked;
  return fn;
}

// A two-of-three vote of the level sensors, and the gate-interlock core (Ferrow scenario).
const VOTE_1 = "inputs a, b, c\noutputs m\nm = a * b + a * c + b * c\n";
// Revision 2 changes the function: all three must agree (a stricter vote).
const VOTE_2 = "inputs a, b, c\noutputs m\nm = a * b * c\n";
const CORE = [
  "inputs other_shut, level, key, estop",
  "outputs permit, key_alarm",
  "let safe = estop'",
  "permit = safe * other_shut * (level + key)",
  "key_alarm = key * other_shut'",
].join("\n");
// A level-code decoder with impossible codes: the probe sends 0..5 only on a 3-bit code.
const DECODE = [
  "inputs c2, c1, c0",
  "outputs low, mid, high",
  "never c2 * c1",
  "block inrange(x, y) -> r",
  "  r = x' + y'",
  "end",
  "low = c2' * c1' * inrange(c1, c0)",
  "mid = c2' * c1",
  "high = c2",
].join("\n");

const LIB = shelf({ "lock-blocks": { vote2of3: [VOTE_1, VOTE_2], gate_core: [CORE], level_decode: [DECODE] } });

describe("use lines elaborate library blocks into the design", () => {
  const design = [
    "inputs s1, s2, s3, t1, t2, t3, lower_shut, key, estop",
    "outputs open_upper, alarm, voted",
    'use vote2of3 from "lock-blocks" at 1',
    'use gate_core from "lock-blocks" at 1',
    "let level_upper = vote2of3(s1, s2, s3)",
    "(open_upper, alarm) = gate_core(lower_shut, level_upper, key, estop)",
    "voted = vote2of3(t1, t2, t3) ^ level_upper",
  ].join("\n");

  it("equals the blocks' own truth tables composed as written (exhaustive, 512 combinations)", () => {
    const r = compileSource(design, { resolve: LIB });
    expect(r.diagnostics).toEqual([]);
    const spec = r.spec!;
    const vote = blockTable(VOTE_1);
    const core = blockTable(CORE);
    const n = 9;
    for (let m = 0; m < 2 ** n; m++) {
      const x = (i: number) => bit(m, i, n);
      const lu = evalBlock(vote, [x(0), x(1), x(2)]).out[0]!;
      const [open, alarm] = evalBlock(core, [x(6), lu, x(7), x(8)]).out;
      const voted = evalBlock(vote, [x(3), x(4), x(5)]).out[0]! !== lu;
      expect([member(spec.outputs[0]!.on, m), member(spec.outputs[1]!.on, m), member(spec.outputs[2]!.on, m)]).toEqual([open, alarm, voted]);
      for (const o of spec.outputs) expect(member(o.dc, m)).toBe(false);
    }
  });

  it("reports the blocks it brought in, with ports and the revision number's place", () => {
    const r = compileSource(design, { resolve: LIB });
    expect(r.libraries.map((u) => [u.block, u.revision, u.inputs, u.outputs])).toEqual([
      ["vote2of3", 1, ["a", "b", "c"], ["m"]],
      ["gate_core", 1, ["other_shut", "level", "key", "estop"], ["permit", "key_alarm"]],
    ]);
    // `at 1` on line 3: "use vote2of3 from "lock-blocks" at " is 35 characters, so the 1 is column 36.
    expect(r.libraries[0]!.revisionRange).toEqual({ line: 3, column: 36, endLine: 3, endColumn: 37 });
  });

  it("a pinned revision keeps its function when the library has a newer one", () => {
    const at1 = compileSource(design, { resolve: LIB }).spec!;
    const at2 = compileSource(design.replace('vote2of3 from "lock-blocks" at 1', 'vote2of3 from "lock-blocks" at 2'), { resolve: LIB }).spec!;
    const strict = blockTable(VOTE_2);
    const n = 9;
    let differs = 0;
    for (let m = 0; m < 2 ** n; m++) {
      const x = (i: number) => bit(m, i, n);
      const lu = evalBlock(strict, [x(0), x(1), x(2)]).out[0]!;
      const voted = evalBlock(strict, [x(3), x(4), x(5)]).out[0]! !== lu;
      expect(member(at2.outputs[2]!.on, m)).toBe(voted);
      if (member(at1.outputs[2]!.on, m) !== member(at2.outputs[2]!.on, m)) differs++;
    }
    // Two revisions of different function: the pinned one did not follow the newer.
    expect(differs).toBeGreaterThan(0);
  });

  it("brings a block's never lines to the design as impossible combinations of the arguments", () => {
    // The decoder's own table has codes 6 and 7 (c2 * c1) as don't-cares; at a use they become impossible
    // combinations of what feeds it: here (p ^ q, r, s).
    const src = [
      "inputs p, q, r, s, u",
      "outputs lo, hi, other",
      'use level_decode from "lock-blocks" at 1',
      "let (lo2, mid2, hi2) = level_decode(p ^ q, r, s)",
      "lo = lo2",
      "hi = hi2 + mid2",
      "other = u",
    ].join("\n");
    const r = compileSource(src, { resolve: LIB });
    expect(r.diagnostics).toEqual([]);
    const dec = blockTable(DECODE);
    const n = 5;
    for (let m = 0; m < 2 ** n; m++) {
      const x = (i: number) => bit(m, i, n);
      const { out, impossible } = evalBlock(dec, [x(0) !== x(1), x(2), x(3)]);
      const [lo, hi, other] = r.spec!.outputs;
      // Every output, even `other` which does not read the block, is a don't-care where the block's inputs are impossible.
      for (const o of [lo!, hi!, other!]) expect(member(o.dc, m)).toBe(impossible);
      if (!impossible) {
        expect(member(lo!.on, m)).toBe(out[0]);
        expect(member(hi!.on, m)).toBe(out[2]! || out[1]!);
        expect(member(other!.on, m)).toBe(x(4));
      } else {
        for (const o of [lo!, hi!, other!]) expect(member(o.on, m)).toBe(false);
      }
    }
  });

  it("keeps a library block's own blocks apart from the design's blocks of the same name", () => {
    const src = [
      "inputs a, b, c",
      "outputs f, g",
      'use level_decode from "lock-blocks" at 1',
      "block inrange(x, y) -> r", // the design's own, a different function from the library's
      "  r = x * y",
      "end",
      "let (lo, mid, hi) = level_decode(a, b, c)",
      "f = lo + mid + hi",
      "g = inrange(a, b)",
    ].join("\n");
    const r = compileSource(src, { resolve: LIB });
    expect(r.diagnostics.filter((d) => d.severity === "error")).toEqual([]);
    const dec = blockTable(DECODE);
    for (let m = 0; m < 8; m++) {
      const x = (i: number) => bit(m, i, 3);
      const { out, impossible } = evalBlock(dec, [x(0), x(1), x(2)]);
      expect(member(r.spec!.outputs[1]!.dc, m)).toBe(impossible);
      if (!impossible) {
        expect(member(r.spec!.outputs[0]!.on, m)).toBe(out.some(Boolean));
        expect(member(r.spec!.outputs[1]!.on, m)).toBe(x(0) && x(1));
      }
    }
  });

  it("lets a design's own block call a library block", () => {
    const src = [
      "inputs a, b, c, d",
      "outputs f",
      'use vote2of3 from "lock-blocks" at 1',
      "block both(w, x, y, z) -> r",
      "  r = vote2of3(w, x, y) * z",
      "end",
      "f = both(a, b, c, d)",
    ].join("\n");
    const r = compileSource(src, { resolve: LIB });
    expect(r.diagnostics).toEqual([]);
    const vote = blockTable(VOTE_1);
    for (let m = 0; m < 16; m++) {
      const x = (i: number) => bit(m, i, 4);
      expect(member(r.spec!.outputs[0]!.on, m)).toBe(evalBlock(vote, [x(0), x(1), x(2)]).out[0]! && x(3));
    }
  });

  it("works beyond truth-table size (24 inputs), the block's never lines included", () => {
    const names = Array.from({ length: 24 }, (_, i) => `x${i}`);
    const src = [
      `inputs ${names.join(", ")}`,
      "outputs f, g",
      'use level_decode from "lock-blocks" at 1',
      "let (lo, mid, hi) = level_decode(x0, x1, x23)",
      "f = lo + x5 * x6",
      "g = x10 ^ x11",
    ].join("\n");
    const r = compileSource(src, { resolve: LIB });
    expect(r.diagnostics.filter((d) => d.severity === "error")).toEqual([]);
    const dec = blockTable(DECODE);
    const n = 24;
    // A deterministic spread of minterms (a linear congruential walk), checked one by one.
    let m = 12345;
    for (let k = 0; k < 4000; k++) {
      m = (m * 1103515245 + 12345) % 2 ** 24;
      const x = (i: number) => bit(m, i, n);
      const { out, impossible } = evalBlock(dec, [x(0), x(1), x(23)]);
      const [f, g] = r.spec!.outputs;
      expect(member(f!.dc, m)).toBe(impossible);
      expect(member(g!.dc, m)).toBe(impossible);
      if (!impossible) {
        expect(member(f!.on, m)).toBe(out[0]! || (x(5) && x(6)));
        expect(member(g!.on, m)).toBe(x(10) !== x(11));
      }
    }
  });

  it("runs through the pipeline: the mapped netlist is verified against the flat function", () => {
    const family = BUILT_IN_FAMILIES.find((f) => f.id === "cmos-hc-5v")!;
    const r = compileNow({ source: design, family, resolve: LIB });
    expect(r.result?.verification?.ok).toBe(true);
    expect(r.libraries.length).toBe(2);
  });
});

describe("use lines that cannot be resolved are located errors that say what to write", () => {
  const errorsOf = (src: string, resolve?: LibraryResolver) =>
    compileSource(src, resolve ? { resolve } : undefined).diagnostics.filter((d) => d.severity === "error");

  it("without a resolver", () => {
    const [e] = errorsOf('inputs a, b, c\noutputs f\nuse vote2of3 from "lock-blocks" at 1\nf = vote2of3(a, b, c)\n');
    expect(e).toMatchObject({ line: 3, column: 1, endLine: 3, endColumn: 37 });
    expect(e!.message).toMatch(/looked up by the server .* or by the CLI/);
  });

  it("without `at`: names the latest revision to write", () => {
    const [e] = errorsOf('inputs a, b, c\noutputs f\nuse vote2of3 from "lock-blocks"\nf = vote2of3(a, b, c)\n', LIB);
    expect(e!.message).toContain('write use vote2of3 from "lock-blocks" at 2 (the latest)');
  });

  it("the resolver's own reason, on the use line, and no follow-on error at the call", () => {
    const errs = errorsOf('inputs a, b, c\noutputs f\nuse votes from "lock-blocks" at 1\nf = votes(a, b, c)\n', LIB);
    expect(errs).toHaveLength(1);
    expect(errs[0]).toMatchObject({ line: 3, message: `library "lock-blocks" has no block 'votes'` });
  });

  it("a block revision that does not compile, or gives don't-cares, or uses other library blocks", () => {
    const bad = shelf({
      l: {
        broken: ["inputs a\noutputs f\nf = a +\n"],
        loose: ["inputs a, b\noutputs f\nf = a * b dc(3)\n"],
        nested: ['inputs a\noutputs f\nuse x from "l" at 1\nf = x(a)\n'],
      },
    });
    const src = (b: string) => `inputs a, b\noutputs f\nuse ${b} from "l" at 1\nf = ${b}(a${b === "loose" ? ", b" : ""})\n`;
    expect(errorsOf(src("broken"), bad)[0]!.message).toMatch(/block 'broken' from "l" at 1 does not compile \(its line 3: /);
    expect(errorsOf(src("loose"), bad)[0]!.message).toMatch(/don't-cares on its output 'f'.*never lines/);
    expect(errorsOf(src("nested"), bad)[0]!.message).toMatch(/uses library blocks itself \(line 3\)/);
  });

  it("arity: a call with the wrong number of inputs or results names the library block's ports", () => {
    const [a] = errorsOf('inputs a, b\noutputs f\nuse vote2of3 from "lock-blocks" at 1\nf = vote2of3(a, b)\n', LIB);
    expect(a!.message).toBe("block 'vote2of3' takes 3 inputs (a, b, c) but is given 2");
    const [t] = errorsOf('inputs a, b, c, d\noutputs f\nuse gate_core from "lock-blocks" at 1\nf = gate_core(a, b, c, d)\n', LIB);
    expect(t!.message).toMatch(/block 'gate_core' gives 2 results \(permit, key_alarm\); call it on a line of its own/);
  });

  it("the same name twice, and a local block of the same name", () => {
    const twice = errorsOf('inputs a, b, c\noutputs f\nuse vote2of3 from "lock-blocks" at 1\nuse vote2of3 from "lock-blocks" at 2\nf = vote2of3(a, b, c)\n', LIB);
    expect(twice).toHaveLength(1);
    expect(twice[0]).toMatchObject({ line: 4, message: expect.stringContaining("brought in twice (first at line 3)") });
    const clash = errorsOf('inputs a, b, c\noutputs f\nuse vote2of3 from "lock-blocks" at 1\nblock vote2of3(x, y, z) -> m\n  m = x\nend\nf = vote2of3(a, b, c)\n', LIB);
    expect(clash[0]!.message).toContain("block 'vote2of3' is defined twice (first at the use line)");
  });

  it("a resolver that throws is reported, not thrown", () => {
    const boom: LibraryResolver = () => {
      throw new Error("disk gone");
    };
    expect(errorsOf('inputs a\noutputs f\nuse x from "l" at 1\nf = x(a)\n', boom)[0]!.message).toContain("disk gone");
  });
});

describe("findUses", () => {
  it("finds use lines from the tokens, with the place of the revision number", () => {
    const src = '// use in a comment is not a line\ninputs a\nuse vote2of3 from "lock-blocks" at 12\n  use gate_core from "ferrow-controls/lock-blocks"\nuse broken from\noutputs f\n';
    expect(findUses(src)).toEqual([
      {
        library: "lock-blocks", block: "vote2of3", revision: 12,
        range: { line: 3, column: 1, endLine: 3, endColumn: 38 },
        revisionRange: { line: 3, column: 36, endLine: 3, endColumn: 38 },
      },
      {
        library: "ferrow-controls/lock-blocks", block: "gate_core", revision: null,
        range: { line: 4, column: 3, endLine: 4, endColumn: 51 },
        revisionRange: null,
      },
    ]);
    expect(findUses("inputs a\noutputs f\nf = a\n")).toEqual([]);
  });
});

describe("checkLibraryBlock", () => {
  it("gives the ports of a publishable block", () => {
    expect(checkLibraryBlock(CORE)).toEqual({ diagnostics: [], inputs: ["other_shut", "level", "key", "estop"], outputs: ["permit", "key_alarm"] });
  });
  it("refuses use lines and dc(...), located in the block's own source", () => {
    const r = checkLibraryBlock('inputs a, b\noutputs f, g\nuse x from "l" at 1\nf = x(a) dc(0)\ng = on(1) dc(2)\n');
    expect(r.diagnostics.map((d) => [d.line, d.column, d.message.slice(0, 40)])).toEqual([
      [3, 1, "a library block cannot use other library"],
      [4, 10, "a library block's outputs must be fully "],
      [5, 11, "a library block's outputs must be fully "],
    ]);
  });
  it("refuses a source that does not compile", () => {
    const errors = checkLibraryBlock("inputs a\noutputs f\n").diagnostics.filter((d) => d.severity === "error");
    expect(errors[0]!.message).toContain("output 'f' is never assigned");
  });
});
