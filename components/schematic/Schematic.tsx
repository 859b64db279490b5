"use client";
import { startTransition, useEffect, useRef, useState } from "react";
import type { Layout, LayoutNode } from "@/lib/export/layout";
import type { DrawableNetlist } from "@/lib/export/cone";
import type { Netlist } from "@/lib/map/netlist";
import { GateSymbol } from "./GateSymbol";

/** Lays the netlist out on a web worker; the promise rejects with "cancelled" when `signal` aborts (the worker is stopped). */
function layoutOffThread(netlist: Netlist, signal: AbortSignal): Promise<Layout> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(new URL("./layout.worker.ts", import.meta.url), { type: "module" });
    const stop = () => {
      worker.terminate();
      reject(new Error("cancelled"));
    };
    signal.addEventListener("abort", stop, { once: true });
    worker.onmessage = (e: MessageEvent<{ ok: true; layout: Layout } | { ok: false; error: string }>) => {
      signal.removeEventListener("abort", stop);
      worker.terminate();
      if (e.data.ok) resolve(e.data.layout);
      else reject(new Error(e.data.error));
    };
    worker.onerror = (e) => {
      signal.removeEventListener("abort", stop);
      worker.terminate();
      reject(new Error(e.message || "the layout worker failed"));
    };
    worker.postMessage({ id: 1, netlist });
  });
}

/**
 * The netlist drawn as a schematic from the layered layout data: IEEE Std 91
 * distinctive shapes, the critical path in the accent colour, pan by dragging,
 * zoom with the wheel or the buttons, and a click on a gate to select it.
 */
export function Schematic({ netlist, critical, selected, onSelect, height = 360, cut, caption, zoom, onZoomChange }: {
  netlist: DrawableNetlist;
  /** Nets and gates on the critical path. */
  critical: { nets: Set<string>; gates: Set<string> };
  selected: string | null;
  onSelect: (gateId: string) => void;
  height?: number;
  /** Nets drawn as ports because their drivers are left out of this drawing. */
  cut?: ReadonlySet<string>;
  /** Replaces the gate count in the line under the drawing. */
  caption?: string;
  /** A zoom factor shared with other drawings (e.g. two revisions side by side); default: this drawing's own, fitted to its box. */
  zoom?: number;
  /** Called with the new factor when the user zooms and `zoom` is given. */
  onZoomChange?: (k: number) => void;
}) {
  const [layout, setLayout] = useState<Layout | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [view, setView] = useState({ x: 0, y: 0, k: 1 });
  const drag = useRef<{ x: number; y: number; vx: number; vy: number } | null>(null);
  const box = useRef<HTMLDivElement>(null);

  useEffect(() => {
    const ctl = new AbortController();
    setLayout(null);
    layoutOffThread({
      inputs: netlist.inputs,
      outputs: netlist.outputs,
      complements: netlist.complementedInputs ?? [],
      gates: netlist.gates.map((g) => ({ ...g, role: "logic" as const })),
    }, ctl.signal).then(
      (l) => {
        if (ctl.signal.aborted) return;
        const w = box.current?.clientWidth ?? 800;
        const k = Math.min(1.4, Math.max(0.1, Math.min((w - 24) / Math.max(1, l.width), (height - 24) / Math.max(1, l.height))));
        // A drawing of a few hundred symbols is rendered in slices, so the page stays responsive meanwhile.
        startTransition(() => {
          setLayout(l);
          setError(null);
          setView({ x: 12, y: 12, k });
        });
      },
      (e: unknown) => {
        if (!ctl.signal.aborted) setError(e instanceof Error ? e.message : String(e));
      },
    );
    return () => ctl.abort();
  }, [netlist, height]);

  if (error) return <p role="alert" className="text-sm text-vermilion">The schematic could not be drawn: {error}</p>;
  if (!layout) {
    return (
      <div ref={box} className="flex items-center justify-center text-sm text-graphite" style={{ height }} data-testid="schematic-drawing">
        Drawing {netlist.gates.length} gate{netlist.gates.length === 1 ? "" : "s"}…
      </div>
    );
  }

  const k = zoom ?? view.k;
  const zoomBy = (f: number) =>
    onZoomChange ? onZoomChange(Math.min(4, Math.max(0.1, k * f))) : setView((v) => ({ ...v, k: Math.min(4, Math.max(0.1, v.k * f)) }));
  return (
    <div className="relative select-none" ref={box}>
      <div className="absolute right-2 top-2 z-10 flex gap-1">
        <button type="button" onClick={() => zoomBy(1.25)} className="rounded border border-rule bg-sheet px-2 text-sm" aria-label="Zoom in">+</button>
        <button type="button" onClick={() => zoomBy(0.8)} className="rounded border border-rule bg-sheet px-2 text-sm" aria-label="Zoom out">−</button>
        <button type="button" onClick={() => { setView({ x: 12, y: 12, k: 1 }); onZoomChange?.(1); }} className="rounded border border-rule bg-sheet px-2 text-xs" aria-label="Actual size">1:1</button>
      </div>
      <svg
        data-testid="schematic"
        className="sheet-grid w-full cursor-grab rounded border border-rule bg-paper active:cursor-grabbing"
        style={{ height }}
        onWheel={(e) => zoomBy(e.deltaY < 0 ? 1.1 : 0.9)}
        onPointerDown={(e) => {
          drag.current = { x: e.clientX, y: e.clientY, vx: view.x, vy: view.y };
        }}
        onPointerMove={(e) => {
          const d = drag.current;
          if (d) setView((v) => ({ ...v, x: d.vx + e.clientX - d.x, y: d.vy + e.clientY - d.y }));
        }}
        onPointerUp={() => (drag.current = null)}
        onPointerLeave={() => (drag.current = null)}
        role="img"
        aria-label={`Schematic with ${netlist.gates.length} gates`}
      >
        <g transform={`translate(${view.x},${view.y}) scale(${k})`}>
          {layout.edges.map((e) => (
            <polyline key={e.id} points={e.points.map((p) => `${p.x},${p.y}`).join(" ")} fill="none"
              className={critical.nets.has(e.net) ? "stroke-accent" : "stroke-graphite/70"}
              strokeWidth={critical.nets.has(e.net) ? 2 : 1}>
              <title>{e.net}</title>
            </polyline>
          ))}
          {layout.nodes.map((n) => (
            <NodeShape key={n.id} node={n} critical={critical.gates.has(n.id)} selected={selected === n.id}
              onSelect={onSelect} cut={n.kind === "input" && !!cut?.has(n.label)} />
          ))}
        </g>
      </svg>
      <p className="mt-1 text-xs text-graphite">
        {caption ?? `${netlist.gates.length} gates`} · drag to pan, wheel to zoom · <span className="text-accent">green</span>: critical path (estimated)
      </p>
    </div>
  );
}

