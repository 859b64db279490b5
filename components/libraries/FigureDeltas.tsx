import type { FigureDeltaItem } from "@/lib/client/types";

function fmt(v: number | null, unit: string): string {
  if (v === null) return "—";
  const digits = unit === "ns" ? 1 : unit === "mW" ? 2 : 0;
  return `${v.toFixed(digits)}${unit && unit !== "levels" ? ` ${unit}` : ""}`;
}

function signed(d: number | null, unit: string): string {
  if (d === null) return "—";
  if (d === 0) return "±0";
  const digits = unit === "ns" ? 1 : unit === "mW" ? 2 : 0;
  const text = Math.abs(d).toFixed(digits);
  return `${d < 0 ? "−" : "+"}${text}${unit && unit !== "levels" ? ` ${unit}` : ""}`;
}

/**
 * The figures of two block revisions side by side with their signed change:
 * lower is better for each, so a drop reads in the accent, a rise in vermilion.
 */
export function FigureDeltas({ deltas, fromLabel, toLabel, testId }: { deltas: FigureDeltaItem[]; fromLabel: string; toLabel: string; testId?: string }) {
  return (
    <table className="text-xs tabular" data-testid={testId}>
      <thead className="text-left uppercase tracking-wide text-graphite">
        <tr>
          <th className="pr-4 font-semibold">Figure</th>
          <th className="pr-4 text-right font-semibold">{fromLabel}</th>
          <th className="pr-4 text-right font-semibold">{toLabel}</th>
          <th className="text-right font-semibold">Change</th>
        </tr>
      </thead>
      <tbody className="font-mono">
        {deltas.map((d) => (
          <tr key={d.figure}>
            <td className="pr-4 font-sans">{d.label}{d.figure === "delayNs" || d.figure === "powerMw" ? " (est.)" : ""}</td>
            <td className="pr-4 text-right">{fmt(d.from, d.unit)}</td>
            <td className="pr-4 text-right">{fmt(d.to, d.unit)}</td>
            <td className={`text-right ${d.delta === null || d.delta === 0 ? "text-graphite" : d.delta < 0 ? "text-accent" : "text-vermilion"}`}
              data-figure={d.figure}>
              {signed(d.delta, d.unit)}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
