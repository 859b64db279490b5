"use client";
import type { RevisionSummary } from "@/lib/client/types";

/**
 * Gates and depth across revisions, drawn as two step lines on one sheet:
 * gates on the left scale, depth in gate levels on the right.
 */
export function RevisionChart({ revisions, height = 140 }: { revisions: RevisionSummary[]; height?: number }) {
  const revs = [...revisions].sort((a, b) => a.number - b.number);
  if (revs.length < 2) {
    return <p className="text-sm text-graphite">The chart appears once the design has two revisions.</p>;
  }
  const width = 560;
  const pad = { l: 36, r: 36, t: 12, b: 24 };
  const gates = revs.map((r) => r.stats.gates ?? 0);
  const depth = revs.map((r) => r.stats.depth ?? 0);
  const gMax = Math.max(1, ...gates);
  const dMax = Math.max(1, ...depth);
  const x = (i: number) => pad.l + (i * (width - pad.l - pad.r)) / (revs.length - 1);
  const yG = (v: number) => height - pad.b - (v / gMax) * (height - pad.t - pad.b);
  const yD = (v: number) => height - pad.b - (v / dMax) * (height - pad.t - pad.b);
  const line = (vals: number[], y: (v: number) => number) => vals.map((v, i) => `${i ? "L" : "M"}${x(i)},${y(v)}`).join(" ");
  return (
    <figure>
      <svg viewBox={`0 0 ${width} ${height}`} className="w-full max-w-2xl" role="img"
        aria-label={`Gates and depth over ${revs.length} revisions`} data-testid="revision-chart">
        <line x1={pad.l} x2={width - pad.r} y1={height - pad.b} y2={height - pad.b} className="stroke-rule" />
        {[0, 0.5, 1].map((f) => (
          <g key={f}>
            <line x1={pad.l} x2={width - pad.r} y1={yG(gMax * f)} y2={yG(gMax * f)} className="stroke-rule/50" strokeDasharray="2 3" />
            <text x={pad.l - 6} y={yG(gMax * f) + 4} textAnchor="end" className="fill-accent font-mono text-[10px]">
              {Math.round(gMax * f)}
            </text>
            <text x={width - pad.r + 6} y={yD(dMax * f) + 4} className="fill-graphite font-mono text-[10px]">
              {Math.round(dMax * f * 10) / 10}
            </text>
          </g>
        ))}
        <path d={line(gates, yG)} fill="none" className="stroke-accent" strokeWidth={2} />
        <path d={line(depth, yD)} fill="none" className="stroke-graphite" strokeWidth={1.5} strokeDasharray="5 3" />
        {revs.map((r, i) => (
          <g key={r.number}>
            <circle cx={x(i)} cy={yG(gates[i]!)} r={3} className="fill-accent">
              <title>{`r${r.number}: ${gates[i]} gates, depth ${depth[i]} — ${r.message}`}</title>
            </circle>
            <text x={x(i)} y={height - 8} textAnchor="middle" className="fill-graphite font-mono text-[10px]">
              r{r.number}
            </text>
          </g>
        ))}
      </svg>
      <figcaption className="mt-1 flex gap-4 text-xs text-graphite">
        <span><span className="inline-block h-0.5 w-4 bg-accent align-middle" /> gates (left)</span>
        <span><span className="inline-block h-0.5 w-4 border-t border-dashed border-graphite align-middle" /> depth in gate levels (right)</span>
      </figcaption>
    </figure>
  );
}
