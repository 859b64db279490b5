"use client";
import { memo, useEffect, useMemo, useRef } from "react";
import { useVirtualizer } from "@tanstack/react-virtual";
import type { Analysis, NetlistDocument } from "./types";

const ROW_PX = 28;

/**
 * Every gate of the netlist with the load on its output against the limit.
 * Only the rows in view are in the page, so a netlist of thousands of gates
 * scrolls without freezing it.
 */
function GateTableView({ netlist, analysis, selected, onSelect, criticalGates }: {
  netlist: NetlistDocument;
  analysis: Analysis;
  selected: string | null;
  onSelect: (id: string) => void;
  criticalGates: Set<string>;
}) {
  const loads = useMemo(() => new Map(analysis.loads.map((l) => [l.net, l])), [analysis]);
  const index = useMemo(() => new Map(netlist.gates.map((g, i) => [g.id, i])), [netlist]);
  const box = useRef<HTMLDivElement>(null);
  const rows = useVirtualizer({
    count: netlist.gates.length,
    getScrollElement: () => box.current,
    estimateSize: () => ROW_PX,
    overscan: 12,
  });
  useEffect(() => {
    const i = selected ? index.get(selected) : undefined;
    if (i !== undefined) rows.scrollToIndex(i, { align: "auto" });
  }, [selected, index, rows]);

  const items = rows.getVirtualItems();
  const top = items[0]?.start ?? 0;
  const bottom = rows.getTotalSize() - (items.at(-1)?.end ?? 0);
  return (
    <div ref={box} className="max-h-[27rem] overflow-auto" data-testid="gate-table-scroll">
      <table className="w-full table-fixed text-sm" data-testid="gate-table" aria-rowcount={netlist.gates.length + 1}>
        <colgroup>
          <col className="w-[7rem]" /><col className="w-[5.5rem]" /><col /><col className="w-[7rem]" /><col className="w-[7rem]" />
        </colgroup>
        <thead className="sticky top-0 z-10 border-b border-rule bg-sheet text-left text-xs uppercase tracking-wide text-graphite">
          <tr>
            <th className="px-2 py-1.5">Gate</th>
            <th className="px-2 py-1.5">Type</th>
            <th className="px-2 py-1.5">Inputs</th>
            <th className="px-2 py-1.5">Output</th>
            <th className="px-2 py-1.5 text-right" title="unit loads on the output net / the driver's fan-out">Load / limit</th>
          </tr>
        </thead>
        <tbody className="font-mono tabular">
          {top > 0 && <tr aria-hidden="true" style={{ height: top }} />}
          {items.map((v) => {
            const g = netlist.gates[v.index]!;
            const l = loads.get(g.output);
            const tone = l?.status === "over" ? "text-vermilion" : l?.status === "at-limit" ? "text-amber" : "";
            const ins = g.inputs.join(", ");
            return (
              <tr key={g.id} id={`gate-row-${g.id}`} data-gate={g.id} aria-rowindex={v.index + 2}
                onClick={() => onSelect(g.id)} style={{ height: ROW_PX }}
                className={`cursor-pointer border-b border-rule/50 last:border-0 ${selected === g.id ? "bg-accent/10" : "hover:bg-paper"}`}>
                <td className="truncate px-2">
                  {criticalGates.has(g.id) && <span className="mr-1 text-accent" title="on the critical path">●</span>}
                  {g.id}
                </td>
                <td className="px-2">{g.type}{g.type === "NOT" || g.type === "BUF" ? "" : g.inputs.length}</td>
                <td className="truncate px-2 text-graphite" title={ins}>{ins}</td>
                <td className="truncate px-2">{g.output}</td>
                <td className={`px-2 text-right ${tone}`}>{l ? `${l.load} / ${l.limit}` : "—"}</td>
              </tr>
            );
          })}
          {bottom > 0 && <tr aria-hidden="true" style={{ height: bottom }} />}
        </tbody>
      </table>
    </div>
  );
}

/** Drawn again only when its own inputs change, not at every keystroke in the editor. */
export const GateTable = memo(GateTableView);
