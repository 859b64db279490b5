import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { bufferCount, mergeByArrival, planBufferTree, treeGates, treeLevels, type Group } from "../../lib/map/index";

const depthOf = (g: Group<number>): number => ("leaf" in g ? 0 : 1 + Math.max(...g.kids.map(depthOf)));
const gatesOf = (g: Group<number>): number => ("leaf" in g ? 0 : 1 + g.kids.reduce((s, k) => s + gatesOf(k), 0));
const widest = (g: Group<number>): number => ("leaf" in g ? 0 : Math.max(g.kids.length, ...g.kids.map(widest)));
const leaves = (g: Group<number>): number[] => ("leaf" in g ? [g.leaf] : g.kids.flatMap(leaves));

describe("balanced fan-in trees", () => {
  it("8 inputs at fan-in 2: 3 levels, 7 gates", () => {
    // common practice: ceil(log2 8) = 3, (8 − 1)/(2 − 1) = 7
    expect(treeLevels(8, 2)).toBe(3);
    expect(treeGates(8, 2)).toBe(7);
    const t = mergeByArrival(Array.from({ length: 8 }, (_, i) => ({ item: i, arrival: 0 })), 2);
    expect(depthOf(t)).toBe(3);
    expect(gatesOf(t)).toBe(7);
  });
  it("17 inputs at fan-in 4: 3 levels, 6 gates", () => {
    // common practice: ceil(log4 17) = 3, ceil(16 / 3) = 6
    expect(treeLevels(17, 4)).toBe(3);
    expect(treeGates(17, 4)).toBe(6);
    const t = mergeByArrival(Array.from({ length: 17 }, (_, i) => ({ item: i, arrival: 0 })), 4);
    expect(depthOf(t)).toBe(3);
    expect(gatesOf(t)).toBe(6);
  });
  it("a fan-in of 6 puts 7 inputs into two gates over two levels", () => {
    // common practice, no source
    const t = mergeByArrival(Array.from({ length: 7 }, (_, i) => ({ item: i, arrival: 0 })), 6);
    expect(gatesOf(t)).toBe(2);
    expect(depthOf(t)).toBe(2);
  });
  it("matches the minimum gate count and depth for any n and k", () => {
    // brute force here: the fewest levels d with k^d ≥ n, and n − 1 inputs removed at k − 1 per gate
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 200 }), fc.integer({ min: 2, max: 13 }), (n, k) => {
        const t = mergeByArrival(Array.from({ length: n }, (_, i) => ({ item: i, arrival: 0 })), k);
        let d = 0;
        while (k ** d < n) d++;
        expect(depthOf(t)).toBe(d);
        expect(gatesOf(t)).toBe(n <= 1 ? 0 : Math.ceil((n - 1) / (k - 1)));
        expect(widest(t)).toBeLessThanOrEqual(k);
        expect(leaves(t).sort((a, b) => a - b)).toEqual(Array.from({ length: n }, (_, i) => i));
      }),
    );
  });
  it("gives a late signal the short side", () => {
    // worked by hand: arrivals 0, 0, 0, 2 at fan-in 2 — ((a·b)·c)·late finishes at 3, a balanced tree at 4
    const t = mergeByArrival([0, 0, 0, 2].map((arrival, item) => ({ item, arrival })), 2);
    expect(t.arrival).toBe(3);
    expect("kids" in t && t.kids.some((k) => "leaf" in k && k.leaf === 3)).toBe(true);
  });
  it("the first merge takes 2 + ((n − 2) mod (k − 1)) inputs", () => {
    // common practice: the rule that leaves every later merge full
    const t = mergeByArrival(Array.from({ length: 9 }, (_, i) => ({ item: i, arrival: 0 })), 4);
    const sizes: number[] = [];
    const walk = (g: Group<number>) => {
      if ("kids" in g) {
        sizes.push(g.kids.length);
        g.kids.forEach(walk);
      }
    };
    walk(t);
    expect(sizes.sort()).toEqual([3, 4, 4].sort()); // 2 + (7 mod 3) = 3
  });
});

describe("buffer trees", () => {
  it("fan-out 10: 25 loads need 2 buffers", () => {
    // common practice: ceil((25 − 10) / (10 − 1)) = 2
    expect(bufferCount(25, 10)).toBe(2);
    const p = planBufferTree(Array.from({ length: 25 }, () => ({ weight: 1, criticality: 0 })), 10);
    expect(p.buffers.length).toBe(2);
    expect(p.levels).toBe(1);
  });
  it("fan-out 10: 101 loads need 11 buffers over 2 levels", () => {
    // common practice: ceil(91 / 9) = 11; ten first-level buffers carry at most 100
    expect(bufferCount(101, 10)).toBe(11);
    const p = planBufferTree(Array.from({ length: 101 }, (_, i) => ({ weight: 1, criticality: i })), 10);
    expect(p.buffers.length).toBe(11);
    expect(Math.max(...p.buffers.map((b) => b.depth))).toBe(2);
    // every driver within fan-out: count children here
    const count = new Map<number, number>();
    p.buffers.forEach((b) => count.set(b.parent, (count.get(b.parent) ?? 0) + 1));
    p.assignment.forEach((a) => count.set(a, (count.get(a) ?? 0) + 1));
    for (const c of count.values()) expect(c).toBeLessThanOrEqual(10);
    // the most critical loads hang from the shallowest level
    const depth = (a: number) => (a < 0 ? 0 : p.buffers[a]!.depth);
    const deepest = Math.max(...p.assignment.map(depth));
    const mostCritical = p.assignment.slice(91).map(depth);
    expect(Math.max(...mostCritical)).toBeLessThan(deepest);
  });
  it("ten loads need no buffer and eleven need one", () => {
    // common practice, no source
    expect(planBufferTree(Array.from({ length: 10 }, () => ({ weight: 1, criticality: 0 })), 10).buffers.length).toBe(0);
    expect(planBufferTree(Array.from({ length: 11 }, () => ({ weight: 1, criticality: 0 })), 10).buffers.length).toBe(1);
  });
});
