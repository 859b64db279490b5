/**
 * Algebraic factoring of sums of products, after Brayton & McMullen 1982,
 * "The decomposition and factorization of Boolean expressions", and the
 * multi-level system of Brayton, Rudell, Sangiovanni-Vincentelli & Wang
 * 1987, "MIS: a multiple-level logic optimization system". Expressions are
 * treated as polynomials: a literal and its complement are unrelated
 * symbols, and x·x = x.
 *
 * - Weak (algebraic) division F / D: the quotient Q is the largest set of
 *   cubes with Q·D ⊆ F (the cubes that, multiplied by every cube of D, land
 *   in F); the remainder R is F − Q·D, so F = Q·D + R.
 * - Kernels: the cube-free quotients of F by a cube (its co-kernel). They are
 *   enumerated recursively, dividing by the largest cube common to the cubes
 *   that hold a literal, and skipping a cube that holds an earlier literal (it
 *   was reached already). Two expressions share a multiple-cube divisor only
 *   if their kernels intersect, so kernels are the candidates for division.
 * - Extraction: across every node of the network, the kernel or the common
 *   cube whose extraction saves the most literals becomes a new node, and
 *   every node it divides is rewritten as Q·node + R; repeated while a
 *   candidate saves literals.
 * - Factoring: each node is factored recursively by its best kernel as
 *   divisor (F = factor(Q)·factor(D) + factor(R)), by its most frequent
 *   literal when it has no kernel but itself, and an exclusive-or shaped
 *   pair of cubes (x·y' + x'·y) becomes an XOR.
 *
 * Literals are numbers 2·v + (1 when complemented); cubes are ascending
 * literal lists; a node is a list of cubes. Variables 0 … n − 1 are the
 * inputs, n + k the k-th node of the network.
 */

export type Cube = number[];
export type Sop = Cube[];

export type FExpr =
  | { kind: "const"; value: boolean }
  | { kind: "lit"; lit: number }
  | { kind: "and" | "or" | "xor"; args: FExpr[] }
  | { kind: "not"; arg: FExpr };

const key = (c: Cube) => c.join(",");
const lits = (f: Sop) => f.reduce((s, c) => s + c.length, 0);

/** Whether cube a holds every literal of cube b (both ascending). */
function contains(a: Cube, b: Cube): boolean {
  let i = 0;
  for (const l of b) {
    while (i < a.length && a[i]! < l) i++;
    if (i === a.length || a[i] !== l) return false;
    i++;
  }
  return true;
}

/** a without the literals of b (b ⊆ a). */
function without(a: Cube, b: Cube): Cube {
  return a.filter((l) => !b.includes(l));
}

/** a · b, or null when they hold complementary literals. */
function times(a: Cube, b: Cube): Cube | null {
  const out: number[] = [];
  let i = 0;
  let j = 0;
  while (i < a.length || j < b.length) {
    const x = i < a.length ? a[i]! : Infinity;
    const y = j < b.length ? b[j]! : Infinity;
    if (x === y) {
      out.push(x);
      i++;
      j++;
    } else if (x < y) {
      out.push(x);
      i++;
    } else {
      out.push(y);
      j++;
    }
  }
  for (let k = 1; k < out.length; k++) if (out[k]! >>> 1 === out[k - 1]! >>> 1) return null;
  return out;
}

/** The literals common to every cube. */
export function commonCube(f: Sop): Cube {
  if (f.length === 0) return [];
  let c = f[0]!;
  for (let k = 1; k < f.length && c.length; k++) c = c.filter((l) => f[k]!.includes(l));
  return c;
}

