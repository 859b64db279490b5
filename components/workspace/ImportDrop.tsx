"use client";
/**
 * Bringing a design in: drop a truth table (.csv, .tsv, .txt) or a Verilog
 * module (.v) anywhere on the page, choose a file, or paste cells copied
 * from a spreadsheet. The server's import shows the design source it would
 * make, or every refusal with its row and column, before anything changes.
 *
 * On the workspace home the result becomes a new design. On the workbench
 * (`into`) it becomes the new draft of the open design: the editor takes it
 * as one edit, so Ctrl+Z there (or the workbench's "Take the previous text back") brings the old text back.
 */
import { useCallback, useEffect, useMemo, useState } from "react";
import { useDropzone } from "react-dropzone";
import useSWR from "swr";
import { api, ApiError } from "@/lib/client/fetcher";
import { can } from "@/lib/auth/permissions";
import type { FamilyItem, WorkspaceInfo } from "@/lib/client/types";
import type { ImportDiagnostic } from "@/lib/import/diagnostics";

type Kind = "csv" | "verilog";
interface Preview {
  source: string | null;
  inputs: string[];
  outputs: string[];
  diagnostics: ImportDiagnostic[];
}
interface Draft {
  text: string;
  kind: Kind;
  fileName: string | null;
  outputs: string[];
  name: string;
}

/** Files larger than this are refused here, before they are sent (the server's own limit, IMPORT_MAX_CHARS). */
const MAX_FILE_BYTES = 4 * 1024 * 1024;

const kindOf = (fileName: string): Kind => (/\.(v|vh|verilog)$/i.test(fileName) ? "verilog" : "csv");
const nameOf = (fileName: string) => {
  const base = fileName.replace(/\.[^.]+$/, "").replace(/[_-]+/g, " ").trim();
  return base ? base[0]!.toUpperCase() + base.slice(1) : "";
};

/** Column names of a table's first row, split as the import splits them. */
function headerNames(text: string): string[] {
  const first = text.replace(/^\uFEFF/, "").split(/\r\n|\r|\n/, 1)[0] ?? "";
  const sep = first.includes("\t") ? "\t" : first.includes(",") ? "," : first.includes(";") ? ";" : ",";
  return first.split(sep).map((c) => c.trim().replace(/^"(.*)"$/, "$1").trim()).filter(Boolean);
}

/** Where an import goes on the workbench: the draft of the open design. */
export interface ImportInto {
  designName: string;
  /** Puts the imported source on screen as the new draft text. */
  onUse: (source: string) => void;
}

/** What the workbench's own buttons may do with the drop zone. */
export interface ImportControls {
  chooseFile: () => void;
  paste: () => void;
}

