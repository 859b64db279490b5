/**
 * One output's cone of a netlist, for drawing a part of a design too large to
 * read as one sheet: the gates the output depends on, nearest first, up to a
 * limit. Nets that enter the drawn part from gates left out are returned as
 * cut nets, drawn as ports named after the net, so every drawn wire still
 * starts somewhere.
 */
import type { GateType } from "../map/netlist";

/** The part of a netlist document a drawing needs. */
export interface DrawableNetlist {
  inputs: string[];
  complementedInputs?: { input: string; net: string }[];
  outputs: { name: string; net: string }[];
  gates: { id: string; type: GateType; inputs: string[]; output: string }[];
}

export interface Cone {
  output: string;
  /** Gates the output depends on, in all. */
  total: number;
  /** The drawn part: at most `limit` gates, the ones nearest the output (fewest gates away). */
  netlist: DrawableNetlist;
  /** Nets that feed drawn gates from gates that are not drawn. */
  cut: string[];
}

/** Gates each output depends on (its cone's size), by output name. */
export function coneSizes(doc: DrawableNetlist): Map<string, number> {
  const driver = driversOf(doc);
  const sizes = new Map<string, number>();
  const seen = new Int32Array(doc.gates.length).fill(-1);
  doc.outputs.forEach((o, k) => {
    let n = 0;
    const stack: number[] = [];
    const push = (net: string) => {
      const g = driver.get(net);
      if (g !== undefined && seen[g] !== k) {
        seen[g] = k;
        stack.push(g);
      }
    };
    push(o.net);
    while (stack.length) {
      const g = stack.pop()!;
      n++;
      for (const i of doc.gates[g]!.inputs) push(i);
    }
    sizes.set(o.name, n);
  });
  return sizes;
}

/**
 * The cone of `output`, breadth first from the output back towards the
 * inputs, cut off after `limit` gates (default 200). Gates keep the netlist's
 * order, so drivers still come before the gates they feed.
 */
export function outputCone(doc: DrawableNetlist, output: string, limit = 200): Cone {
  const out = doc.outputs.find((o) => o.name === output);
  if (!out) throw new Error(`no output named "${output}"`);
  const driver = driversOf(doc);
  const taken = new Uint8Array(doc.gates.length);
  const queue: number[] = [];
  let total = 0;
  let drawn = 0;
  const first = driver.get(out.net);
  if (first !== undefined) {
    taken[first] = 1;
    queue.push(first);
  }
  for (let head = 0; head < queue.length; head++) {
    const g = queue[head]!;
    total++;
    if (head < limit) drawn++;
    for (const i of doc.gates[g]!.inputs) {
      const d = driver.get(i);
      if (d !== undefined && !taken[d]) {
        taken[d] = 1;
        queue.push(d);
      }
    }
  }
  const shown = new Uint8Array(doc.gates.length);
  for (let k = 0; k < drawn; k++) shown[queue[k]!] = 1;
  const gates = doc.gates.filter((_, i) => shown[i]);
  const primary = new Set(doc.inputs);
  const rails = new Map((doc.complementedInputs ?? []).map((c) => [c.net, c]));
  const usedInputs = new Set<string>();
  const usedRails = new Set<string>();
  const cut = new Set<string>();
  const read = (net: string) => {
    const d = driver.get(net);
    if (d !== undefined) {
      if (!shown[d]) cut.add(net);
    } else if (primary.has(net)) usedInputs.add(net);
    else if (rails.has(net)) usedRails.add(net);
  };
  for (const g of gates) for (const i of g.inputs) read(i);
  read(out.net);
  return {
    output,
    total,
    cut: [...cut],
    netlist: {
      inputs: [...doc.inputs.filter((i) => usedInputs.has(i)), ...cut],
      complementedInputs: (doc.complementedInputs ?? []).filter((c) => usedRails.has(c.net)),
      outputs: [out],
      gates,
    },
  };
}

function driversOf(doc: DrawableNetlist): Map<string, number> {
  const m = new Map<string, number>();
  doc.gates.forEach((g, i) => m.set(g.output, i));
  return m;
}
