"use client";
import type { Analysis, NetlistDocument } from "./types";

/** Every gate of the netlist with the load on its output against the limit. */
export function GateTable({ netlist, analysis, selected, onSelect, criticalGates }: {
  netlist: NetlistDocument;
  analysis: Analysis;
  selected: string | null;
  onSelect: (id: string) => void;
  criticalGates: Set<string>;
}) {
  const loads = new Map(analysis.loads.map((l) => [l.net, l]));
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm" data-testid="gate-table">
        <thead className="border-b border-rule text-left text-xs uppercase tracking-wide text-graphite">
          <tr>
            <th className="px-2 py-1.5">Gate</th>
            <th className="px-2 py-1.5">Type</th>
            <th className="px-2 py-1.5">Inputs</th>
            <th className="px-2 py-1.5">Output</th>
            <th className="px-2 py-1.5 text-right" title="unit loads on the output net / the driver's fan-out">Load / limit</th>
          </tr>
        </thead>
        <tbody className="font-mono tabular">
          {netlist.gates.map((g) => {
            const l = loads.get(g.output);
            const tone = l?.status === "over" ? "text-vermilion" : l?.status === "at-limit" ? "text-amber" : "";
            return (
              <tr key={g.id} id={`gate-row-${g.id}`} data-gate={g.id}
                onClick={() => onSelect(g.id)}
                className={`cursor-pointer border-b border-rule/50 last:border-0 ${selected === g.id ? "bg-accent/10" : "hover:bg-paper"}`}>
                <td className="px-2 py-1">
                  {criticalGates.has(g.id) && <span className="mr-1 text-accent" title="on the critical path">●</span>}
                  {g.id}
                </td>
                <td className="px-2 py-1">{g.type}{g.type === "NOT" || g.type === "BUF" ? "" : g.inputs.length}</td>
                <td className="px-2 py-1 text-graphite">{g.inputs.join(", ")}</td>
                <td className="px-2 py-1">{g.output}</td>
                <td className={`px-2 py-1 text-right ${tone}`}>{l ? `${l.load} / ${l.limit}` : "—"}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
