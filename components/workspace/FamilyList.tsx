"use client";
import Link from "next/link";
import { useState } from "react";
import useSWR from "swr";
import type { FamilyItem, WorkspaceInfo } from "@/lib/client/types";
import { can } from "@/lib/auth/permissions";
import { deriveFamily, type DerivedFigure, type Family } from "@/lib/families";

/** A derived figure with the formula that gave it, so a designer can check the arithmetic. */
function Figure({ f, digits = 0 }: { f: DerivedFigure; digits?: number }) {
  if (f.value === null) return <span className="text-graphite" title={f.missing ?? f.formula}>—</span>;
  return (
    <span>
      <span className="font-mono">{digits ? f.value.toFixed(digits) : f.value} {f.unit === "unit loads" ? "" : f.unit}</span>
      <span className="mt-0.5 block font-mono text-[11px] leading-tight text-graphite">{f.formula}</span>
    </span>
  );
}

/** The families a design may use, with the two limits that shape every netlist. */
export function FamilyList({ ws, compact = false }: { ws: string; compact?: boolean }) {
  const { data, error } = useSWR<{ items: FamilyItem[] }>(`/api/v1/workspaces/${ws}/families`);
  const { data: wsData } = useSWR<{ workspace: WorkspaceInfo }>(compact ? null : `/api/v1/workspaces/${ws}`);
  const [archived, setArchived] = useState(false);
  const mayManage = wsData ? can(wsData.workspace.role, "family.manage") : false;
  if (error) return <p role="alert" className="text-sm text-vermilion">{error.message}</p>;
  const items = (data?.items ?? []).filter((f) => (archived ? f.archivedAt !== null : f.archivedAt === null));
  const archivedCount = (data?.items ?? []).filter((f) => f.archivedAt !== null).length;
  return (
    <section>
      <div className="mb-3 flex flex-wrap items-center gap-3">
        <h2 className={compact ? "mr-auto text-sm font-semibold uppercase tracking-wide text-graphite" : "mr-auto text-xl font-semibold"}>
          {archived ? "Archived families" : "Logic families"}
        </h2>
        {!compact && (
          <>
            <Link href={`/w/${ws}/families/matrix`} className="text-sm text-accent hover:underline">Compatibility matrix</Link>
            {(archivedCount > 0 || archived) && (
              <label className="flex items-center gap-1.5 text-sm text-graphite">
                <input type="checkbox" checked={archived} onChange={(e) => setArchived(e.target.checked)} />
                Archived ({archivedCount})
              </label>
            )}
            {mayManage && (
              <Link href={`/w/${ws}/families/new`} className="rounded bg-accent px-3 py-1.5 text-sm font-semibold text-paper hover:opacity-90">
                New family
              </Link>
            )}
          </>
        )}
      </div>
      <div className="overflow-x-auto rounded border border-rule bg-sheet">
        <table className="w-full text-sm" data-testid="family-table">
          <thead className="border-b border-rule text-left text-xs uppercase tracking-wide text-graphite">
            <tr>
              <th className="px-3 py-2">Family</th>
              <th className="px-3 py-2 text-right" title="widest gate on offer">Fan-in</th>
              <th className="px-3 py-2 text-right" title="unit loads one output may drive">Fan-out</th>
              {!compact && (
                <>
                  <th className="px-3 py-2">DC fan-out</th>
                  <th className="px-3 py-2">AC fan-out (edge rate)</th>
                  <th className="px-3 py-2">NMH</th>
                  <th className="px-3 py-2">NML</th>
                  <th className="px-3 py-2 text-right">Supply</th>
                </>
              )}
            </tr>
          </thead>
          <tbody className="tabular">
            {items.map((f) => {
              const fam = { id: f.key, name: f.name, ...(f.data as Partial<Family>) } as Family;
              const d = compact ? null : deriveFamily(fam);
              return (
                <tr key={f.id} className="border-b border-rule/60 align-top last:border-0">
                  <td className="px-3 py-2">
                    <Link href={`/w/${ws}/families/${f.id}`} className="hover:text-accent">{f.name}</Link>
                    {!f.builtin && <span className="ml-2 text-xs text-graphite">(this workspace)</span>}
                    {f.archivedAt && <span className="ml-2 text-xs text-amber">archived</span>}
                  </td>
                  <td className="px-3 py-2 text-right font-mono">{f.fanIn}</td>
                  <td className="px-3 py-2 text-right font-mono">{f.fanOut}</td>
                  {d && (
                    <>
                      <td className="px-3 py-2"><Figure f={d.dcFanOut} /></td>
                      <td className="px-3 py-2"><Figure f={d.acFanOut} /></td>
                      <td className="px-3 py-2"><Figure f={d.nmh} digits={2} /></td>
                      <td className="px-3 py-2"><Figure f={d.nml} digits={2} /></td>
                      <td className="px-3 py-2 text-right font-mono">{fam.supplyV !== undefined ? `${fam.supplyV} V` : "—"}</td>
                    </>
                  )}
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-xs text-graphite">
        Figures are typical values from handbook tables and standards, marked with their sources in each family; the
        derived limits are estimates. Check the data sheets of the parts you use and your own design rules.
      </p>
    </section>
  );
}
