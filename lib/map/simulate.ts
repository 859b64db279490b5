/**
 * Bit-parallel simulation of a netlist over whole truth tables (32 minterms a
 * word). Nets are numbered once, each gate is evaluated word by word with a
 * loop per gate type, and a net's table goes back to a pool as soon as its
 * last reader has been evaluated, so memory follows the netlist's width, not
 * its size. Time is gates × 2^n / 32 words: inherent to an exhaustive check.
 */
import type { Netlist } from "./netlist";
import { CONST0, CONST1, topoOrder } from "./netlist";

/** Simulates the netlist on the given input tables (one per netlist input, all the same length); returns one table per netlist output. */
export function simulateNetlist(netlist: Netlist, inputs: readonly Uint32Array[]): Uint32Array[] {
  const words = inputs[0]?.length ?? 1;
  const slot = new Map<string, number>();
  const tables: (Uint32Array | null)[] = [];
  const fixed: boolean[] = [];
  const define = (net: string, t: Uint32Array | null, keep: boolean) => {
    slot.set(net, tables.length);
    tables.push(t);
    fixed.push(keep);
  };
  define(CONST0, new Uint32Array(words), true);
  define(CONST1, new Uint32Array(words).fill(0xffffffff), true);
  netlist.inputs.forEach((name, i) => {
    const t = inputs[i];
    if (!t) throw new Error(`no table given for input ${name}`);
    define(name, t, true);
  });
  for (const r of netlist.complements) {
    const src = tables[slot.get(r.input) ?? -1];
    if (!src) throw new Error(`complemented input ${r.net} names ${r.input}, which is no input`);
    define(r.net, src.map((x) => ~x >>> 0), true);
  }
  const gates = topoOrder(netlist);
  const outSet = new Set(netlist.outputs.map((o) => o.net));
  for (const g of gates) define(g.output, null, outSet.has(g.output));
  const reads = new Int32Array(tables.length);
  const ins = gates.map((g) =>
    g.inputs.map((i) => {
      const s = slot.get(i);
      if (s === undefined) throw new Error(`gate ${g.id} reads net "${i}", which nothing drives`);
      reads[s]!++;
      return s;
    }),
  );
  const pool: Uint32Array[] = [];
  gates.forEach((g, gi) => {
    const src = ins[gi]!;
    const out = pool.pop() ?? new Uint32Array(words);
    const first = tables[src[0]!]!;
    switch (g.type) {
      case "AND":
      case "NAND":
        out.set(first);
        for (let j = 1; j < src.length; j++) {
          const t = tables[src[j]!]!;
          for (let w = 0; w < words; w++) out[w]! &= t[w]!;
        }
        break;
      case "OR":
      case "NOR":
        out.set(first);
        for (let j = 1; j < src.length; j++) {
          const t = tables[src[j]!]!;
          for (let w = 0; w < words; w++) out[w]! |= t[w]!;
        }
        break;
      case "XOR":
      case "XNOR":
        out.set(first);
        for (let j = 1; j < src.length; j++) {
          const t = tables[src[j]!]!;
          for (let w = 0; w < words; w++) out[w]! ^= t[w]!;
        }
        break;
      case "NOT":
      case "BUF":
        out.set(first);
        break;
    }
    if (g.type === "NAND" || g.type === "NOR" || g.type === "XNOR" || g.type === "NOT") {
      for (let w = 0; w < words; w++) out[w] = ~out[w]!;
    }
    const me = slot.get(g.output)!;
    tables[me] = out;
    for (const s of src) {
      if (--reads[s]! === 0 && !fixed[s]) {
        pool.push(tables[s]!);
        tables[s] = null;
      }
    }
  });
  return netlist.outputs.map((o) => {
    const s = slot.get(o.net);
    const t = s === undefined ? undefined : tables[s];
    if (!t) throw new Error(`output "${o.name}" reads net "${o.net}", which nothing drives`);
    return t;
  });
}
