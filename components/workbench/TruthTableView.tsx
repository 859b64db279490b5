"use client";
/**
 * The truth table of the source in the editor, a page of rows at a time
 * (2^n rows: wide designs have millions), with a CSV download in the layout
 * the import reads back. Worked out in the browser from the same language
 * module the server uses.
 */
import { useDeferredValue, useMemo, useState } from "react";
import { compileSource, type LibraryResolver } from "@/lib/lang";
import { TABLE_CSV_MAX_INPUTS, TableReader, truthTableCsv } from "@/lib/import/table";

/** Rows on one page. */
export const TABLE_PAGE_ROWS = 256;

/**
 * `resolve` answers the source's use lines (the server's answers, fetched by
 * the workbench): undefined when there are none, null while they load.
 */
export function TruthTableView({ source, name, resolve }: { source: string; name?: string; resolve?: LibraryResolver | null }) {
  const deferred = useDeferredValue(source);
  const compiled = useMemo(() => compileSource(deferred, resolve ? { resolve } : undefined), [deferred, resolve]);
  const reader = useMemo(() => (compiled.spec ? new TableReader(compiled.spec) : null), [compiled]);
  const [page, setPage] = useState(0);

  if (resolve === null) return <p className="text-sm text-graphite">Looking up the library blocks…</p>;
  if (!reader || !compiled.spec) {
    const errors = compiled.diagnostics.filter((d) => d.severity === "error").length;
    return <p className="text-sm text-graphite">Fix the {errors} error{errors === 1 ? "" : "s"} in the equations to see the truth table.</p>;
  }
  const pages = Math.ceil(reader.rowCount / TABLE_PAGE_ROWS);
  const current = Math.min(page, pages - 1);
  const first = current * TABLE_PAGE_ROWS;
  const rows = reader.rows(first, TABLE_PAGE_ROWS);
  const n = reader.inputs.length;
  const canDownload = n <= TABLE_CSV_MAX_INPUTS;

  const download = () => {
    const blob = new Blob([truthTableCsv(compiled.spec!)], { type: "text/csv" });
    const a = document.createElement("a");
    a.href = URL.createObjectURL(blob);
    a.download = `${(name ?? "design").replace(/[^A-Za-z0-9._-]+/g, "_")}-table.csv`;
    a.click();
    setTimeout(() => URL.revokeObjectURL(a.href), 1000);
  };

  return (
    <div data-testid="truth-table">
      <div className="mb-2 flex flex-wrap items-center gap-2 text-sm">
        <span className="text-graphite" data-testid="truth-table-range">
          rows {first.toLocaleString("en")}–{(first + rows.length - 1).toLocaleString("en")} of {reader.rowCount.toLocaleString("en")}
        </span>
        <nav className="ml-auto flex items-center gap-1" aria-label="Truth table pages">
          <PageButton label="First page" onClick={() => setPage(0)} disabled={current === 0}>«</PageButton>
          <PageButton label="Previous page" onClick={() => setPage(current - 1)} disabled={current === 0}>‹</PageButton>
          <label className="flex items-center gap-1 text-xs text-graphite">
            page
            <input type="number" min={1} max={pages} value={current + 1} aria-label="Page number"
              onChange={(e) => setPage(Math.max(0, Math.min(pages - 1, (Number(e.target.value) || 1) - 1)))}
              className="w-20 rounded border border-rule bg-paper px-1 py-0.5 text-right font-mono" />
            of {pages.toLocaleString("en")}
          </label>
          <PageButton label="Next page" onClick={() => setPage(current + 1)} disabled={current >= pages - 1}>›</PageButton>
          <PageButton label="Last page" onClick={() => setPage(pages - 1)} disabled={current >= pages - 1}>»</PageButton>
        </nav>
        <button type="button" onClick={download} disabled={!canDownload}
          title={canDownload ? "The whole table as CSV; it imports back to the same function" : `Files stop at ${TABLE_CSV_MAX_INPUTS} inputs; this design has ${n}`}
          className="rounded border border-rule px-2 py-0.5 text-xs hover:border-ink disabled:opacity-50">
          Download CSV
        </button>
      </div>
      <div className="overflow-x-auto">
        <table className="text-sm">
          <thead className="border-b border-rule text-left text-xs text-graphite">
            <tr>
              <th className="px-2 py-1 text-right font-normal" title="minterm index">#</th>
              {reader.inputs.map((i) => <th key={`i-${i}`} className="px-1.5 py-1 font-mono font-normal">{i}</th>)}
              {reader.outputs.map((o, k) => (
                <th key={`o-${o}`} className={`px-1.5 py-1 font-mono font-semibold text-ink ${k === 0 ? "border-l border-rule pl-3" : ""}`}>{o}</th>
              ))}
            </tr>
          </thead>
          <tbody className="font-mono tabular">
            {rows.map((r) => (
              <tr key={r.minterm} className="border-b border-rule/40 last:border-0 hover:bg-paper">
                <td className="px-2 text-right text-graphite">{r.minterm}</td>
                {r.inputs.map((b, i) => <td key={i} className="px-1.5 text-center text-graphite">{b}</td>)}
                {r.outputs.map((v, k) => (
                  <td key={`o${k}`} className={`px-1.5 text-center ${k === 0 ? "border-l border-rule pl-3" : ""} ${v === "1" ? "font-semibold text-accent" : v === "-" ? "text-amber" : ""}`}>
                    {v}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-xs text-graphite">The first input is the most significant bit of the row number; - marks a don&apos;t-care.</p>
    </div>
  );
}

function PageButton({ label, onClick, disabled, children }: { label: string; onClick: () => void; disabled: boolean; children: React.ReactNode }) {
  return (
    <button type="button" aria-label={label} title={label} onClick={onClick} disabled={disabled}
      className="rounded border border-rule px-2 py-0.5 hover:border-ink disabled:opacity-40">
      {children}
    </button>
  );
}