function NodeShape({ node, critical, selected, onSelect, cut }: {
  node: LayoutNode;
  critical: boolean;
  selected: boolean;
  onSelect: (id: string) => void;
  /** A net whose driver is not drawn: a dashed port. */
  cut: boolean;
}) {
  if (node.kind !== "gate" || !node.type) {
    const isIn = node.kind !== "output";
    return (
      <g transform={`translate(${node.x},${node.y})`} data-node={node.id}>
        <path
          d={isIn
            ? `M0,0 H${node.width - 8} L${node.width},${node.height / 2} L${node.width - 8},${node.height} H0 Z`
            : `M8,0 H${node.width} V${node.height} H8 L0,${node.height / 2} Z`}
          className={cut ? "fill-paper stroke-graphite" : "fill-sheet stroke-ink"} strokeWidth={1} strokeDasharray={cut ? "3 2" : undefined} />
        <text x={isIn ? 4 : 12} y={node.height / 2 + 4} className={`font-mono text-[10px] ${cut ? "fill-graphite" : "fill-ink"}`}>
          {node.label}
          <title>{cut ? `${node.label}: driven by gates not drawn here (see the gate table)` : node.label}</title>
        </text>
      </g>
    );
  }
  const pins = node.ports.filter((p) => p.side === "in").sort((a, b) => (a.index ?? 0) - (b.index ?? 0));
  return (
    <g transform={`translate(${node.x},${node.y})`} data-gate={node.id} onClick={() => onSelect(node.id)}
      className="cursor-pointer">
      {selected && <rect x={-4} y={-4} width={node.width + 8} height={node.height + 8} className="fill-accent/10 stroke-accent" strokeDasharray="3 2" />}
      <GateSymbol type={node.type} width={node.width} height={node.height} pinYs={pins.map((p) => p.y - node.y)} highlighted={critical} />
      <text x={node.width / 2 - 6} y={node.height + 10} textAnchor="middle" className="fill-graphite font-mono text-[9px]">
        {node.id}
      </text>
      <title>{`${node.id}: ${node.type} (${pins.length} input${pins.length === 1 ? "" : "s"})`}</title>
    </g>
  );
}
