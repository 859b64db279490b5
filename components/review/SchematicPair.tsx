"use client";
import { useMemo, useState } from "react";
import type { NetlistDocument } from "@/lib/export/json";
import { Schematic } from "@/components/schematic/Schematic";

interface Side {
  label: string;
  netlist: NetlistDocument | null;
  critical: { nets: string[]; gates: string[] };
}

/** Both schematics side by side with one zoom, each with its critical path marked. */
export function SchematicPair({ from, to }: { from: Side; to: Side }) {
  // Until someone zooms, each drawing fits its own box; from then on both follow one factor.
  const [zoom, setZoom] = useState<number | undefined>(undefined);
  const [selected, setSelected] = useState<string | null>(null);
  const sets = useMemo(
    () => [from, to].map((s) => ({ nets: new Set(s.critical.nets), gates: new Set(s.critical.gates) })),
    [from, to],
  );
  return (
    <div>
      <div className="mb-2 flex items-center gap-2 text-sm">
        <span className="text-xs uppercase tracking-wide text-graphite">Schematics</span>
        <span className="ml-auto text-xs text-graphite">One zoom for both:</span>
        <button type="button" className="rounded border border-rule bg-sheet px-2" aria-label="Zoom both in" onClick={() => setZoom((z) => Math.min(4, (z ?? 0.8) * 1.25))}>+</button>
        <button type="button" className="rounded border border-rule bg-sheet px-2" aria-label="Zoom both out" onClick={() => setZoom((z) => Math.max(0.1, (z ?? 0.8) * 0.8))}>−</button>
        <button type="button" className="rounded border border-rule bg-sheet px-2 text-xs" onClick={() => setZoom(undefined)}>fit each</button>
      </div>
      <div className="grid gap-3 lg:grid-cols-2" data-testid="schematic-pair">
        {[from, to].map((s, i) => (
          <figure key={i} className="rounded border border-rule bg-sheet p-2" data-side={i === 0 ? "from" : "to"}>
            <figcaption className="mb-1 text-sm font-semibold">{s.label}</figcaption>
            {s.netlist ? (
              <Schematic netlist={s.netlist} critical={sets[i]!} selected={selected} onSelect={setSelected} height={340}
                zoom={zoom} onZoomChange={setZoom} />
            ) : (
              <p className="flex h-[340px] items-center justify-center text-sm text-graphite">This revision was saved before its netlist was kept.</p>
            )}
          </figure>
        ))}
      </div>
    </div>
  );
}
