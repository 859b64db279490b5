import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { compareFigures, countByTypeWidth, figuresOf, lineDiff, diffCounts, settingChanges, type Figures } from "../../lib/review";
import { compileNow } from "../../lib/pipeline";
import { BUILT_IN_FAMILIES } from "../../lib/families";

/** Length of a longest common subsequence by the textbook dynamic programme (Cormen et al., Introduction to Algorithms, §15.4). */
function lcs(a: string[], b: string[]): number {
  const t = Array.from({ length: a.length + 1 }, () => new Array<number>(b.length + 1).fill(0));
  for (let i = 1; i <= a.length; i++) {
    for (let j = 1; j <= b.length; j++) t[i]![j] = a[i - 1] === b[j - 1] ? t[i - 1]![j - 1]! + 1 : Math.max(t[i - 1]![j]!, t[i]![j - 1]!);
  }
  return t[a.length]![b.length]!;
}

describe("line diff of two sources", () => {
  it("keeps a longest common run of lines and rebuilds both texts (property, against the LCS dynamic programme)", () => {
    const line = fc.constantFrom("inputs a, b", "outputs f", "f = a * b", "f = a + b", "// note", "", "g = a'");
    fc.assert(
      fc.property(fc.array(line, { maxLength: 12 }), fc.array(line, { maxLength: 12 }), (a, b) => {
        const d = lineDiff(a.map((l) => `${l}\n`).join(""), b.map((l) => `${l}\n`).join(""));
        // Myers' diff is a shortest edit script, so what it keeps is a longest common subsequence (Myers 1986).
        expect(d.filter((l) => l.kind === "same").length).toBe(lcs(a, b));
        expect(d.filter((l) => l.kind !== "added").map((l) => l.text)).toEqual(a);
        expect(d.filter((l) => l.kind !== "removed").map((l) => l.text)).toEqual(b);
        expect(d.filter((l) => l.from !== null).map((l) => l.from)).toEqual(a.map((_, i) => i + 1));
        expect(d.filter((l) => l.to !== null).map((l) => l.to)).toEqual(b.map((_, i) => i + 1));
      }),
      { numRuns: 300 },
    );
  });

  it("numbers a changed line on both sides and ignores a missing final newline", () => {
    const d = lineDiff("inputs a, b\noutputs f\nf = a * b\n", "inputs a, b\noutputs f\nf = a + b");
    expect(d).toEqual([
      { kind: "same", from: 1, to: 1, text: "inputs a, b" },
      { kind: "same", from: 2, to: 2, text: "outputs f" },
      { kind: "removed", from: 3, to: null, text: "f = a * b" },
      { kind: "added", from: null, to: 3, text: "f = a + b" },
    ]);
    expect(diffCounts(d)).toEqual({ added: 1, removed: 1 });
    expect(lineDiff("", "")).toEqual([]);
  });
});

const base: Figures = {
  gates: 10, depth: 3, packages: 3, transistors: 80, delayNs: 27.5, staticMw: 0.012, dynamicMw: 1.25, maxLoad: 4, fanOut: 10,
  products: 6, literals: 15, exact: true,
  outputs: [{ name: "f", products: 2, literals: 5, exact: true }, { name: "g", products: 4, literals: 10, exact: true }],
  byTypeWidth: [{ type: "AND", width: 2, count: 4 }, { type: "OR", width: 3, count: 2 }, { type: "NOT", width: 1, count: 4 }],
  family: { id: "ttl-std-5v", name: "Bipolar TTL, standard, 5 V" }, settings: {},
};