export function ImportDrop({ ws, into, children }: {
  ws: string;
  into?: ImportInto;
  children: React.ReactNode | ((controls: ImportControls) => React.ReactNode);
}) {
  const { data: wsData } = useSWR<{ workspace: WorkspaceInfo }>(`/api/v1/workspaces/${ws}`);
  const role = wsData?.workspace.role;
  const mayImport = role ? can(role, "design.edit") : false;
  const [draft, setDraft] = useState<Draft | null>(null);
  const [readError, setReadError] = useState<string | null>(null);

  const onDrop = useCallback(async (accepted: File[]) => {
    setReadError(null);
    const file = accepted[0];
    if (!file) return;
    if (file.size > MAX_FILE_BYTES) {
      setReadError(`${file.name} is ${(file.size / 1048576).toFixed(1)} MiB; files up to 4 MiB can be brought in. Split the table, or merge rows with - where an input does not matter.`);
      return;
    }
    const text = await file.text();
    setDraft({ text, kind: kindOf(file.name), fileName: file.name, outputs: [], name: nameOf(file.name) });
  }, []);

  const { getRootProps, getInputProps, isDragActive, open } = useDropzone({
    onDrop: (files) => void onDrop(files),
    noClick: true,
    noKeyboard: true,
    multiple: false,
    disabled: !mayImport,
  });

  const paste = () => { setReadError(null); setDraft({ text: "", kind: "csv", fileName: null, outputs: [], name: "" }); };
  // Roles that may not edit (or before the role is known) get the page as it is, with controls that do nothing;
  // the wrapper stays the same either way, so the page below is not mounted again when the role arrives.
  const body = typeof children === "function"
    ? children(mayImport ? { chooseFile: open, paste } : { chooseFile: () => {}, paste: () => {} })
    : children;
  return (
    // The drop zone marks its root aria-disabled while it is off (roles that may not edit): that would tell
    // assistive technology (and the browser tests) that the whole page inside it is disabled, so it is dropped.
    <div {...getRootProps({ className: "relative" })} aria-disabled={undefined} data-testid="import-drop">
      {mayImport && <input {...getInputProps({ "aria-label": "Choose a truth table or Verilog file" })} data-testid="import-file" />}
      {mayImport && isDragActive && (
        <div className="pointer-events-none absolute inset-0 z-20 flex items-center justify-center rounded border-2 border-dashed border-accent bg-paper/90">
          <p className="text-lg font-semibold text-accent">
            {into ? `Drop the truth table or Verilog file to make it the draft of ${into.designName}` : "Drop the truth table or Verilog file to bring it in"}
          </p>
        </div>
      )}
      {!mayImport ? null : into ? (
        readError && <p role="alert" className="mb-3 text-sm text-vermilion">{readError}</p>
      ) : (
      <div className="mb-4 flex flex-wrap items-center gap-3 rounded border border-dashed border-rule bg-sheet px-3 py-2 text-sm">
        <span className="font-semibold">Bring a design in</span>
        <span className="text-graphite">Drop a truth table (.csv) or a Verilog module (.v) on this page, or</span>
        <button type="button" onClick={open} className="rounded border border-rule px-2 py-0.5 hover:border-ink">Choose a file…</button>
        <button type="button" onClick={paste} className="rounded border border-rule px-2 py-0.5 hover:border-ink">Paste cells…</button>
        {readError && <p role="alert" className="w-full text-vermilion">{readError}</p>}
      </div>
      )}
      {draft && <ImportPanel ws={ws} draft={draft} into={into} onChange={setDraft} onClose={() => setDraft(null)} />}
      {body}
    </div>
  );
}

