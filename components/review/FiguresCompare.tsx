"use client";
import { directionOf, type Comparison } from "@/lib/review";
import { DIRECTION_WORDS, FIGURE_LABELS, SETTING_LABELS, directionClass, fmtDelta, fmtFigure, fmtSetting, powerUnit } from "./format";

const th = "px-2 py-1.5";

/**
 * The rows of the figures with their signed changes and the heaviest load, for
 * a table whose head is Figure, the two sides and Change: the compare view's,
 * and the workbench's "moving a block to a newer revision". `cell` pads each cell.
 */
export function FigureRows({ comparison: c, cell, rowClass = "" }: { comparison: Comparison; cell: string; rowClass?: string }) {
  return (
    <>
      {c.figures.map((r) => {
        const unit = r.key === "staticMw" || r.key === "dynamicMw" ? powerUnit(r.from, r.to) : undefined;
        return (
          <tr key={r.key} className={rowClass} data-figure={r.key} data-direction={r.direction}>
            <td className={cell}>
              {FIGURE_LABELS[r.key].label}
              {FIGURE_LABELS[r.key].estimate && <span className="text-graphite"> (est.)</span>}
            </td>
            <td className={`${cell} text-right font-mono`}>{fmtFigure(r.key, r.from, unit)}</td>
            <td className={`${cell} text-right font-mono`}>{fmtFigure(r.key, r.to, unit)}</td>
            <td className={`${cell} text-right font-mono font-semibold ${directionClass(r.direction)}`} title={DIRECTION_WORDS[r.direction]}>
              {fmtDelta(r.key, r.delta, unit)}
            </td>
          </tr>
        );
      })}
      <tr className={rowClass} data-figure="load" data-direction={c.load.direction}>
        <td className={cell}>Heaviest load / fan-out limit <span className="text-graphite">(est.)</span></td>
        {[c.load.from, c.load.to].map((x, i) => (
          <td key={i} className={`${cell} text-right font-mono ${x.over ? "text-vermilion" : ""}`}>
            {x.load} / {x.limit ?? "—"}{x.over ? " over" : ""}
          </td>
        ))}
        <td className={`${cell} text-right font-mono font-semibold ${directionClass(c.load.direction)}`} title={DIRECTION_WORDS[c.load.direction]}>
          {fmtDelta("load", c.load.delta)}
        </td>
      </tr>
    </>
  );
}

