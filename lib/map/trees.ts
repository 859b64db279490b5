/**
 * Tree shapes: fan-in trees built by merging the earliest signals first, and
 * fan-out buffer trees with the fewest buffers.
 */

/** Levels of a balanced k-ary tree over n inputs: ceil(log_k n) (0 when n ≤ 1). */
export function treeLevels(n: number, k: number): number {
  let levels = 0;
  let reach = 1;
  while (reach < n) {
    reach *= k;
    levels++;
  }
  return levels;
}

/** Gates of a k-ary tree over n inputs: ceil((n − 1) / (k − 1)) (0 when n ≤ 1). */
export function treeGates(n: number, k: number): number {
  return n <= 1 ? 0 : Math.ceil((n - 1) / (k - 1));
}

export type Group<T> = { leaf: T; arrival: number } | { kids: Group<T>[]; arrival: number };

/**
 * Groups n signals into gates of at most k inputs, merging the earliest
 * signals first so that a late signal enters near the root. The first merge
 * takes 2 + ((n − 2) mod (k − 1)) inputs, every later one k, which gives
 * ceil((n − 1) / (k − 1)) gates and, for equal arrivals, ceil(log_k n) levels.
 * Each merge arrives one level after its latest input. Returns the root group
 * (a leaf when n = 1).
 */
export function mergeByArrival<T>(items: { item: T; arrival: number }[], k: number): Group<T> {
  if (items.length === 0) throw new Error("mergeByArrival needs at least one signal");
  if (k < 2) throw new Error(`a gate tree needs gates of at least 2 inputs; the widest is ${k}`);
  // A binary heap ordered by arrival, then by entry order (original position, then merge order), so the
  // earliest signals come out first and results are deterministic; n log n for the whole tree.
  const heap = new MergeHeap<Group<T>>();
  items.forEach((x, i) => heap.push({ leaf: x.item, arrival: x.arrival }, x.arrival, i));
  let seq = items.length;
  let take = heap.size <= k ? heap.size : 2 + ((heap.size - 2) % (k - 1));
  while (heap.size > 1) {
    const kids: Group<T>[] = [];
    let latest = -Infinity;
    for (let j = 0; j < take; j++) {
      const g = heap.pop();
      kids.push(g);
      if (g.arrival > latest) latest = g.arrival;
    }
    const arrival = latest + 1;
    heap.push({ kids, arrival }, arrival, seq++);
    take = Math.min(k, heap.size);
  }
  return heap.pop();
}

/** Min-heap of values keyed by (arrival, seq). */
class MergeHeap<V> {
  private vals: V[] = [];
  private arr: number[] = [];
  private seq: number[] = [];
  get size(): number {
    return this.vals.length;
  }
  private less(i: number, j: number): boolean {
    return this.arr[i]! < this.arr[j]! || (this.arr[i] === this.arr[j] && this.seq[i]! < this.seq[j]!);
  }
  private swap(i: number, j: number): void {
    [this.vals[i], this.vals[j]] = [this.vals[j]!, this.vals[i]!];
    [this.arr[i], this.arr[j]] = [this.arr[j]!, this.arr[i]!];
    [this.seq[i], this.seq[j]] = [this.seq[j]!, this.seq[i]!];
  }
  push(v: V, arrival: number, seq: number): void {
    this.vals.push(v);
    this.arr.push(arrival);
    this.seq.push(seq);
    for (let i = this.vals.length - 1; i > 0; ) {
      const p = (i - 1) >> 1;
      if (!this.less(i, p)) break;
      this.swap(i, p);
      i = p;
    }
  }
  pop(): V {
    const top = this.vals[0]!;
    const last = this.vals.length - 1;
    this.swap(0, last);
    this.vals.pop();
    this.arr.pop();
    this.seq.pop();
    for (let i = 0; ; ) {
      const l = 2 * i + 1;
      const r = l + 1;
      let m = i;
      if (l < last && this.less(l, m)) m = l;
      if (r < last && this.less(r, m)) m = r;
      if (m === i) break;
      this.swap(i, m);
      i = m;
    }
    return top;
  }
}

export interface BufferNode {
  /** Parent: -1 for the driver, else the index of another buffer. */
  parent: number;
  depth: number;
}

export interface BufferPlan {
  buffers: BufferNode[];
  /** For each load (in the order given), -1 for the driver or the index of the buffer that feeds it. */
  assignment: number[];
  /** Buffer levels between the driver and the deepest load. */
  levels: number;
}

