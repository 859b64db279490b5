/** A gate list as CSV (RFC 4180 quoting): one row per gate. */
import type { Netlist } from "../map/netlist";

const q = (s: string) => (/[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);

/** Columns: id, type, width, inputs (space-separated nets), output, role. */
export function toCsv(netlist: Netlist): string {
  const rows = [["id", "type", "width", "inputs", "output", "role"].join(",")];
  for (const g of netlist.gates) rows.push([g.id, g.type, String(g.inputs.length), g.inputs.join(" "), g.output, g.role].map(q).join(","));
  return rows.join("\r\n") + "\r\n";
}