/** Weak division F = Q·D + R. */
export function divide(f: Sop, d: Sop): { q: Sop; r: Sop } {
  if (d.length === 0) return { q: [], r: f };
  let q: Map<string, Cube> | null = null;
  for (const dc of d) {
    const part = new Map<string, Cube>();
    for (const c of f) {
      if (contains(c, dc)) {
        const x = without(c, dc);
        part.set(key(x), x);
      }
    }
    if (q === null) q = part;
    else for (const k of [...q.keys()]) if (!part.has(k)) q.delete(k);
    if (q.size === 0) return { q: [], r: f };
  }
  const quotient = [...q!.values()];
  const used = new Set<string>();
  for (const a of quotient) for (const b of d) {
    const p = times(a, b);
    if (p) used.add(key(p));
  }
  return { q: quotient, r: f.filter((c) => !used.has(key(c))) };
}

/** F divided by a single cube: the cubes holding it, with it removed. */
function divideCube(f: Sop, c: Cube): Sop {
  return f.filter((x) => contains(x, c)).map((x) => without(x, c));
}

/**
 * The kernels of F (cube-free quotients by a cube, F itself included when it
 * is cube-free and has two or more cubes), at most `limit` of them.
 */
export function kernels(f: Sop, limit = 200): Sop[] {
  const out: Sop[] = [];
  const seen = new Set<string>();
  const cc = commonCube(f);
  const g0 = cc.length ? divideCube(f, cc) : f;
  const rec = (g: Sop, from: number) => {
    if (out.length >= limit) return;
    const counts = new Map<number, number>();
    for (const c of g) for (const l of c) counts.set(l, (counts.get(l) ?? 0) + 1);
    const order = [...counts.keys()].filter((l) => counts.get(l)! >= 2).sort((a, b) => a - b);
    for (const l of order) {
      if (l < from) continue;
      const holding = g.filter((c) => c.includes(l));
      const c = commonCube(holding);
      if (c.some((x) => x < l && counts.get(x)! >= 2)) continue;
      rec(divideCube(g, c), l + 1);
      if (out.length >= limit) return;
    }
    if (g.length >= 2) {
      const k = g.map(key).sort().join("|");
      if (!seen.has(k)) {
        seen.add(k);
        out.push(g);
      }
    }
  };
  rec(g0, 0);
  return out;
}

/** Literals saved in F by rewriting it as Q·v + R with one new literal v for the divisor. */
function gain(f: Sop, d: Sop): { gain: number; q: Sop; r: Sop } {
  const { q, r } = divide(f, d);
  if (q.length === 0) return { gain: 0, q, r };
  return { gain: lits(f) - (lits(r) + lits(q) + q.length), q, r };
}

export interface ExtractOptions {
  /** Nodes above this many cubes are not searched for kernels. Default 60. */
  maxCubes?: number;
  /** Kernels enumerated per node. Default 100. */
  kernelLimit?: number;
  /** Extractions at most. Default 200. */
  maxSteps?: number;
}

/**
 * Greedy extraction over the network's nodes (variables from n on): each
 * step adds the kernel or common cube that saves the most literals as a new
 * node, and rewrites every node it divides. Returns the nodes (the given
 * ones first, then the extracted ones).
 */
