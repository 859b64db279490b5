"use client";
import { memo } from "react";
import type { StructureFigures } from "@/lib/api/compile-schema";
import type { WorkbenchSettings } from "./types";
import { fmtInt, fmtMw, fmtNs } from "@/components/workspace/format";

type Structure = StructureFigures["structure"];
type Aim = NonNullable<WorkbenchSettings["aim"]>;

const TITLES: Record<Structure, string> = { "two-level": "Two-level", factored: "Factored" };

/** How the factored structure was reached, in words (lib/factor/README.md). */
const BUILT_WORDS: Record<NonNullable<StructureFigures["built"]>, string> = {
  decomposed: "decomposed on its inputs, exclusive-ors and shared sub-functions split off",
  algebraic: "covers factored algebraically, common terms shared",
  "two-level": "factoring found nothing better by the aim; the two-level netlist",
};

interface Row {
  label: string;
  value: (s: StructureFigures) => number | null;
  show: (v: number | null) => string;
  estimate?: boolean;
}

const ROWS: Row[] = [
  { label: "Gates", value: (s) => s.gates, show: fmtInt },
  { label: "Levels", value: (s) => s.levels, show: fmtInt },
  { label: "Packages", value: (s) => s.packages, show: fmtInt },
  { label: "Transistors", value: (s) => s.transistors, show: fmtInt },
  { label: "Critical path delay", value: (s) => s.delayNs, show: fmtNs, estimate: true },
  { label: "Static power", value: (s) => s.staticMw, show: fmtMw, estimate: true },
  { label: "Dynamic power", value: (s) => s.dynamicMw, show: fmtMw, estimate: true },
];

/**
 * The two-level and the factored structure side by side, and the designer's
 * choice of the one the revision keeps (settings.structure) and of what
 * factoring aims at (settings.aim). The smaller figure of each row is marked.
 */
function StructuresPanelView({ structures, settings, onChange, readOnly }: {
  structures: StructureFigures[];
  settings: WorkbenchSettings;
  onChange: (s: WorkbenchSettings) => void;
  readOnly: boolean;
}) {
  const keep: Structure = settings.structure ?? "two-level";
  const aim: Aim = settings.aim ?? "gates";
  const set = (patch: Partial<WorkbenchSettings>) => {
    const next: WorkbenchSettings = { ...settings, ...patch };
    // defaults are left out, as the other settings do
    if (next.structure === "two-level") delete next.structure;
    if (next.aim === "gates") delete next.aim;
    onChange(next);
  };
  const columns = (["two-level", "factored"] as const).map((k) => ({ key: k, figures: structures.find((s) => s.structure === k) ?? null }));
  const factored = columns[1]!.figures;
  const built = columns.flatMap((c) => (c.figures ? [c.figures] : []));
  return (
    <div className="text-sm" data-testid="structures">
      <div className="mb-2 flex flex-wrap items-baseline gap-x-4 gap-y-1">
        <h2 className="text-xs uppercase tracking-wide text-graphite">Two-level or factored</h2>
        <label className="flex items-center gap-1.5 text-xs text-graphite">
          Factor for
          <select className="rounded border border-rule bg-paper px-1.5 py-0.5 text-xs text-ink disabled:opacity-70" value={aim} disabled={readOnly}
            onChange={(e) => set({ aim: e.target.value as Aim })}>
            <option value="gates">fewest gates</option>
            <option value="levels">fewest levels</option>
          </select>
        </label>
        {factored?.built && <span className="text-xs text-graphite" data-testid="factored-how">Factored: {BUILT_WORDS[factored.built]}.</span>}
      </div>
      <table className="w-full border-collapse">
        <thead>
          <tr className="border-b border-rule text-left">
            <th className="w-1/3 py-1 text-xs font-normal text-graphite" scope="col"><span className="sr-only">Figure</span></th>
            {columns.map(({ key, figures }) => (
              <th key={key} scope="col" data-structure={key} data-kept={keep === key}
                className={`px-2 py-1 text-right ${keep === key ? "bg-accent/10" : ""}`}>
                <label className={`inline-flex items-center gap-1.5 ${readOnly || !figures ? "" : "cursor-pointer"}`}>
                  <input type="radio" name="structure" value={key} checked={keep === key} disabled={readOnly || !figures}
                    aria-label={`Keep the ${TITLES[key].toLowerCase()} structure`} onChange={() => set({ structure: key })} />
                  <span className="font-semibold">{TITLES[key]}</span>
                </label>
                <div className="text-[11px] font-normal text-graphite">
                  {keep === key ? "kept in the revision" : figures ? "" : "not built"}
                  {figures && !figures.verified ? " · not verified" : ""}
                </div>
              </th>
            ))}
          </tr>
        </thead>
        <tbody className="font-mono tabular">
          {ROWS.map((row) => {
            const values = columns.map((c) => (c.figures ? row.value(c.figures) : null));
            const known = values.filter((v): v is number => v !== null);
            const best = known.length === 2 && known[0] !== known[1] ? Math.min(...known) : null;
            return (
              <tr key={row.label} className="border-b border-rule/50 last:border-0">
                <th scope="row" className="py-1 text-left font-sans text-xs font-normal text-graphite">
                  {row.label}{row.estimate ? " (estimate)" : ""}
                </th>
                {columns.map(({ key }, i) => (
                  <td key={key} data-structure={key} data-figure={row.label}
                    className={`px-2 py-1 text-right ${keep === key ? "bg-accent/10" : ""} ${best !== null && values[i] === best ? "font-semibold text-accent" : ""}`}>
                    {columns[i]!.figures ? row.show(values[i] ?? null) : "—"}
                  </td>
                ))}
              </tr>
            );
          })}
        </tbody>
      </table>
      <p className="mt-2 text-xs text-graphite">
        {built.every((s) => s.verified)
          ? built.length > 1 ? "Both netlists are proven equal to the equations. " : "The netlist is proven equal to the equations. "
          : "A netlist here did not pass the proof against the equations; do not build it. "}
        Delay and power are estimates from the family&apos;s typical data: check the parts&apos; data sheets and your own
        design rules.
      </p>
    </div>
  );
}

/** Drawn again only when its own inputs change, not at every keystroke in the editor. */
export const StructuresPanel = memo(StructuresPanelView);
