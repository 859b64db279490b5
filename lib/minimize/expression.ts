import type { Cube } from "../logic";

/** A cover in the equation language: SOP `a * b' + c`, POS `(a + b') * (c)`; 0 and 1 for constants. */
export function formatCover(cubes: readonly Cube[], inputs: readonly string[], form: "sop" | "pos"): string {
  const n = inputs.length;
  const plain = inputs.slice();
  const inverted = inputs.map((x) => `${x}'`);
  const inner = form === "sop" ? " * " : " + ";
  const term = (c: Cube): string => {
    let s = "";
    for (let i = 0; i < n; i++) {
      const bit = 1 << (n - 1 - i);
      if (c.mask & bit) s += (s ? inner : "") + (c.value & bit ? plain[i]! : inverted[i]!);
    }
    return s;
  };
  if (form === "sop") {
    if (cubes.length === 0) return "0";
    if (cubes.some((c) => c.mask === 0)) return "1";
    return cubes.map(term).join(" + ");
  }
  if (cubes.length === 0) return "1";
  if (cubes.some((c) => c.mask === 0)) return "0";
  return cubes.map((c) => `(${term(c)})`).join(" * ");
}
