import type { Cube } from "../logic";

const utf8 = new TextEncoder();
const fromUtf8 = new TextDecoder();

/** A cover in the equation language: SOP `a * b' + c`, POS `(a + b') * (c)`; 0 and 1 for constants. */
export function formatCover(cubes: readonly Cube[], inputs: readonly string[], form: "sop" | "pos"): string {
  if (cubes.length === 0) return form === "sop" ? "0" : "1";
  for (let k = 0; k < cubes.length; k++) if (cubes[k]!.mask === 0) return form === "sop" ? "1" : "0";
  return cubes.length < 8192 ? formatAsStrings(cubes, inputs, form) : formatAsBytes(cubes, inputs, form);
}

/**
 * Covers up to a few thousand terms: strings, the pieces of each group of 4
 * inputs under one (mask, value) pattern built once (encoding bytes costs
 * more than it saves here).
 */
function formatAsStrings(cubes: readonly Cube[], inputs: readonly string[], form: "sop" | "pos"): string {
  const n = inputs.length;
  const inner = form === "sop" ? " * " : " + ";
  const groups = Math.ceil(n / 4);
  // Slot (g << 8) | (mask << 4) | value of group g: its literals, each after `inner` (piece) or the first without (lead).
  const piece: (string | undefined)[] = new Array<string | undefined>(groups << 8);
  const lead: string[] = new Array<string>(groups << 8);
  const terms: string[] = new Array<string>(cubes.length);
  for (let k = 0; k < cubes.length; k++) {
    const c = cubes[k]!;
    let t = "";
    for (let g = groups - 1; g >= 0; g--) {
      const slot = (g << 8) | (((c.mask >>> (4 * g)) & 15) << 4) | ((c.value >>> (4 * g)) & 15);
      let p = piece[slot];
      if (p === undefined) {
        const parts: string[] = [];
        // Declared order: higher bits first.
        for (let i = 3; i >= 0; i--) {
          const b = 4 * g + i;
          if (b < n && ((c.mask >>> b) & 1) === 1) parts.push((c.value >>> b) & 1 ? inputs[n - 1 - b]! : `${inputs[n - 1 - b]!}'`);
        }
        p = parts.length === 0 ? "" : inner + parts.join(inner);
        piece[slot] = p;
        lead[slot] = parts.join(inner);
      }
      if (p === "") continue;
      t += t === "" ? lead[slot]! : p;
    }
    terms[k] = form === "sop" ? t : `(${t})`;
  }
  return terms.join(form === "sop" ? " + " : " * ");
}

/**
 * Long covers: bytes, decoded once, because covers of tens of thousands of
 * terms make string concatenation the slow part. The inputs go in groups of 8;
 * the literals of a group under one (mask, value) pattern are encoded once
 * into a pool, and a term is the copy of its groups' pieces.
 */
function formatAsBytes(cubes: readonly Cube[], inputs: readonly string[], form: "sop" | "pos"): string {
  const n = inputs.length;
  const inner = utf8.encode(form === "sop" ? " * " : " + ");
  const outer = utf8.encode(form === "sop" ? " + " : " * ");
  const wrap = form === "pos";
  const G = 8;
  const ones = (1 << G) - 1;
  const groups = Math.ceil(n / G);
  // Literal of bit b (input n-1-b) after the `inner` separator: lit[2b] plain, lit[2b+1] complemented; encoded on first use.
  const lit: (Uint8Array | undefined)[] = new Array<Uint8Array | undefined>(2 * n);
  const literal = (b: number, plain: boolean): Uint8Array => {
    const hit = lit[2 * b + (plain ? 0 : 1)];
    if (hit) return hit;
    const bytes = utf8.encode(plain ? inputs[n - 1 - b]! : `${inputs[n - 1 - b]!}'`);
    const out = new Uint8Array(inner.length + bytes.length);
    out.set(inner, 0);
    out.set(bytes, inner.length);
    lit[2 * b + (plain ? 0 : 1)] = out;
    return out;
  };
  // Piece of group g under (mask m, value v): slot (g << 2G) | (m << G) | v, bytes pool[off .. off + len);
  // built on first use (len 0 until then: the table holds len + 1).
  const len1 = new Int32Array(groups << (2 * G));
  const off = new Int32Array(groups << (2 * G));
  let pool = new Uint8Array(1024);
  let used = 0;
  const build = (slot: number): number => {
    const g = slot >>> (2 * G);
    const m = (slot >>> G) & ones;
    const v = slot & ones;
    let at = used;
    // Declared order: higher bits first.
    for (let k = G - 1; k >= 0; k--) {
      const b = G * g + k;
      if (b >= n || !((m >>> k) & 1)) continue;
      const x = literal(b, ((v >>> k) & 1) === 1);
      if (at + x.length > pool.length) {
        const bigger = new Uint8Array(2 * (at + x.length));
        bigger.set(pool.subarray(0, at));
        pool = bigger;
      }
      pool.set(x, at);
      at += x.length;
    }
    off[slot] = used;
    len1[slot] = at - used + 1;
    used = at;
    return len1[slot]! - 1;
  };
  const slotOf = (c: Cube, g: number): number =>
    (g << (2 * G)) | (((c.mask >>> (G * g)) & ones) << G) | ((c.value >>> (G * g)) & ones);
  let size = 0;
  for (let k = 0; k < cubes.length; k++) {
    const c = cubes[k]!;
    size += outer.length + (wrap ? 2 : 0);
    for (let g = 0; g < groups; g++) {
      const slot = slotOf(c, g);
      const l = len1[slot]!;
      size += l > 0 ? l - 1 : build(slot);
    }
  }
  // The pool goes first in the buffer, so that long pieces are copied by copyWithin.
  const buf = new Uint8Array(used + size);
  buf.set(pool.subarray(0, used), 0);
  const begin = used;
  let p = begin;
  for (let k = 0; k < cubes.length; k++) {
    const c = cubes[k]!;
    if (k > 0) for (let q = 0; q < outer.length; q++) buf[p++] = outer[q]!;
    if (wrap) buf[p++] = 0x28;
    // The first literal of the term has no separator before it.
    let skip = inner.length;
    for (let g = groups - 1; g >= 0; g--) {
      const slot = slotOf(c, g);
      if (len1[slot] === 1) continue;
      const l = len1[slot]! - 1 - skip;
      const o = off[slot]! + skip;
      if (l > 24) {
        buf.copyWithin(p, o, o + l);
        p += l;
      } else {
        for (let q = o; q < o + l; q++) buf[p++] = buf[q]!;
      }
      skip = 0;
    }
    if (wrap) buf[p++] = 0x29;
  }
  return fromUtf8.decode(buf.subarray(begin, p));
}
