/**
 * VHDL: one entity and an architecture of concurrent signal assignments that
 * analyses under IEEE 1076-1993 as well as 1076-2008. Before 2008 an `out`
 * port cannot be read inside its architecture, so every gate drives an
 * internal signal and the output ports are assigned from those signals last.
 */
import type { Netlist } from "../map/netlist";
import { CONST0, CONST1 } from "../map/netlist";
import { unitName, vhdlNamer } from "./names";
import type { HdlOptions } from "./verilog";

/** Renders the netlist as VHDL-93/2008; output ports are only ever written, never read. */
export function toVhdl(netlist: Netlist, options: HdlOptions = {}): string {
  const allNames = [...netlist.inputs, ...netlist.complements.map((c) => c.net), ...netlist.outputs.map((o) => o.name), ...netlist.gates.map((g) => g.output)];
  const taken = new Set(allNames.map((x) => x.toLowerCase()));
  let ent = unitName(options.name);
  // a port or signal named like the entity would hide it
  while (taken.has(ent.toLowerCase())) ent = `${ent}_unit`;
  taken.add(ent.toLowerCase());
  const nm = vhdlNamer();
  const entName = nm(ent);
  const inPorts = [...netlist.inputs, ...netlist.complements.map((c) => c.net)];
  const outPorts = netlist.outputs.map((o) => o.name);
  const outSet = new Set(outPorts);

  // A gate whose output net carries an output port's name drives a fresh internal signal instead.
  const internal = new Map<string, string>();
  for (const g of netlist.gates) {
    if (!outSet.has(g.output) || internal.has(g.output)) continue;
    let k = 1;
    let s = `${g.output}_net`;
    while (taken.has(s.toLowerCase())) s = `${g.output}_net${++k}`;
    taken.add(s.toLowerCase());
    internal.set(g.output, s);
  }
  const sig = (net: string) => internal.get(net) ?? net;
  const term = (net: string) => (net === CONST0 ? "'0'" : net === CONST1 ? "'1'" : nm(sig(net)));
  const signals = netlist.gates.map((g) => sig(g.output));

  const lines: string[] = [];
  for (const h of options.header ?? []) lines.push(`-- ${h.replace(/[\r\n]+/g, " ")}`);
  lines.push("library ieee;", "use ieee.std_logic_1164.all;", "");
  lines.push(`entity ${entName} is`);
  const ports = [...inPorts.map((p) => `${nm(p)} : in std_logic`), ...outPorts.map((p) => `${nm(p)} : out std_logic`)];
  if (ports.length) {
    lines.push("  port (");
    lines.push(ports.map((p) => `    ${p}`).join(";\n"));
    lines.push("  );");
  }
  lines.push(`end entity ${entName};`, "");
  lines.push(`architecture structure of ${entName} is`);
  for (const s of signals) lines.push(`  signal ${nm(s)} : std_logic;`);
  lines.push("begin");
  for (const g of netlist.gates) {
    const ins = g.inputs.map(term);
    let expr: string;
    switch (g.type) {
      case "AND": expr = ins.join(" and "); break;
      case "OR": expr = ins.join(" or "); break;
      case "XOR": expr = ins.join(" xor "); break;
      case "NAND": expr = `not (${ins.join(" and ")})`; break;
      case "NOR": expr = `not (${ins.join(" or ")})`; break;
      case "XNOR": expr = `not (${ins.join(" xor ")})`; break;
      case "NOT": expr = `not ${ins[0]}`; break;
      case "BUF": expr = ins[0]!; break;
    }
    lines.push(`  ${term(g.output)} <= ${expr}; -- ${g.id} ${g.type}${g.inputs.length > 1 ? g.inputs.length : ""}`);
  }
  for (const o of netlist.outputs) lines.push(`  ${nm(o.name)} <= ${term(o.net)};`);
  lines.push("end architecture structure;");
  return lines.join("\n") + "\n";
}
