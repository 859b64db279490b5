"use client";
import type { Analysis, Diagnostic } from "./types";

/** Nets near or over their limit listed one by one; the rest are counted. */
const TIGHT_NETS_LISTED = 200;

/** Diagnostics of the source, why the last compile stopped, the mapper's and analysis's warnings, and nets near or over their limit. */
export function NotesPanel({ diagnostics, warnings, analysis, stop }: {
  diagnostics: Diagnostic[];
  warnings: string[];
  analysis: Analysis | null;
  /** Why there is no result for the text on screen, when the compile stopped or failed. */
  stop?: string | null;
}) {
  const tight = (analysis?.loads ?? []).filter((l) => l.status !== "ok");
  if (!diagnostics.length && !warnings.length && !tight.length && !stop) {
    return analysis
      ? <p className="text-sm text-graphite">Nothing to note: no diagnostics, and every net is within its driver&apos;s fan-out.</p>
      : <p className="text-sm text-graphite">No diagnostics in the equations; the notes on loads come with a result.</p>;
  }
  return (
    <ul className="space-y-1.5 text-sm" data-testid="notes">
      {stop && <li className="text-amber">{stop}</li>}
      {diagnostics.map((d, i) => (
        <li key={`d${i}`} className={d.severity === "error" ? "text-vermilion" : "text-amber"}>
          <span className="font-mono text-xs">{d.line}:{d.column}</span> {d.message}
        </li>
      ))}
      {warnings.map((w, i) => (
        <li key={`w${i}`} className="text-amber">{w}</li>
      ))}
      {tight.slice(0, TIGHT_NETS_LISTED).map((l) => (
        <li key={l.net} className={l.status === "over" ? "text-vermilion" : "text-graphite"}>
          net <span className="font-mono">{l.net}</span> carries {l.load} of {l.limit} unit loads ({l.status === "over" ? "over the limit" : "at the limit"})
        </li>
      ))}
      {tight.length > TIGHT_NETS_LISTED && (
        <li className="text-graphite">… and {tight.length - TIGHT_NETS_LISTED} more nets at or over their limit (see the gate table).</li>
      )}
    </ul>
  );
}
