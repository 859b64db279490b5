"use client";
import Link from "next/link";
import dynamic from "next/dynamic";
import { useMemo, useState } from "react";
import useSWR from "swr";
import type { FamilyRef, RevisionSummary } from "@/lib/client/types";
import type { WorkbenchSettings } from "./types";
import { useCompile } from "./useCompile";
import { MinimizedPanel } from "./MinimizedPanel";
import { GateTable } from "./GateTable";
import { FiguresPanel } from "./FiguresPanel";
import { StructuresPanel } from "./StructuresPanel";
import { Schematic } from "@/components/schematic/Schematic";

const EquationEditor = dynamic(() => import("@/components/editor/EquationEditor"), { ssr: false });

interface FullRevision extends RevisionSummary {
  source: string;
  settings: WorkbenchSettings & { familyId?: string };
  family: FamilyRef;
}

const formats = [["verilog", "Verilog"], ["vhdl", "VHDL"], ["csv", "CSV gate list"], ["json", "JSON netlist"]] as const;

/** One saved revision, read only: its source, its figures and its files. */
export function RevisionView({ ws, designId, number }: { ws: string; designId: string; number: number }) {
  const base = `/api/v1/workspaces/${ws}/designs/${designId}/revisions/${number}`;
  const { data, error } = useSWR<{ revision: FullRevision }>(base);
  const rev = data?.revision;
  const settings = useMemo(() => {
    const { familyId: _f, ...rest } = rev?.settings ?? {};
    return rest as WorkbenchSettings;
  }, [rev]);
  const compile = useCompile(ws, rev?.source ?? "", rev?.family.id, settings);
  const result = compile.data?.result ?? null;
  const [selected, setSelected] = useState<string | null>(null);
  const critical = useMemo(
    () => ({ nets: new Set(result?.analysis.criticalPath.nets ?? []), gates: new Set(result?.analysis.criticalPath.gates ?? []) }),
    [result],
  );
  if (error) return <main className="p-8 text-vermilion" role="alert">{error.message}</main>;
  if (!rev) return <main className="p-8 text-graphite">Loading revision…</main>;
  return (
    <main className="page-frame py-4">
      <div className="mb-3 flex flex-wrap items-baseline gap-3">
        <Link href={`/w/${ws}/d/${designId}`} className="text-sm text-graphite hover:text-ink">← Workbench</Link>
        <h1 className="text-xl font-semibold">Revision r{rev.number}</h1>
        <span className="text-sm text-graphite">
          {rev.message} · {rev.author.name} · {new Date(rev.createdAt).toISOString().slice(0, 16).replace("T", " ")} · {rev.family.name}
        </span>
        <span className="ml-auto rounded-full border border-rule px-2 py-0.5 text-xs text-graphite">read only</span>
      </div>
      <div className="mb-3 flex flex-wrap gap-2 text-sm">
        {formats.map(([f, label]) => (
          <a key={f} href={`${base}/export?format=${f}`} download className="rounded border border-rule bg-sheet px-3 py-1 hover:border-ink">
            Download {label}
          </a>
        ))}
      </div>
      <div className="grid gap-4 xl:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
        <section className="h-[32rem] rounded border border-rule bg-sheet">
          <EquationEditor value={rev.source} onChange={() => {}} readOnly diagnostics={[]} height="100%" />
        </section>
        <section className="flex flex-col gap-3">
          {result ? (
            <>
              <div className="rounded border border-rule bg-sheet p-2">
                <Schematic netlist={result.netlist} critical={critical} selected={selected} onSelect={setSelected} />
              </div>
              <div className="rounded border border-rule bg-sheet p-3">
                <StructuresPanel structures={result.structures} settings={settings} onChange={() => {}} readOnly />
              </div>
              <div className="rounded border border-rule bg-sheet p-3"><MinimizedPanel covers={result.covers} /></div>
              <div className="rounded border border-rule bg-sheet p-3"><FiguresPanel analysis={result.analysis} /></div>
              <div className="rounded border border-rule bg-sheet p-3">
                <GateTable netlist={result.netlist} analysis={result.analysis} selected={selected} onSelect={setSelected} criticalGates={critical.gates} />
              </div>
            </>
          ) : (
            <p className="text-sm text-graphite">Recomputing the netlist of this revision…</p>
          )}
        </section>
      </div>
    </main>
  );
}
