/** VHDL (IEEE 1076-2008): one entity and an architecture of concurrent signal assignments. */
import type { Netlist } from "../map/netlist";
import { CONST0, CONST1 } from "../map/netlist";
import { unitName, vhdlNamer } from "./names";
import type { HdlOptions } from "./verilog";

/** Renders the netlist as VHDL; output ports are read inside the architecture, which VHDL-2008 allows. */
export function toVhdl(netlist: Netlist, options: HdlOptions = {}): string {
  const taken = new Set([...netlist.inputs, ...netlist.complements.map((c) => c.net), ...netlist.outputs.map((o) => o.name), ...netlist.gates.map((g) => g.output)].map((x) => x.toLowerCase()));
  let ent = unitName(options.name);
  // a port or signal named like the entity would hide it
  while (taken.has(ent.toLowerCase())) ent = `${ent}_unit`;
  const nm = vhdlNamer();
  const entName = nm(ent);
  const term = (net: string) => (net === CONST0 ? "'0'" : net === CONST1 ? "'1'" : nm(net));
  const inPorts = [...netlist.inputs, ...netlist.complements.map((c) => c.net)];
  const outPorts = netlist.outputs.map((o) => o.name);
  const portSet = new Set([...inPorts, ...outPorts]);
  const signals = netlist.gates.map((g) => g.output).filter((n) => !portSet.has(n));
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
  for (const o of netlist.outputs) if (o.net !== o.name) lines.push(`  ${nm(o.name)} <= ${term(o.net)};`);
  lines.push("end architecture structure;");
  return lines.join("\n") + "\n";
}