/** The figures of both sides with signed changes, the outputs' covers, what changed in family and settings, and the netlist. */
export function FiguresCompare({ comparison: c, fromLabel, toLabel }: { comparison: Comparison; fromLabel: string; toLabel: string }) {
  return (
    <div className="space-y-4">
      <table className="w-full text-sm" data-testid="figures-compare">
        <thead className="border-b border-rule text-left text-xs uppercase tracking-wide text-graphite">
          <tr>
            <th className={th}>Figure</th>
            <th className={`${th} text-right normal-case`}>{fromLabel}</th>
            <th className={`${th} text-right normal-case`}>{toLabel}</th>
            <th className={`${th} text-right`}>Change</th>
          </tr>
        </thead>
        <tbody className="tabular">
          <FigureRows comparison={c} cell="px-2 py-1" rowClass="border-b border-rule/50" />
          <tr data-figure="exact" data-direction={c.exact.direction}>
            <td className="px-2 py-1">Cover</td>
            <td className="px-2 py-1 text-right">{c.exact.from ? "exact" : "heuristic"}</td>
            <td className="px-2 py-1 text-right">{c.exact.to ? "exact" : "heuristic"}</td>
            <td className={`px-2 py-1 text-right ${directionClass(c.exact.direction)}`}>{c.exact.direction === "same" ? "" : DIRECTION_WORDS[c.exact.direction]}</td>
          </tr>
        </tbody>
      </table>
      <p className="text-xs text-graphite">
        Delay, power and load figures are estimates from each family&apos;s typical data; check the parts&apos; data sheets and your own design rules.
        Fewer is counted as better: <span className="text-accent">green</span> better, <span className="text-vermilion">vermilion</span> worse.
      </p>

      {(c.family || c.settings.length > 0) && (
        <div data-testid="setting-changes">
          <h3 className="mb-1 text-xs uppercase tracking-wide text-graphite">Family and settings changed</h3>
          <ul className="space-y-0.5 text-sm">
            {c.family && (
              <li>
                Family: <span className="text-graphite">{c.family.from.name}</span> → <span className="font-semibold">{c.family.to.name}</span>
              </li>
            )}
            {c.settings.map((s) => (
              <li key={s.key}>
                {SETTING_LABELS[s.key] ?? s.key}: <span className="font-mono text-graphite">{fmtSetting(s.from)}</span> →{" "}
                <span className="font-mono font-semibold">{fmtSetting(s.to)}</span>
              </li>
            ))}
          </ul>
        </div>
      )}

      <div>
        <h3 className="mb-1 text-xs uppercase tracking-wide text-graphite">Outputs</h3>
        {c.outputs ? (
          <table className="w-full text-sm" data-testid="outputs-compare">
            <thead className="border-b border-rule text-left text-xs text-graphite">
              <tr>
                <th className={th}>Output</th>
                <th className={`${th} text-right`}>Terms</th>
                <th className={`${th} text-right`}>Literals</th>
                <th className={th}>Cover</th>
              </tr>
            </thead>
            <tbody className="font-mono tabular">
              {c.outputs.map((o) => (
                <tr key={o.name} className="border-b border-rule/50" data-output={o.name} data-direction={o.direction}>
                  <td className="px-2 py-1">{o.name}</td>
                  <td className="px-2 py-1 text-right">
                    {o.from?.products ?? "—"} → {o.to?.products ?? "—"}{" "}
                    {o.delta && <span className={directionClass(directionOf(o.delta.products))}>({fmtDelta("products", o.delta.products)})</span>}
                  </td>
                  <td className="px-2 py-1 text-right">
                    {o.from?.literals ?? "—"} → {o.to?.literals ?? "—"}{" "}
                    {o.delta && <span className={directionClass(directionOf(o.delta.literals))}>({fmtDelta("literals", o.delta.literals)})</span>}
                  </td>
                  <td className="px-2 py-1 font-sans text-xs">
                    {o.from && o.to
                      ? o.from.exact === o.to.exact
                        ? o.to.exact ? "exact" : "heuristic"
                        : `${o.from.exact ? "exact" : "heuristic"} → ${o.to.exact ? "exact" : "heuristic"}`
                      : !c.outputsRecorded.from ? `not recorded for ${fromLabel}`
                        : !c.outputsRecorded.to ? `not recorded for ${toLabel}`
                          : o.to ? "added" : "removed"}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        ) : (
          <p className="text-sm text-graphite">These revisions were saved before per-output figures were kept.</p>
        )}
      </div>

      <div>
        <h3 className="mb-1 text-xs uppercase tracking-wide text-graphite">
          Netlist: {c.netlist.added} gate{c.netlist.added === 1 ? "" : "s"} added, {c.netlist.removed} removed
        </h3>
        <table className="w-full text-sm" data-testid="netlist-compare">
          <thead className="border-b border-rule text-left text-xs text-graphite">
            <tr>
              <th className={th}>Gate</th>
              <th className={`${th} text-right`}>Width</th>
              <th className={`${th} text-right`}>{fromLabel}</th>
              <th className={`${th} text-right`}>{toLabel}</th>
              <th className={`${th} text-right`}>Added</th>
              <th className={`${th} text-right`}>Removed</th>
            </tr>
          </thead>
          <tbody className="font-mono tabular">
            {c.netlist.rows.map((r) => (
              <tr key={`${r.type}/${r.width}`} className="border-b border-rule/50" data-gate-kind={`${r.type}/${r.width}`}>
                <td className="px-2 py-1">{r.type}</td>
                <td className="px-2 py-1 text-right">{r.width}</td>
                <td className="px-2 py-1 text-right">{r.from}</td>
                <td className="px-2 py-1 text-right">{r.to}</td>
                <td className={`px-2 py-1 text-right ${r.added ? "text-vermilion" : "text-graphite"}`}>{r.added ? `+${r.added}` : "·"}</td>
                <td className={`px-2 py-1 text-right ${r.removed ? "text-accent" : "text-graphite"}`}>{r.removed ? `\u2212${r.removed}` : "·"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
