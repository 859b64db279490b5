/**
 * The gate netlist every later stage reads. Nets are named strings: primary
 * input nets carry the input names, the constant nets are "0" and "1", and
 * internal nets get fresh names that collide with no input or output.
 */
import type { GateType } from "../families/types";

export type { GateType };

export const CONST0 = "0";
export const CONST1 = "1";

/** Why a gate is there: logic of the cover, an inverter of an input or inner net, or a fan-out buffer. */
export type GateRole = "logic" | "inverter" | "buffer";

export interface Gate {
  id: string;
  type: GateType;
  /** Input nets in order; a tied input repeats a constant net. */
  inputs: string[];
  output: string;
  role: GateRole;
}

export interface NetlistOutput {
  name: string;
  net: string;
}

/** A complemented primary input supplied from outside (when the user says they exist). */
export interface ComplementRail {
  input: string;
  net: string;
}

export interface Netlist {
  inputs: string[];
  outputs: NetlistOutput[];
  /** Gates in topological order (every input net is a primary input, a rail, a constant or an earlier gate's output). */
  gates: Gate[];
  complements: ComplementRail[];
}

/** Evaluates one gate on bit-parallel words (32 minterms per word). */
export function evalWord(type: GateType, ins: number[]): number {
  switch (type) {
    case "AND":
    case "NAND": {
      let v = 0xffffffff;
      for (const x of ins) v &= x;
      return (type === "NAND" ? ~v : v) >>> 0;
    }
    case "OR":
    case "NOR": {
      let v = 0;
      for (const x of ins) v |= x;
      return (type === "NOR" ? ~v : v) >>> 0;
    }
    case "XOR":
    case "XNOR": {
      let v = 0;
      for (const x of ins) v ^= x;
      return (type === "XNOR" ? ~v : v) >>> 0;
    }
    case "NOT":
      return ~ins[0]! >>> 0;
    case "BUF":
      return ins[0]! >>> 0;
  }
}

/** Gates sorted so that each comes after the drivers of its inputs; throws on a loop. */
export function topoOrder(n: Netlist): Gate[] {
  const driver = new Map<string, Gate>();
  for (const g of n.gates) driver.set(g.output, g);
  const state = new Map<string, number>();
  const out: Gate[] = [];
  const visit = (g: Gate) => {
    const s = state.get(g.id);
    if (s === 2) return;
    if (s === 1) throw new Error(`netlist has a loop through gate ${g.id}`);
    state.set(g.id, 1);
    for (const i of g.inputs) {
      const d = driver.get(i);
      if (d) visit(d);
    }
    state.set(g.id, 2);
    out.push(g);
  };
  for (const g of n.gates) visit(g);
  return out;
}
