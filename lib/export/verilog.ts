/** Structural Verilog with IEEE 1364 gate primitives. */
import type { Netlist } from "../map/netlist";
import { CONST0, CONST1 } from "../map/netlist";
import { unitName, verilogName } from "./names";

export interface HdlOptions {
  /** Module / entity name; default "design_top". Sanitized to a legal identifier. */
  name?: string;
  /** Comment lines placed at the top (design, family, settings). */
  header?: string[];
}

const PRIMITIVE: Record<string, string> = {
  AND: "and", OR: "or", NAND: "nand", NOR: "nor", XOR: "xor", XNOR: "xnor", NOT: "not", BUF: "buf",
};

/** Renders the netlist as one Verilog module of gate primitive instances. */
export function toVerilog(netlist: Netlist, options: HdlOptions = {}): string {
  const mod = unitName(options.name);
  const v = verilogName;
  const term = (net: string) => (net === CONST0 ? "1'b0" : net === CONST1 ? "1'b1" : v(net));
  const inPorts = [...netlist.inputs, ...netlist.complements.map((c) => c.net)];
  const outPorts = netlist.outputs.map((o) => o.name);
  const portSet = new Set([...inPorts, ...outPorts]);
  const wires = netlist.gates.map((g) => g.output).filter((n) => !portSet.has(n));
  const names = new Set([...portSet, ...wires]);
  const lines: string[] = [];
  for (const h of options.header ?? []) lines.push(`// ${h.replace(/[\r\n]+/g, " ")}`);
  lines.push("`timescale 1ns / 1ps");
  lines.push(`module ${v(mod)}(${[...inPorts, ...outPorts].map(v).join(", ")});`);
  if (inPorts.length) lines.push(`  input ${inPorts.map(v).join(", ")};`);
  if (outPorts.length) lines.push(`  output ${outPorts.map(v).join(", ")};`);
  if (wires.length) lines.push(`  wire ${wires.map(v).join(", ")};`);
  for (const c of netlist.complements) lines.push(`  // ${c.net} is the complement of ${c.input}, supplied from outside`);
  for (const g of netlist.gates) {
    let inst = `${g.id}`;
    while (names.has(inst)) inst = `${inst}_i`;
    names.add(inst);
    lines.push(`  ${PRIMITIVE[g.type]} ${v(inst)}(${[g.output, ...g.inputs].map(term).join(", ")});`);
  }
  for (const o of netlist.outputs) if (o.net !== o.name) lines.push(`  assign ${v(o.name)} = ${term(o.net)};`);
  lines.push("endmodule");
  return lines.join("\n") + "\n";
}