function ImportPanel({ ws, draft, into, onChange, onClose }: {
  ws: string;
  draft: Draft;
  into: ImportInto | undefined;
  onChange: (d: Draft) => void;
  onClose: () => void;
}) {
  // Only a new design asks for a family; the workbench's draft keeps its own.
  const { data: families } = useSWR<{ items: FamilyItem[] }>(into ? null : `/api/v1/workspaces/${ws}/families`);
  const [familyId, setFamilyId] = useState<string>("");
  const [preview, setPreview] = useState<Preview | null>(null);
  const [previewError, setPreviewError] = useState<string | null>(null);
  const [createError, setCreateError] = useState<{ message: string; diagnostics: ImportDiagnostic[] } | null>(null);
  const [busy, setBusy] = useState(false);
  const asked = useMemo(() => ({ text: draft.text, kind: draft.kind, outputs: draft.outputs, fileName: draft.fileName }), [draft.text, draft.kind, draft.outputs, draft.fileName]);
  // The preview answers this request; a newer one makes it stale until its own answer comes.
  const [answered, setAnswered] = useState<typeof asked | null>(null);

  useEffect(() => {
    if (!familyId && families?.items[0]) setFamilyId(families.items[0].id);
  }, [families, familyId]);

  // Ask the server a moment after the text stops changing; a newer request cancels the older one.
  useEffect(() => {
    if (!asked.text.trim()) {
      setPreview(null);
      setAnswered(asked);
      return;
    }
    const c = new AbortController();
    const timer = setTimeout(() => {
      api<Preview>("/api/v1/import", {
        method: "POST",
        json: {
          kind: asked.kind,
          text: asked.text,
          ...(asked.kind === "csv" && asked.outputs.length ? { outputs: asked.outputs } : {}),
          ...(asked.fileName ? { fileName: asked.fileName } : {}),
        },
        signal: c.signal,
      }).then(
        (p) => { setPreview(p); setPreviewError(null); setAnswered(asked); },
        (e) => { if (!c.signal.aborted) setPreviewError(e instanceof ApiError ? e.message : String(e)); },
      );
    }, 300);
    return () => {
      clearTimeout(timer);
      c.abort();
    };
  }, [asked]);

  const columns = useMemo(() => (draft.kind === "csv" ? headerNames(draft.text) : []), [draft.kind, draft.text]);
  const outputsShown = draft.outputs.length ? draft.outputs : columns.slice(-1);
  const toggle = (name: string) => {
    const next = outputsShown.includes(name) ? outputsShown.filter((o) => o !== name) : [...outputsShown, name];
    onChange({ ...draft, outputs: columns.filter((c) => next.includes(c)) });
  };

  const stale = answered !== asked;
  const ready = !!preview?.source && !stale && draft.name.trim() !== "" && familyId !== "";
  const readyInto = !!preview?.source && !stale;

  async function create() {
    setBusy(true);
    setCreateError(null);
    try {
      const res = await api<{ design: { id: string } }>(`/api/v1/workspaces/${ws}/designs/import`, {
        method: "POST",
        json: {
          kind: draft.kind,
          text: draft.text,
          name: draft.name.trim(),
          familyId,
          ...(draft.kind === "csv" && draft.outputs.length ? { outputs: draft.outputs } : {}),
          ...(draft.fileName ? { fileName: draft.fileName } : {}),
        },
      });
      window.location.assign(`/w/${ws}/d/${res.design.id}`);
    } catch (e) {
      const diagnostics = e instanceof ApiError ? ((e.details as { diagnostics?: ImportDiagnostic[] } | null)?.diagnostics ?? []) : [];
      setCreateError({ message: e instanceof ApiError ? e.message : String(e), diagnostics });
      setBusy(false);
    }
  }

  const diagnostics = createError?.diagnostics.length ? createError.diagnostics : (preview?.diagnostics ?? []);
  const errors = diagnostics.filter((d) => d.severity === "error");

  return (
    <section aria-label="Bring a design in" className="mb-6 rounded border border-accent/50 bg-sheet p-4" data-testid="import-panel">
      <div className="mb-3 flex flex-wrap items-center gap-3">
        <h2 className="text-base font-semibold">
          {draft.fileName ? <>Bring in <span className="font-mono">{draft.fileName}</span></> : "Bring in pasted cells"}
        </h2>
        <div role="radiogroup" aria-label="What the text is" className="flex overflow-hidden rounded border border-rule text-xs">
          {(["csv", "verilog"] as Kind[]).map((k) => (
            <button key={k} type="button" role="radio" aria-checked={draft.kind === k} onClick={() => onChange({ ...draft, kind: k })}
              className={`px-2 py-1 ${draft.kind === k ? "bg-accent text-paper" : "text-graphite hover:text-ink"}`}>
              {k === "csv" ? "Truth table" : "Verilog"}
            </button>
          ))}
        </div>
        <button type="button" onClick={onClose} className="ml-auto text-sm text-graphite hover:text-ink">Close</button>
      </div>

      {!draft.fileName && (
        <textarea value={draft.text} onChange={(e) => onChange({ ...draft, text: e.target.value })} rows={8} autoFocus
          aria-label="Cells pasted from a spreadsheet, or a Verilog module"
          placeholder={"Paste the cells here, header row first, for example\nsluice_open\tflow\talarm\n0\t0\t0\n0\t1\t1\n1\t-\t1"}
          className="mb-3 w-full rounded border border-rule bg-paper p-2 font-mono text-sm" />
      )}

      {draft.kind === "csv" && columns.length > 1 && (
        <div className="mb-3 flex flex-wrap items-center gap-1.5 text-sm" data-testid="import-columns">
          <span className="mr-1 text-graphite">Outputs (click to choose; inputs come first):</span>
          {columns.map((c) => {
            const isOut = outputsShown.includes(c);
            return (
              <button key={c} type="button" aria-pressed={isOut} onClick={() => toggle(c)}
                className={`rounded border px-2 py-0.5 font-mono text-xs ${isOut ? "border-accent bg-accent/10 text-accent" : "border-rule text-graphite hover:border-ink"}`}>
                {c}{isOut ? " · out" : ""}
              </button>
            );
          })}
        </div>
      )}

      <div className="grid gap-4 lg:grid-cols-2">
        <div>
          <h3 className="mb-1 text-xs uppercase tracking-wide text-graphite">Design source it makes</h3>
          {preview?.source ? (
            <pre className="max-h-80 overflow-auto rounded border border-rule bg-paper p-2 font-mono text-xs" data-testid="import-source">{preview.source}</pre>
          ) : (
            <p className="rounded border border-rule bg-paper p-2 text-sm text-graphite">
              {!draft.text.trim() ? "Nothing to read yet." : errors.length ? "Nothing is brought in until every problem on the right is fixed." : "Reading…"}
            </p>
          )}
        </div>
        <div>
          <h3 className="mb-1 text-xs uppercase tracking-wide text-graphite">
            {errors.length ? `${errors.length} problem${errors.length === 1 ? "" : "s"} to fix` : "Notes"}
          </h3>
          {previewError && <p role="alert" className="text-sm text-vermilion">{previewError}</p>}
          {diagnostics.length ? (
            <table className="w-full text-sm" data-testid="import-problems">
              <thead className="border-b border-rule text-left text-xs text-graphite">
                <tr>
                  <th className="px-2 py-1 font-normal">{draft.kind === "csv" ? "Row" : "Line"}</th>
                  <th className="px-2 py-1 font-normal">Column</th>
                  <th className="px-2 py-1 font-normal">What to change</th>
                </tr>
              </thead>
              <tbody>
                {diagnostics.map((d, i) => (
                  <tr key={i} className="border-b border-rule/40 align-top last:border-0">
                    <td className="px-2 py-1 font-mono">{d.row ?? d.line}</td>
                    <td className="px-2 py-1 font-mono">{d.colName ?? (d.col !== undefined ? d.col : draft.kind === "verilog" ? d.column : "")}</td>
                    <td className={`px-2 py-1 ${d.severity === "error" ? "text-vermilion" : "text-amber"}`}>{d.message}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          ) : (
            !previewError && <p className="text-sm text-graphite">{preview?.source ? "No problems." : ""}</p>
          )}
        </div>
      </div>

      {into ? (
        <div className="mt-4 flex flex-wrap items-center gap-2 border-t border-rule pt-3">
          <button type="button" disabled={!readyInto} onClick={() => { if (preview?.source) { into.onUse(preview.source); onClose(); } }}
            className="rounded bg-accent px-3 py-1.5 text-sm font-semibold text-paper disabled:opacity-50">
            Make it the draft of {into.designName}
          </button>
          <span className="text-sm text-graphite">The text in the editor is replaced as one edit; Ctrl+Z in the editor brings it back. Revisions are not touched.</span>
        </div>
      ) : (
      <form className="mt-4 flex flex-wrap items-center gap-2 border-t border-rule pt-3" onSubmit={(e) => { e.preventDefault(); if (ready) void create(); }}>
        <input value={draft.name} onChange={(e) => onChange({ ...draft, name: e.target.value })} aria-label="Design name"
          placeholder="Design name, e.g. sluice alarm" className="min-w-[16rem] flex-1 rounded border border-rule bg-paper px-3 py-1.5 text-sm" />
        <select value={familyId} onChange={(e) => setFamilyId(e.target.value)} aria-label="Logic family"
          className="rounded border border-rule bg-paper px-2 py-1.5 text-sm">
          {families?.items.map((f) => <option key={f.id} value={f.id}>{f.name}</option>)}
        </select>
        <button type="submit" disabled={!ready || busy} className="rounded bg-accent px-3 py-1.5 text-sm font-semibold text-paper disabled:opacity-50">
          Create design
        </button>
        {createError && <p role="alert" className="w-full text-sm text-vermilion">{createError.message}</p>}
      </form>
      )}
    </section>
  );
}
