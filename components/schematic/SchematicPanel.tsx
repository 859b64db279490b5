"use client";
import { memo, useMemo, useState } from "react";
import { coneSizes, outputCone, type DrawableNetlist } from "@/lib/export/cone";
import { Schematic } from "./Schematic";

/** Up to this many gates the whole netlist is drawn on one sheet. */
export const FULL_DRAWING_MAX_GATES = 300;
/** A cone drawing shows at most this many gates, the ones nearest the output. */
export const CONE_DRAWING_MAX_GATES = 200;

/**
 * The schematic of a result. A netlist small enough to read is drawn whole;
 * above a few hundred gates one drawing would be unreadable (and slow to lay
 * out), so the designer picks an output and sees its cone — the gates that
 * output depends on — with the nets entering from gates left out drawn as
 * dashed ports.
 */
function SchematicPanelView({ netlist, critical, selected, onSelect, criticalOutput }: {
  netlist: DrawableNetlist;
  critical: { nets: Set<string>; gates: Set<string> };
  selected: string | null;
  onSelect: (gateId: string) => void;
  /** The output the critical path ends at; drawn first. */
  criticalOutput?: string;
}) {
  const whole = netlist.gates.length <= FULL_DRAWING_MAX_GATES;
  const sizes = useMemo(() => (whole ? null : coneSizes(netlist)), [netlist, whole]);
  const [picked, setPicked] = useState<string | null>(null);
  const names = netlist.outputs.map((o) => o.name);
  const output = picked && names.includes(picked) ? picked : criticalOutput && names.includes(criticalOutput) ? criticalOutput : names[0];
  const cone = useMemo(
    () => (whole || !output ? null : outputCone(netlist, output, CONE_DRAWING_MAX_GATES)),
    [netlist, whole, output],
  );
  const cut = useMemo(() => new Set(cone?.cut ?? []), [cone]);

  if (whole) return <Schematic netlist={netlist} critical={critical} selected={selected} onSelect={onSelect} />;
  return (
    <div data-testid="cone-view">
      <div className="mb-2 flex flex-wrap items-center gap-2 text-sm">
        <label htmlFor="cone-output" className="text-graphite">
          {netlist.gates.length} gates are too many for one readable drawing; draw the cone of output
        </label>
        <select id="cone-output" value={output} onChange={(e) => setPicked(e.target.value)}
          className="rounded border border-rule bg-paper px-2 py-1 font-mono text-sm">
          {names.map((n) => (
            <option key={n} value={n}>{n} ({sizes?.get(n) ?? 0} gates)</option>
          ))}
        </select>
      </div>
      {cone && (
        <Schematic netlist={cone.netlist} critical={critical} selected={selected} onSelect={onSelect} cut={cut}
          caption={cone.total > cone.netlist.gates.length
            ? `the ${cone.netlist.gates.length} gates nearest ${output} of its ${cone.total}; dashed ports are nets from gates not drawn (all are in the gate table)`
            : `cone of ${output}: ${cone.total} gates`} />
      )}
    </div>
  );
}

/** Drawn again only when its own inputs change, not at every keystroke in the editor. */
export const SchematicPanel = memo(SchematicPanelView);