describe("figures set against each other", () => {
  it("gives signed deltas (to − from) with fewer as better, worked by hand", () => {
    const to: Figures = {
      ...base, gates: 8, depth: 4, packages: 3, delayNs: 25.2, staticMw: 0.015, dynamicMw: null, maxLoad: 11,
      outputs: [{ name: "f", products: 2, literals: 4, exact: true }, { name: "g", products: 3, literals: 11, exact: false }, { name: "h", products: 1, literals: 1, exact: true }],
      byTypeWidth: [{ type: "AND", width: 2, count: 2 }, { type: "AND", width: 3, count: 1 }, { type: "OR", width: 3, count: 2 }, { type: "NOT", width: 1, count: 3 }],
      family: { id: "cmos-hc-5v", name: "High-speed CMOS, 5 V" }, settings: { form: "nand", fanIn: 2 }, exact: false,
    };
    const c = compareFigures(base, to);
    const row = (k: string) => c.figures.find((r) => r.key === k)!;
    expect(row("gates")).toMatchObject({ from: 10, to: 8, delta: -2, direction: "better" });
    expect(row("depth")).toMatchObject({ delta: 1, direction: "worse" });
    expect(row("packages")).toMatchObject({ delta: 0, direction: "same" });
    // 25.2 − 27.5 = −2.3 exactly, not the binary −2.3000000000000007
    expect(row("delayNs").delta).toBe(-2.3);
    expect(row("staticMw").delta).toBe(0.003);
    expect(row("dynamicMw")).toMatchObject({ delta: null, direction: "unknown" });
    // 11 unit loads against a limit of 10 is over: worse, whatever the share did before
    expect(c.load).toMatchObject({ delta: 7, direction: "worse", to: { load: 11, limit: 10, over: true }, from: { over: false } });
    expect(c.exact).toEqual({ from: true, to: false, direction: "worse" });
    expect(c.outputs).toEqual([
      { name: "f", from: base.outputs![0], to: to.outputs![0], delta: { products: 0, literals: -1 }, direction: "better" },
      { name: "g", from: base.outputs![1], to: to.outputs![1], delta: { products: -1, literals: 1 }, direction: "mixed" },
      { name: "h", from: null, to: to.outputs![2], delta: null, direction: "unknown" },
    ]);
    expect(c.family).toEqual({ from: base.family, to: to.family });
    expect(c.settings).toEqual([{ key: "form", from: undefined, to: "nand" }, { key: "fanIn", from: undefined, to: 2 }]);
    expect(c.netlist.rows).toEqual([
      { type: "AND", width: 2, from: 4, to: 2, added: 0, removed: 2 },
      { type: "AND", width: 3, from: 0, to: 1, added: 1, removed: 0 },
      { type: "NOT", width: 1, from: 4, to: 3, added: 0, removed: 1 },
      { type: "OR", width: 3, from: 2, to: 2, added: 0, removed: 0 },
    ]);
    expect(c.netlist).toMatchObject({ added: 1, removed: 3 });
  });

  it("a side set against itself changes nothing", () => {
    const c = compareFigures(base, base);
    expect(c.figures.every((r) => r.delta === 0 && r.direction === "same")).toBe(true);
    expect(c.family).toBeNull();
    expect(c.settings).toEqual([]);
    expect(c.netlist).toMatchObject({ added: 0, removed: 0 });
  });

  it("settings compare by value, in a fixed order, the family id apart", () => {
    expect(settingChanges({ fanOut: 4, form: "and-or", familyId: "x" }, { form: "nor", fanOut: 4, familyId: "y", heuristic: true })).toEqual([
      { key: "form", from: "and-or", to: "nor" },
      { key: "heuristic", from: undefined, to: true },
    ]);
  });

  it("gathers a run's figures from its stats and netlist: gate counts by width match the netlist's own gates", () => {
    const src = "inputs a, b, c, d\noutputs f, g\nf = a * b * c * d + a' * b'\ng = a * b * c * d + c * d'\n";
    const family = BUILT_IN_FAMILIES.find((x) => x.id === "ttl-std-5v")!;
    const r = compileNow({ source: src, family, settings: { fanIn: 2 } }).result!;
    const stats = r.stats as unknown as Record<string, unknown>;
    const f = figuresOf({ stats, netlist: r.document, family: { id: "ttl-std-5v", name: "TTL" }, settings: { fanIn: 2, familyId: "ttl-std-5v" } });
    expect(f.gates).toBe(r.model.gates.length);
    expect(f.byTypeWidth.reduce((s, t) => s + t.count, 0)).toBe(r.model.gates.length);
    // every gate fits fan-in 2 (NOT and BUF have one input)
    expect(Math.max(...f.byTypeWidth.map((t) => t.width))).toBeLessThanOrEqual(2);
    expect(f.outputs!.map((o) => o.name)).toEqual(["f", "g"]);
    expect(f.fanOut).toBe(r.analysis.loads[0]!.limit);
    expect(f.settings).toEqual({ fanIn: 2 });
    expect(countByTypeWidth(null)).toEqual([]);
  });

  it("rows saved before per-output figures and the limit were kept read as unknown, never as zero", () => {
    const f = figuresOf({ stats: { gates: 3, depth: 2, maxLoad: 2 }, netlist: null, family: { id: "x", name: "X" }, settings: {}, fanOutFallback: 8 });
    expect(f.outputs).toBeNull();
    expect(f.fanOut).toBe(8);
    expect(f.delayNs).toBeNull();
    expect(compareFigures(f, f).outputs).toBeNull();
    // Set against a side that did record them, its outputs read as not recorded rather than added.
    expect(compareFigures(f, base).outputsRecorded).toEqual({ from: false, to: true });
    expect(compareFigures(f, base).outputs!.every((o) => o.from === null && o.direction === "unknown")).toBe(true);
  });
});
