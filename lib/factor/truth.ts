/**
 * Truth tables of functions of n ≤ TRUTH_TABLE_MAX_INPUTS inputs, one bit
 * per minterm (first input = most significant bit of the minterm index), 32
 * minterms a word: cofactors, complements, equality and a hash, as the
 * functional decomposition needs them. A cofactor f|x=v is kept as a
 * function over all n inputs (it no longer depends on x).
 */
import type { Cube } from "../logic/index";
import { tableFromCubes } from "../logic/index";

/** In-word minterm patterns of the five lowest minterm bits (bit p of the index set). */
const LOW = [0xaaaaaaaa, 0xcccccccc, 0xf0f0f0f0, 0xff00ff00, 0xffff0000];

export class TableSpace {
  readonly n: number;
  readonly words: number;
  /** The bits of the last (only) word that are minterms, when n < 5. */
  readonly valid: number;
  constructor(n: number) {
    this.n = n;
    this.words = Math.max(1, 2 ** n / 32);
    this.valid = n >= 5 ? 0xffffffff : (2 ** (2 ** n) - 1) >>> 0;
  }

  zero(): Uint32Array {
    return new Uint32Array(this.words);
  }

  one(): Uint32Array {
    const t = new Uint32Array(this.words).fill(0xffffffff);
    t[0] = t[0]! & this.valid;
    return t;
  }

  /** The table of input i (first input = most significant bit). */
  input(i: number): Uint32Array {
    const p = this.n - 1 - i;
    const t = new Uint32Array(this.words);
    if (p < 5) t.fill(LOW[p]! & this.valid);
    else for (let w = 0; w < this.words; w++) t[w] = (w >>> (p - 5)) & 1 ? 0xffffffff : 0;
    return t;
  }

  fromCubes(cubes: readonly Cube[]): Uint32Array {
    return tableFromCubes(cubes, this.n);
  }

  not(t: Uint32Array): Uint32Array {
    const r = new Uint32Array(this.words);
    for (let w = 0; w < this.words; w++) r[w] = ~t[w]!;
    r[0] = r[0]! & this.valid;
    if (this.words === 1) r[0] = r[0]! >>> 0;
    return r;
  }

  /** f|x_i=v as a function over all n inputs. */
  cofactor(t: Uint32Array, i: number, v: 0 | 1): Uint32Array {
    const p = this.n - 1 - i;
    const r = new Uint32Array(this.words);
    if (p < 5) {
      const s = 1 << p;
      const m = LOW[p]!;
      for (let w = 0; w < this.words; w++) {
        const x = t[w]!;
        r[w] = v ? (x & m) | ((x & m) >>> s) : (x & ~m) | ((x & ~m) << s);
      }
      r[0] = r[0]! & this.valid;
    } else {
      const stride = 1 << (p - 5);
      for (let base = 0; base < this.words; base += 2 * stride) {
        const from = base + (v ? stride : 0);
        for (let k = 0; k < stride; k++) {
          r[base + k] = t[from + k]!;
          r[base + stride + k] = t[from + k]!;
        }
      }
    }
    return r;
  }

  equal(a: Uint32Array, b: Uint32Array): boolean {
    for (let w = 0; w < this.words; w++) if (a[w] !== b[w]) return false;
    return true;
  }

  /** a = ¬b */
  complementary(a: Uint32Array, b: Uint32Array): boolean {
    for (let w = 0; w < this.words; w++) if (((a[w]! ^ b[w]!) >>> 0) !== (w === 0 ? this.valid : 0xffffffff)) return false;
    return true;
  }

  isZero(t: Uint32Array): boolean {
    for (let w = 0; w < this.words; w++) if (t[w] !== 0) return false;
    return true;
  }

  isOne(t: Uint32Array): boolean {
    for (let w = 0; w < this.words; w++) if (t[w] !== (w === 0 ? this.valid : 0xffffffff)) return false;
    return true;
  }

  /** Whether f depends on input i. */
  depends(t: Uint32Array, i: number): boolean {
    return !this.equal(this.cofactor(t, i, 0), this.cofactor(t, i, 1));
  }

  /** Inputs the function depends on, ascending. */
  support(t: Uint32Array): number[] {
    const out: number[] = [];
    for (let i = 0; i < this.n; i++) if (this.depends(t, i)) out.push(i);
    return out;
  }

  /** Value at minterm m. */
  get(t: Uint32Array, m: number): boolean {
    return ((t[m >>> 5]! >>> (m & 31)) & 1) === 1;
  }

  /** 32-bit FNV-1a of the words; equal tables hash alike. */
  hash(t: Uint32Array): number {
    let h = 0x811c9dc5;
    for (let w = 0; w < this.words; w++) {
      h = Math.imul(h ^ (t[w]! & 0xffff), 0x01000193);
      h = Math.imul(h ^ (t[w]! >>> 16), 0x01000193);
    }
    return h >>> 0;
  }

  and(a: Uint32Array, b: Uint32Array): Uint32Array {
    const r = new Uint32Array(this.words);
    for (let w = 0; w < this.words; w++) r[w] = a[w]! & b[w]!;
    return r;
  }

  or(a: Uint32Array, b: Uint32Array): Uint32Array {
    const r = new Uint32Array(this.words);
    for (let w = 0; w < this.words; w++) r[w] = a[w]! | b[w]!;
    return r;
  }

  xor(a: Uint32Array, b: Uint32Array): Uint32Array {
    const r = new Uint32Array(this.words);
    for (let w = 0; w < this.words; w++) r[w] = a[w]! ^ b[w]!;
    return r;
  }
}
