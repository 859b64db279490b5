import type { Cube } from "../logic";

const utf8 = new TextEncoder();
const fromUtf8 = new TextDecoder();

/**
 * A cover in the equation language: SOP `a * b' + c`, POS `(a + b') * (c)`;
 * 0 and 1 for constants. Written as bytes and decoded once, because covers of
 * tens of thousands of terms make string concatenation the slow part.
 */
export function formatCover(cubes: readonly Cube[], inputs: readonly string[], form: "sop" | "pos"): string {
  const n = inputs.length;
  if (cubes.length === 0) return form === "sop" ? "0" : "1";
  if (cubes.some((c) => c.mask === 0)) return form === "sop" ? "1" : "0";
  const plain = inputs.map((x) => utf8.encode(x));
  const inverted = inputs.map((x) => utf8.encode(`${x}'`));
  const inner = utf8.encode(form === "sop" ? " * " : " + ");
  const outer = utf8.encode(form === "sop" ? " + " : " * ");
  const wrap = form === "pos";
  let size = 0;
  for (const c of cubes) {
    size += outer.length + (wrap ? 2 : 0);
    for (let i = 0; i < n; i++) {
      const bit = 1 << (n - 1 - i);
      if (c.mask & bit) size += inner.length + (c.value & bit ? plain[i]! : inverted[i]!).length;
    }
  }
  const buf = new Uint8Array(size);
  let p = 0;
  const put = (b: Uint8Array) => {
    for (let q = 0; q < b.length; q++) buf[p++] = b[q]!;
  };
  for (let k = 0; k < cubes.length; k++) {
    const c = cubes[k]!;
    if (k > 0) put(outer);
    if (wrap) buf[p++] = 0x28;
    let first = true;
    for (let i = 0; i < n; i++) {
      const bit = 1 << (n - 1 - i);
      if (!(c.mask & bit)) continue;
      if (!first) put(inner);
      first = false;
      put(c.value & bit ? plain[i]! : inverted[i]!);
    }
    if (wrap) buf[p++] = 0x29;
  }
  return fromUtf8.decode(buf.subarray(0, p));
}
