import type { Cube } from "../logic";

const utf8 = new TextEncoder();
const fromUtf8 = new TextDecoder();

/**
 * A cover in the equation language: SOP `a * b' + c`, POS `(a + b') * (c)`;
 * 0 and 1 for constants. Written as bytes and decoded once, because covers of
 * tens of thousands of terms make string concatenation the slow part; the
 * literals of each group of 4 inputs come from a table of their 256 patterns.
 */
export function formatCover(cubes: readonly Cube[], inputs: readonly string[], form: "sop" | "pos"): string {
  const n = inputs.length;
  if (cubes.length === 0) return form === "sop" ? "0" : "1";
  if (cubes.some((c) => c.mask === 0)) return form === "sop" ? "1" : "0";
  const inner = utf8.encode(form === "sop" ? " * " : " + ");
  const outer = utf8.encode(form === "sop" ? " + " : " * ");
  const wrap = form === "pos";
  // Group g holds bits 4g .. 4g+3 (bit b is input n-1-b); chunk(g, mask·16 + value) lists its literals,
  // each after `inner`, built on first use from the literals encoded once.
  const lit = (b: number, one: boolean): Uint8Array => {
    const name = inputs[n - 1 - b]!;
    const bytes = utf8.encode(one ? name : `${name}'`);
    const out = new Uint8Array(inner.length + bytes.length);
    out.set(inner, 0);
    out.set(bytes, inner.length);
    return out;
  };
  const plain = Array.from({ length: n }, (_, b) => lit(b, true));
  const inverted = Array.from({ length: n }, (_, b) => lit(b, false));
  const groups = Math.ceil(n / 4);
  const tables: (Uint8Array | undefined)[][] = Array.from({ length: groups }, () => new Array<Uint8Array | undefined>(256));
  const chunk = (g: number, idx: number): Uint8Array => {
    const hit = tables[g]![idx];
    if (hit) return hit;
    const m = idx >>> 4;
    const v = idx & 15;
    const parts: Uint8Array[] = [];
    let len = 0;
    // Declared order: higher bits first.
    for (let k = 3; k >= 0; k--) {
      const b = 4 * g + k;
      if (b >= n || !((m >>> k) & 1)) continue;
      const bytes = (v >>> k) & 1 ? plain[b]! : inverted[b]!;
      parts.push(bytes);
      len += bytes.length;
    }
    const out = new Uint8Array(len);
    let at = 0;
    for (const x of parts) {
      out.set(x, at);
      at += x.length;
    }
    tables[g]![idx] = out;
    return out;
  };
  let size = 0;
  for (const c of cubes) {
    size += outer.length + (wrap ? 2 : 0);
    for (let g = 0; g < groups; g++) size += chunk(g, (((c.mask >>> (4 * g)) & 15) << 4) | ((c.value >>> (4 * g)) & 15)).length;
  }
  const buf = new Uint8Array(size);
  let p = 0;
  for (let k = 0; k < cubes.length; k++) {
    const c = cubes[k]!;
    if (k > 0) for (let q = 0; q < outer.length; q++) buf[p++] = outer[q]!;
    if (wrap) buf[p++] = 0x28;
    // The first literal of the term has no separator before it.
    let skip = inner.length;
    for (let g = groups - 1; g >= 0; g--) {
      const b = chunk(g, (((c.mask >>> (4 * g)) & 15) << 4) | ((c.value >>> (4 * g)) & 15));
      if (b.length === 0) continue;
      for (let q = skip; q < b.length; q++) buf[p++] = b[q]!;
      skip = 0;
    }
    if (wrap) buf[p++] = 0x29;
  }
  return fromUtf8.decode(buf.subarray(0, p));
}
