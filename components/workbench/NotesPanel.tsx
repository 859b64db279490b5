"use client";
import type { Analysis, Diagnostic } from "./types";

/** Diagnostics of the source, the mapper's and analysis's warnings, and nets near or over their limit. */
export function NotesPanel({ diagnostics, warnings, analysis }: {
  diagnostics: Diagnostic[];
  warnings: string[];
  analysis: Analysis | null;
}) {
  const tight = (analysis?.loads ?? []).filter((l) => l.status !== "ok");
  if (!diagnostics.length && !warnings.length && !tight.length) {
    return <p className="text-sm text-graphite">Nothing to note: no diagnostics, and every net is within its driver&apos;s fan-out.</p>;
  }
  return (
    <ul className="space-y-1.5 text-sm" data-testid="notes">
      {diagnostics.map((d, i) => (
        <li key={`d${i}`} className={d.severity === "error" ? "text-vermilion" : "text-amber"}>
          <span className="font-mono text-xs">{d.line}:{d.column}</span> {d.message}
        </li>
      ))}
      {warnings.map((w, i) => (
        <li key={`w${i}`} className="text-amber">{w}</li>
      ))}
      {tight.map((l) => (
        <li key={l.net} className={l.status === "over" ? "text-vermilion" : "text-graphite"}>
          net <span className="font-mono">{l.net}</span> carries {l.load} of {l.limit} unit loads ({l.status === "over" ? "over the limit" : "at the limit"})
        </li>
      ))}
    </ul>
  );
}
