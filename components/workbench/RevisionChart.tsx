"use client";
import type { RevisionSummary } from "@/lib/client/types";

/**
 * Round tick values from 0 to at least `max`: steps of 1, 2 or 5 times a power
 * of ten (whole numbers only, as gate counts and levels are), at most about
 * `count` of them. Each tick is drawn at its own value.
 */
export function niceTicks(max: number, count = 4): number[] {
  const top = Math.max(1, Math.ceil(max));
  const raw = top / count;
  const p = 10 ** Math.floor(Math.log10(raw));
  const step = Math.max(1, [1, 2, 5, 10].map((m) => m * p).find((s) => s >= raw) ?? 10 * p);
  const ticks: number[] = [];
  for (let v = 0; v < top + step; v += step) {
    ticks.push(v);
    if (v >= top) break;
  }
  return ticks;
}

/**
 * Gates and depth across revisions, drawn as two lines on one sheet: gates on
 * the left scale, depth in gate levels on the right, each point labelled with
 * its value.
 */
export function RevisionChart({ revisions, height = 160 }: { revisions: RevisionSummary[]; height?: number }) {
  const revs = [...revisions].sort((a, b) => a.number - b.number);
  if (revs.length < 2) {
    return <p className="text-sm text-graphite">The chart appears once the design has two revisions.</p>;
  }
  const width = 560;
  const pad = { l: 40, r: 36, t: 18, b: 24 };
  const gates = revs.map((r) => r.stats.gates ?? 0);
  const depth = revs.map((r) => r.stats.depth ?? 0);
  const gTicks = niceTicks(Math.max(...gates));
  const dTicks = niceTicks(Math.max(...depth), 3);
  const gTop = gTicks.at(-1)!;
  const dTop = dTicks.at(-1)!;
  const x = (i: number) => pad.l + (i * (width - pad.l - pad.r)) / (revs.length - 1);
  const yG = (v: number) => height - pad.b - (v / gTop) * (height - pad.t - pad.b);
  const yD = (v: number) => height - pad.b - (v / dTop) * (height - pad.t - pad.b);
  const line = (vals: number[], y: (v: number) => number) => vals.map((v, i) => `${i ? "L" : "M"}${x(i)},${y(v)}`).join(" ");
  return (
    <figure>
      <svg viewBox={`0 0 ${width} ${height}`} className="w-full max-w-2xl" role="img"
        aria-label={`Gates and depth over ${revs.length} revisions`} data-testid="revision-chart">
        {gTicks.map((v) => (
          <g key={`g${v}`}>
            <line x1={pad.l} x2={width - pad.r} y1={yG(v)} y2={yG(v)} className={v === 0 ? "stroke-rule" : "stroke-rule/50"}
              strokeDasharray={v === 0 ? undefined : "2 3"} />
            <text x={pad.l - 6} y={yG(v) + 3.5} textAnchor="end" className="fill-accent font-mono text-[10px]" data-tick="gates">{v}</text>
          </g>
        ))}
        {dTicks.map((v) => (
          <text key={`d${v}`} x={width - pad.r + 6} y={yD(v) + 3.5} className="fill-graphite font-mono text-[10px]" data-tick="depth">{v}</text>
        ))}
        <path d={line(gates, yG)} fill="none" className="stroke-accent" strokeWidth={2} />
        <path d={line(depth, yD)} fill="none" className="stroke-graphite" strokeWidth={1.5} strokeDasharray="5 3" />
        {revs.map((r, i) => (
          <g key={r.number}>
            <circle cx={x(i)} cy={yG(gates[i]!)} r={3} className="fill-accent">
              <title>{`r${r.number}: ${gates[i]} gates, depth ${depth[i]} — ${r.message}`}</title>
            </circle>
            <text x={x(i)} y={yG(gates[i]!) - 6} textAnchor="middle" className="fill-accent font-mono text-[10px]" data-value="gates">
              {gates[i]}
            </text>
            <circle cx={x(i)} cy={yD(depth[i]!)} r={2.5} className="fill-graphite" />
            <text x={x(i) + 5} y={yD(depth[i]!) + 11} className="fill-graphite font-mono text-[9px]" data-value="depth">
              {depth[i]}
            </text>
            <text x={x(i)} y={height - 8} textAnchor="middle" className="fill-graphite font-mono text-[10px]">
              r{r.number}
            </text>
          </g>
        ))}
      </svg>
      <figcaption className="mt-1 flex gap-4 text-xs text-graphite">
        <span><span className="inline-block h-0.5 w-4 bg-accent align-middle" /> gates (left scale)</span>
        <span><span className="inline-block h-0.5 w-4 border-t border-dashed border-graphite align-middle" /> depth in gate levels (right scale)</span>
      </figcaption>
    </figure>
  );
}
