// Independent reference evaluation written for the tests: one minterm at a
// time, straight from the gate definitions, sharing no code with lib/verify or lib/map/simulate.
import type { Netlist } from "../../lib/map/index";
import type { Cube } from "../../lib/logic/index";

export function evalNetlist(n: Netlist, inputs: string[], m: number): Map<string, boolean> {
  const v = new Map<string, boolean>([["0", false], ["1", true]]);
  inputs.forEach((name, i) => v.set(name, ((m >>> (inputs.length - 1 - i)) & 1) === 1));
  for (const r of n.complements) v.set(r.net, !v.get(r.input)!);
  const pending = [...n.gates];
  while (pending.length) {
    const before = pending.length;
    for (let i = 0; i < pending.length; ) {
      const g = pending[i]!;
      if (!g.inputs.every((x) => v.has(x))) {
        i++;
        continue;
      }
      const ins = g.inputs.map((x) => v.get(x)!);
      const and = ins.every(Boolean), or = ins.some(Boolean), xor = ins.filter(Boolean).length % 2 === 1;
      const out = { AND: and, NAND: !and, OR: or, NOR: !or, XOR: xor, XNOR: !xor, NOT: !ins[0], BUF: ins[0]! }[g.type];
      v.set(g.output, out);
      pending.splice(i, 1);
    }
    if (pending.length === before) throw new Error("netlist has undriven nets or a loop");
  }
  return v;
}

export function inCube(c: Cube, m: number): boolean {
  return ((m ^ c.value) & c.mask) === 0;
}

/** Value of an SOP or POS cover at minterm m. */
export function evalCover(form: "sop" | "pos", cubes: Cube[], m: number): boolean {
  if (form === "sop") return cubes.some((c) => inCube(c, m));
  // POS sum term is false exactly where every literal is false: the cube of inverted polarities
  return cubes.every((c) => !inCube({ value: (~c.value & c.mask) >>> 0, mask: c.mask }, m));
}

/** Unit loads per net: gate inputs fed plus output pins (constants skipped). */
export function netLoads(n: Netlist, pinLoad = 1): Map<string, number> {
  const l = new Map<string, number>();
  for (const g of n.gates) for (const i of g.inputs) if (i !== "0" && i !== "1") l.set(i, (l.get(i) ?? 0) + 1);
  for (const o of n.outputs) if (o.net !== "0" && o.net !== "1") l.set(o.net, (l.get(o.net) ?? 0) + pinLoad);
  return l;
}

/** Longest path in gates from any input to the net. */
export function levels(n: Netlist): Map<string, number> {
  const lv = new Map<string, number>();
  const driver = new Map(n.gates.map((g) => [g.output, g]));
  const get = (net: string): number => {
    const hit = lv.get(net);
    if (hit !== undefined) return hit;
    const g = driver.get(net);
    const v = g ? 1 + Math.max(0, ...g.inputs.map(get)) : 0;
    lv.set(net, v);
    return v;
  };
  for (const g of n.gates) get(g.output);
  return lv;
}
