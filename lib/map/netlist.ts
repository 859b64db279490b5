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

/**
 * Gates sorted so that each comes after the drivers of its inputs (depth-first
 * from each gate in list order, so a list already in order comes back as it
 * is); throws on a loop. Iterative, so a deep netlist cannot overflow the stack.
 */
export function topoOrder(n: Netlist): Gate[] {
  const index = new Map<string, number>();
  n.gates.forEach((g, i) => index.set(g.output, i));
  // 0 unvisited, 1 on the stack, 2 done
  const state = new Uint8Array(n.gates.length);
  const out: Gate[] = [];
  const stack: number[] = [];
  const next: number[] = [];
  for (let root = 0; root < n.gates.length; root++) {
    if (state[root]) continue;
    state[root] = 1;
    stack.push(root);
    next.push(0);
    while (stack.length) {
      const top = stack.length - 1;
      const g = n.gates[stack[top]!]!;
      const k = next[top]!;
      if (k < g.inputs.length) {
        next[top] = k + 1;
        const d = index.get(g.inputs[k]!);
        if (d === undefined || state[d] === 2) continue;
        if (state[d] === 1) throw new Error(`netlist has a loop through gate ${n.gates[d]!.id}`);
        state[d] = 1;
        stack.push(d);
        next.push(0);
      } else {
        state[stack[top]!] = 2;
        out.push(g);
        stack.pop();
        next.pop();
      }
    }
  }
  return out;
}