export function extract(n: number, nodes: Sop[], options: ExtractOptions = {}): Sop[] {
  const maxCubes = options.maxCubes ?? 60;
  const limit = options.kernelLimit ?? 100;
  const all = nodes.map((f) => f.map((c) => c.slice()));
  // Nodes of more cubes than maxCubes take no part: they are factored on their own.
  const eligible = (f: Sop) => f.length <= maxCubes;
  // kernels of a node, kept until the node changes
  const kernelCache = new Map<string, Sop[]>();
  const kernelsOf = (f: Sop) => {
    const k = f.map(key).join("|");
    let ks = kernelCache.get(k);
    if (!ks) {
      ks = kernels(f, limit);
      kernelCache.set(k, ks);
    }
    return ks;
  };
  for (let step = 0; step < (options.maxSteps ?? 200); step++) {
    let best: { value: number; divisor: Sop; cube: boolean } | null = null;
    // multiple-cube divisors: the kernels of every node; a kernel can divide a node only if the node holds all its literals
    const litsOf = all.map((f) => new Set(f.flat()));
    const cands = new Map<string, Sop>();
    for (const f of all) {
      if (f.length < 2 || !eligible(f)) continue;
      for (const k of kernelsOf(f)) cands.set(k.map(key).sort().join("|"), k);
    }
    for (const k of cands.values()) {
      const need = [...new Set(k.flat())];
      let value = -lits(k);
      let divides = 0;
      all.forEach((f, i) => {
        if (!eligible(f) || f.length < 2 || !need.every((l) => litsOf[i]!.has(l))) return;
        const g = gain(f, k).gain;
        if (g > 0) {
          value += g;
          divides++;
        }
      });
      // a kernel that divides one node only still saves literals there
      if (divides >= 1 && value > 0 && (!best || value > best.value)) best = { value, divisor: k, cube: false };
    }
    // single-cube divisors: cubes of two or more literals common to two or more cubes; the cubes holding a
    // candidate are counted through one bit set per literal
    const cubes: Cube[] = [];
    const owner: number[] = [];
    all.forEach((f, i) => {
      if (eligible(f)) for (const c of f) if (c.length >= 2) {
        cubes.push(c);
        owner.push(i);
      }
    });
    // pairs of literals, counted in every cube (cheap at any size)
    const pairs = new Map<string, { c: Cube; occ: number; nodes: Set<number> }>();
    cubes.forEach((c, at) => {
      for (let i = 0; i < c.length; i++) {
        for (let j = i + 1; j < c.length; j++) {
          const k = `${c[i]},${c[j]}`;
          const hit = pairs.get(k);
          if (hit) {
            hit.occ++;
            hit.nodes.add(owner[at]!);
          } else pairs.set(k, { c: [c[i]!, c[j]!], occ: 1, nodes: new Set([owner[at]!]) });
        }
      }
    });
    for (const { c, occ, nodes: in_ } of pairs.values()) {
      const value = occ - 2;
      if (in_.size >= 2 && value > 0 && (!best || value > best.value)) best = { value, divisor: [c], cube: true };
    }
    // larger cubes: the intersections of pairs of cubes, while there are few enough cubes to pair
    if (cubes.length <= 300) {
      const words = Math.ceil(cubes.length / 32);
      const holders = new Map<number, Uint32Array>();
      cubes.forEach((c, i) => {
        for (const l of c) {
          let b = holders.get(l);
          if (!b) holders.set(l, (b = new Uint32Array(words)));
          b[i >>> 5]! |= 1 << (i & 31);
        }
      });
      const occurrences = (c: Cube) => {
        let total = 0;
        const first = holders.get(c[0]!)!;
        for (let w = 0; w < words; w++) {
          let x = first[w]!;
          for (let j = 1; j < c.length && x; j++) x &= holders.get(c[j]!)![w]!;
          total += popcount32(x);
        }
        return total;
      };
      const seen = new Set<string>();
      for (let i = 0; i < cubes.length; i++) {
        for (let j = i + 1; j < cubes.length; j++) {
          // two-literal cubes were counted above
          const c = intersect(cubes[i]!, cubes[j]!);
          if (c.length < 3) continue;
          const k = key(c);
          if (seen.has(k)) continue;
          seen.add(k);
          if (owner[i] === owner[j] && occurrences(c) === 2) continue;
          const occ = occurrences(c);
          const value = occ * (c.length - 1) - c.length;
          if (value > 0 && (!best || value > best.value)) best = { value, divisor: [c], cube: true };
        }
      }
    }
    if (!best) break;
    const v = n + all.length;
    const lit = 2 * v;
    for (let i = 0; i < all.length; i++) {
      const f = all[i]!;
      if (!eligible(f)) continue;
      if (best.cube) {
        const c = best.divisor[0]!;
        if (f.some((x) => contains(x, c))) all[i] = f.map((x) => (contains(x, c) ? [...without(x, c), lit].sort((a, b) => a - b) : x));
      } else if (f.length >= 2) {
        const g = gain(f, best.divisor);
        if (g.gain > 0) all[i] = [...g.q.map((q) => [...q, lit].sort((a, b) => a - b)), ...g.r];
      }
    }
    all.push(best.divisor);
  }
  return all;
}