/** Fewest buffers for L unit loads on a driver of fan-out F: ceil((L − F) / (F − 1)), 0 when L ≤ F. */
export function bufferCount(loads: number, fanOut: number): number {
  if (loads <= fanOut) return 0;
  return Math.ceil((loads - fanOut) / (fanOut - 1));
}

/**
 * Plans a buffer tree for one net. `loads` are the loads' weights in unit
 * loads with a criticality (higher = on a longer path); `pinned` loads stay
 * on the driver whatever it costs. Buffers are placed breadth first (each a
 * unit load on its parent), and the most critical loads take the shallowest
 * free places, so the critical loads hang from the shallowest level.
 */
export function planBufferTree(
  loads: { weight: number; criticality: number; pinned?: boolean }[],
  fanOut: number,
): BufferPlan {
  if (fanOut < 2) throw new Error(`fan-out ${fanOut} cannot be met with buffers: a buffer must drive at least 2 loads`);
  const total = loads.reduce((s, l) => s + l.weight, 0);
  if (total <= fanOut + 1e-9) return { buffers: [], assignment: loads.map(() => -1), levels: 0 };
  const pinnedWeight = loads.filter((l) => l.pinned).reduce((s, l) => s + l.weight, 0);
  const order = loads
    .map((l, i) => ({ ...l, i }))
    .filter((l) => !l.pinned)
    .sort((a, b) => b.criticality - a.criticality || a.i - b.i);
  for (let b = Math.max(1, bufferCount(Math.ceil(total - 1e-9), fanOut)); ; b++) {
    // capacity left at each node: index 0 = driver, 1.. = buffers
    const cap: number[] = [fanOut - pinnedWeight];
    const depth: number[] = [0];
    const buffers: BufferNode[] = [];
    let parent = 0;
    while (buffers.length < b && parent <= buffers.length) {
      if (cap[parent]! >= 1) {
        cap[parent]! -= 1;
        buffers.push({ parent: parent - 1, depth: depth[parent]! + 1 });
        cap.push(fanOut);
        depth.push(depth[parent]! + 1);
      } else parent++;
    }
    if (buffers.length < b) {
      throw new Error(`fan-out ${fanOut} leaves no room for buffers after ${pinnedWeight} unit loads of output pins`);
    }
    // Nodes shallowest first (breadth-first placement already gives that order); each load takes the first
    // node with room, found through a max-tree over the remaining capacities in O(log nodes).
    const nodes = cap.map((_, i) => i).sort((x, y) => depth[x]! - depth[y]! || x - y);
    const room = new FirstFit(nodes.map((x) => cap[x]!));
    const assignment: number[] = loads.map((l) => (l.pinned ? -1 : -2));
    let ok = true;
    for (const l of order) {
      const slot = room.first(l.weight - 1e-9);
      if (slot < 0) {
        ok = false;
        break;
      }
      room.take(slot, l.weight);
      assignment[l.i] = nodes[slot]! - 1;
    }
    if (!ok) continue;
    let levels = 0;
    for (const a of assignment) if (a >= 0 && buffers[a]!.depth > levels) levels = buffers[a]!.depth;
    return { buffers, assignment, levels };
  }
}

/** Capacities with "first index holding at least w" and "use w of index i", both O(log n) (a max segment tree). */
class FirstFit {
  private size = 1;
  private t: Float64Array;
  constructor(caps: number[]) {
    while (this.size < caps.length) this.size *= 2;
    this.t = new Float64Array(2 * this.size).fill(-Infinity);
    caps.forEach((c, i) => (this.t[this.size + i] = c));
    for (let i = this.size - 1; i >= 1; i--) this.t[i] = Math.max(this.t[2 * i]!, this.t[2 * i + 1]!);
  }
  /** First index whose capacity is at least w, or −1. */
  first(w: number): number {
    if (this.t[1]! < w) return -1;
    let i = 1;
    while (i < this.size) i = this.t[2 * i]! >= w ? 2 * i : 2 * i + 1;
    return i - this.size;
  }
  take(index: number, w: number): void {
    let i = this.size + index;
    this.t[i] = this.t[i]! - w;
    for (i >>= 1; i >= 1; i >>= 1) this.t[i] = Math.max(this.t[2 * i]!, this.t[2 * i + 1]!);
  }
}
