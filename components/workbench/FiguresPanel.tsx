"use client";
import { memo } from "react";
import type { Analysis } from "./types";
import { fmtMw, fmtNs } from "@/components/workspace/format";
import { VERDICT_WORDS } from "@/lib/families/compat";

/** Counts, depth, delay and power, each estimate with its formula and the caution beside it. */
function FiguresPanelView({ analysis }: { analysis: Analysis }) {
  const est = [
    { label: "Critical path delay", value: fmtNs(analysis.criticalPath.delay.value), e: analysis.criticalPath.delay },
    { label: "Static power", value: fmtMw(analysis.staticPower.value), e: analysis.staticPower },
    { label: "Dynamic power", value: fmtMw(analysis.dynamicPower.value), e: analysis.dynamicPower },
  ];
  return (
    <div className="space-y-4" data-testid="figures">
      <dl className="grid grid-cols-2 gap-px overflow-hidden rounded border border-rule bg-rule sm:grid-cols-4">
        {[
          ["Gates", analysis.gates],
          ["Depth (levels)", analysis.depth],
          ["Packages", analysis.packages ?? "—"],
          ["Transistors", analysis.transistors ?? "—"],
        ].map(([k, v]) => (
          <div key={k} className="bg-sheet px-3 py-2">
            <dt className="text-xs text-graphite">{k}</dt>
            <dd className="font-mono text-lg tabular">{v}</dd>
          </div>
        ))}
      </dl>
      {(analysis.packagesNote || analysis.transistorsNote) && (
        <p className="text-xs text-graphite">{[analysis.packagesNote, analysis.transistorsNote].filter(Boolean).join(" ")}</p>
      )}
      <table className="w-full text-sm">
        <thead className="border-b border-rule text-left text-xs uppercase tracking-wide text-graphite">
          <tr><th className="py-1">Gate</th><th className="py-1 text-right">Width</th><th className="py-1 text-right">Count</th><th className="py-1 text-right">Per package</th><th className="py-1 text-right">Packages</th></tr>
        </thead>
        <tbody className="font-mono tabular">
          {analysis.byTypeWidth.map((r) => (
            <tr key={`${r.type}${r.width}`} className="border-b border-rule/50">
              <td className="py-1">{r.type}</td>
              <td className="py-1 text-right">{r.width}</td>
              <td className="py-1 text-right">{r.count}</td>
              <td className="py-1 text-right">{r.perPackage ?? "—"}</td>
              <td className="py-1 text-right">{r.packages ?? "—"}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <div className="space-y-2">
        {est.map(({ label, value, e }) => (
          <div key={label} className="rounded border border-rule bg-paper px-3 py-2">
            <div className="flex items-baseline justify-between">
              <span className="text-sm font-semibold">{label} <span className="font-normal text-graphite">(estimate)</span></span>
              <span className="font-mono tabular">{value}</span>
            </div>
            <div className="mt-0.5 font-mono text-xs text-graphite">{e.formula}</div>
            {e.note && <div className="text-xs text-graphite">{e.note}</div>}
          </div>
        ))}
        {(analysis.boundaries ?? []).map((b) => (
          <div key={b.side} data-testid={`boundary-${b.side}`} data-verdict={b.verdict}
            className={`rounded border px-3 py-2 ${b.verdict === "compatible" ? "border-rule bg-paper" : b.verdict === "not-compatible" ? "border-vermilion/50 bg-vermilion/10" : "border-amber/50 bg-amber/10"}`}>
            <div className="flex items-baseline justify-between gap-2">
              <span className="text-sm font-semibold">
                {b.side === "inputs" ? `Inputs driven by ${b.driver.name}` : `Outputs driving ${b.receiver.name}`}{" "}
                <span className="font-normal text-graphite">(estimate)</span>
              </span>
              <span className="font-mono text-sm">{VERDICT_WORDS[b.verdict]}</span>
            </div>
            <div className="mt-0.5 font-mono text-xs text-graphite">
              NMH {b.nmhV ?? "—"} V · NML {b.nmlV ?? "—"} V · one output feeds {b.fanOutHigh ?? "—"} inputs high, {b.fanOutLow ?? "—"} low
              {b.perOutput !== null ? ` · ${b.at === "each output" ? "each output drives" : `${b.at} feeds`} ${b.load} of at most ${b.perOutput}` : ""}
            </div>
            <details className="mt-0.5 text-xs text-graphite">
              <summary className="cursor-pointer">formulas</summary>
              <ul className="font-mono">{b.formulas.map((f, i) => <li key={i}>{f}</li>)}</ul>
            </details>
            {b.messages.map((m, i) => <div key={i} className="text-xs">{m}</div>)}
          </div>
        ))}
        <p className="rounded border border-amber/40 bg-amber/10 px-3 py-2 text-xs text-ink">{analysis.caution}</p>
      </div>
      {analysis.criticalPath.gates.length > 0 && (
        <p className="text-xs text-graphite">
          Critical path ({analysis.criticalPath.levels} levels): <span className="font-mono">{analysis.criticalPath.nets.join(" → ")}</span>
        </p>
      )}
    </div>
  );
}

/** Drawn again only when its own inputs change, not at every keystroke in the editor. */
export const FiguresPanel = memo(FiguresPanelView);