/** Literals common to two ascending cubes. */
function intersect(a: Cube, b: Cube): Cube {
  const out: number[] = [];
  let i = 0;
  let j = 0;
  while (i < a.length && j < b.length) {
    if (a[i] === b[j]) {
      out.push(a[i]!);
      i++;
      j++;
    } else if (a[i]! < b[j]!) i++;
    else j++;
  }
  return out;
}

function popcount32(x: number): number {
  x -= (x >>> 1) & 0x55555555;
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
  return (Math.imul((x + (x >>> 4)) & 0x0f0f0f0f, 0x01010101) >>> 24) & 0xff;
}

/** Nodes of more cubes are left as sums of products by {@link factor}: their factoring costs more than it finds. */
export const FACTOR_MAX_CUBES = 2000;

/** Factored form of one node (see the file's notes). */
export function factor(f: Sop, limit = 100): FExpr {
  if (f.length === 0) return { kind: "const", value: false };
  if (f.some((c) => c.length === 0)) return { kind: "const", value: true };
  if (f.length === 1) return product(f[0]!);
  if (f.length > FACTOR_MAX_CUBES) return { kind: "or", args: f.map(product) };
  const cc = commonCube(f);
  if (cc.length) {
    const rest = factor(divideCube(f, cc), limit);
    return { kind: "and", args: [...cc.map(literal), rest] };
  }
  const x = xorShape(f);
  if (x) return x;
  // the kernel that saves the most literals, other than F itself
  let best: { gain: number; d: Sop; q: Sop; r: Sop } | null = null;
  if (f.length <= 200) {
    for (const k of kernels(f, limit)) {
      if (k.length === f.length) continue;
      const g = gain(f, k);
      if (g.q.length && (!best || g.gain > best.gain)) best = { gain: g.gain, d: k, q: g.q, r: g.r };
    }
  }
  if (best && best.gain > 0) {
    const product2: FExpr = { kind: "and", args: [factor(best.q, limit), factor(best.d, limit)] };
    return best.r.length ? { kind: "or", args: [product2, factor(best.r, limit)] } : product2;
  }
  // the most frequent literal, when it is in two or more cubes
  const counts = new Map<number, number>();
  for (const c of f) for (const l of c) counts.set(l, (counts.get(l) ?? 0) + 1);
  let top = -1;
  for (const [l, k] of counts) if (k >= 2 && (top < 0 || k > counts.get(top)! || (k === counts.get(top) && l < top))) top = l;
  if (top >= 0) {
    const q = divideCube(f, [top]);
    const r = f.filter((c) => !c.includes(top));
    const t: FExpr = { kind: "and", args: [literal(top), factor(q, limit)] };
    return r.length ? { kind: "or", args: [t, factor(r, limit)] } : t;
  }
  return { kind: "or", args: f.map(product) };
}

function literal(l: number): FExpr {
  return { kind: "lit", lit: l };
}

function product(c: Cube): FExpr {
  return c.length === 1 ? literal(c[0]!) : { kind: "and", args: c.map(literal) };
}

/** x·y' + x'·y → XOR(x, y); x·y + x'·y' → XNOR(x, y). */
function xorShape(f: Sop): FExpr | null {
  if (f.length !== 2 || f[0]!.length !== 2 || f[1]!.length !== 2) return null;
  const [a, b] = f as [Cube, Cube];
  const va = a.map((l) => l >>> 1);
  const vb = b.map((l) => l >>> 1);
  if (va[0] !== vb[0] || va[1] !== vb[1]) return null;
  if (a[0] === b[0] || a[1] === b[1]) return null;
  const x = literal(2 * va[0]!);
  const y = literal(2 * va[1]!);
  // parity of complemented literals in a cube: odd → XOR, even → XNOR
  const odd = ((a[0]! & 1) ^ (a[1]! & 1)) === 1;
  const e: FExpr = { kind: "xor", args: [x, y] };
  return odd ? e : { kind: "not", arg: e };
}
