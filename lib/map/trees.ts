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
  // Stable order: by arrival, then by original position, so results are deterministic.
  let queue: { g: Group<T>; seq: number }[] = items.map((x, i) => ({ g: { leaf: x.item, arrival: x.arrival }, seq: i }));
  let seq = items.length;
  const sortQ = () => queue.sort((a, b) => a.g.arrival - b.g.arrival || a.seq - b.seq);
  sortQ();
  let take = queue.length <= k ? queue.length : 2 + ((queue.length - 2) % (k - 1));
  while (queue.length > 1) {
    const batch = queue.slice(0, take);
    queue = queue.slice(take);
    const arrival = Math.max(...batch.map((b) => b.g.arrival)) + 1;
    queue.push({ g: { kids: batch.map((b) => b.g), arrival }, seq: seq++ });
    sortQ();
    take = Math.min(k, queue.length);
  }
  return queue[0]!.g;
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
    const nodes = cap.map((_, i) => i).sort((x, y) => depth[x]! - depth[y]! || x - y);
    const assignment: number[] = loads.map((l) => (l.pinned ? -1 : -2));
    let ok = true;
    for (const l of order) {
      const at = nodes.find((n) => cap[n]! + 1e-9 >= l.weight);
      if (at === undefined) {
        ok = false;
        break;
      }
      cap[at]! -= l.weight;
      assignment[l.i] = at - 1;
    }
    if (!ok) continue;
    const levels = Math.max(0, ...assignment.map((a) => (a < 0 ? 0 : buffers[a]!.depth)));
    return { buffers, assignment, levels };
  }
}
