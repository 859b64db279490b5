import { describe, expect, it } from "vitest";
import { run } from "../../lib/cli/commands/minimize";

function io(source: string) {
  const out: string[] = [];
  const err: string[] = [];
  return {
    io: { readSource: () => source, out: (t: string) => void out.push(t), err: (t: string) => void err.push(t) },
    out,
    err,
  };
}

describe("minimize command", () => {
  it("prints the documented JSON", async () => {
    // Source: Wikipedia, "Quine–McCluskey algorithm" worked example — 3 products, 7 literals.
    const h = io("inputs a, b, c, d\noutputs f\nf = on(4, 8, 10, 11, 12, 15) dc(9, 14)\n");
    const code = await run(["design.fnb"], h.io);
    expect(code).toBe(0);
    const j = JSON.parse(h.out.join(""));
    expect(Object.keys(j)).toEqual(["inputs", "outputs", "shared", "ms"]);
    expect(j.inputs).toEqual(["a", "b", "c", "d"]);
    const f = j.outputs[0];
    expect(Object.keys(f)).toEqual(["name", "form", "cubes", "expression", "products", "literals", "exact", "lowerBound"]);
    expect(f.products).toBe(3);
    expect(f.literals).toBe(7);
    expect(f.cubes).toContain("-100");
  });

  it("takes --form pos and --cost fan-in=N", async () => {
    const h = io("inputs a, b\noutputs f\nf = a * b\n");
    expect(await run(["-", "--form", "pos", "--cost", "fan-in=2"], h.io)).toBe(0);
    const j = JSON.parse(h.out.join(""));
    // Hand computation: a*b as POS is (a) * (b).
    expect(j.outputs[0].expression).toBe("(a) * (b)");
    expect(j.outputs[0].form).toBe("pos");
  });

  it("language errors print the check JSON and exit 1", async () => {
    const h = io("inputs a\noutputs f\nf = q\n");
    expect(await run(["-"], h.io)).toBe(1);
    const j = JSON.parse(h.out.join(""));
    expect(j.ok).toBe(false);
    expect(j.diagnostics.length).toBeGreaterThan(0);
  });

  it("bad options exit 2 with usage", async () => {
    const h = io("");
    expect(await run(["-", "--cost", "cheap"], h.io)).toBe(2);
    expect(h.err.join("")).toContain("usage");
  });
});
