"use client";
import useSWR from "swr";
import type { FamilyItem } from "@/lib/client/types";

type Figures = Record<string, unknown>;
const num = (v: unknown) => (typeof v === "number" ? v : null);

/** The families a design may use, with the two limits that shape every netlist. */
export function FamilyList({ ws, compact = false }: { ws: string; compact?: boolean }) {
  const { data, error } = useSWR<{ items: FamilyItem[] }>(`/api/v1/workspaces/${ws}/families`);
  if (error) return <p role="alert" className="text-sm text-vermilion">{error.message}</p>;
  return (
    <section>
      <h2 className={compact ? "mb-3 text-sm font-semibold uppercase tracking-wide text-graphite" : "mb-3 text-xl font-semibold"}>
        Logic families
      </h2>
      <div className="overflow-x-auto rounded border border-rule bg-sheet">
        <table className="w-full text-sm" data-testid="family-table">
          <thead className="border-b border-rule text-left text-xs uppercase tracking-wide text-graphite">
            <tr>
              <th className="px-3 py-2">Family</th>
              <th className="px-3 py-2 text-right" title="widest gate on offer">Fan-in</th>
              <th className="px-3 py-2 text-right" title="unit loads one output may drive">Fan-out</th>
              {!compact && (
                <>
                  <th className="px-3 py-2 text-right">Supply</th>
                  <th className="px-3 py-2 text-right">NMH</th>
                  <th className="px-3 py-2 text-right">NML</th>
                  <th className="px-3 py-2 text-right">t<sub>pd</sub> (est.)</th>
                </>
              )}
            </tr>
          </thead>
          <tbody className="tabular">
            {data?.items.map((f) => {
              const d = f.data as Figures;
              const vcc = num(d.supplyV);
              const [voh, vih, vil, vol] = [num(d.vohMin), num(d.vihMin), num(d.vilMax), num(d.volMax)];
              const nmh = voh !== null && vih !== null ? voh - vih : null;
              const nml = vil !== null && vol !== null ? vil - vol : null;
              return (
                <tr key={f.id} className="border-b border-rule/60 last:border-0">
                  <td className="px-3 py-2">
                    {f.name}
                    {!f.builtin && <span className="ml-2 text-xs text-graphite">(this workspace)</span>}
                  </td>
                  <td className="px-3 py-2 text-right font-mono">{f.fanIn}</td>
                  <td className="px-3 py-2 text-right font-mono">{f.fanOut}</td>
                  {!compact && (
                    <>
                      <td className="px-3 py-2 text-right font-mono">{vcc !== null ? `${vcc} V` : "—"}</td>
                      <td className="px-3 py-2 text-right font-mono">{nmh !== null ? `${nmh.toFixed(2)} V` : "—"}</td>
                      <td className="px-3 py-2 text-right font-mono">{nml !== null ? `${nml.toFixed(2)} V` : "—"}</td>
                      <td className="px-3 py-2 text-right font-mono">
                        {num(d.intrinsicNs) !== null ? `${num(d.intrinsicNs)} ns` : "—"}
                      </td>
                    </>
                  )}
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-xs text-graphite">
        Figures are typical values from handbook tables and standards, marked with their sources in each family. Check the
        data sheets of the parts you use.
      </p>
    </section>
  );
}
