"use client";
import Link from "next/link";
import dynamic from "next/dynamic";
import { useRouter } from "next/navigation";
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import useSWR from "swr";
import { api, ApiError } from "@/lib/client/fetcher";
import { can } from "@/lib/auth/permissions";
import type { DesignItem, FamilyItem, Page, RevisionSummary, WorkspaceInfo } from "@/lib/client/types";
import type { CompileResponse, WorkbenchSettings } from "./types";
import { useCompile, type CompileState } from "./useCompile";
import { serverDraftOf, useDraft, type DraftStatus, type ServerDraft } from "./useDraft";
import { SettingsBar } from "./SettingsBar";
import { MinimizedPanel } from "./MinimizedPanel";
import { GateTable } from "./GateTable";
import { FiguresPanel } from "./FiguresPanel";
import { StructuresPanel } from "./StructuresPanel";
import { NotesPanel } from "./NotesPanel";
import { RevisionsPanel } from "./RevisionsPanel";
import { SchematicPanel } from "@/components/schematic/SchematicPanel";
import { JobPanel } from "./JobPanel";
import { TruthTableView } from "./TruthTableView";
import { LibraryNotice } from "./LibraryNotice";
import { ImportDrop } from "@/components/workspace/ImportDrop";
import { useLibraryCatalog, useLibraryResolver } from "./useLibraries";

// The editor's bundle (Monaco) is the largest part of the page: it starts loading with this module,
// beside the design's data, rather than once the data has come and the editor is first drawn.
const loadEditor = () => import("@/components/editor/EquationEditor");
if (typeof window !== "undefined") void loadEditor();
const EquationEditor = dynamic(loadEditor, {
  ssr: false,
  loading: () => <div className="h-full animate-pulse rounded border border-rule bg-sheet" />,
});

/** One empty list for every render before the revisions load, so the memoized panel is not drawn again for a new []. */
const NO_REVISIONS: RevisionSummary[] = [];

type Tab = "minimized" | "gates" | "figures" | "notes" | "table";

/** A short start in the Ferrow scenario, offered on an empty draft. */
export const STARTER_SOURCE = `// Paddle permit of a lock chamber: replace these conditions with your own.
inputs paddle_request, level_equal, gate_shut, estop
outputs paddle_enable

// The paddle may open on request once the levels are equal and the gate is shut, unless the stop is pressed.
paddle_enable = paddle_request * level_equal * gate_shut * estop'
`;

/** Where the newest compile stands, as every panel shows it. */
type Phase =
  | { kind: "compiling" }
  | { kind: "stopped" }
  | { kind: "limit"; title: string; message: string; hint: string }
  | { kind: "failed"; message: string }
  | { kind: "errors"; count: number }
  | { kind: "done"; verified: boolean };

function phaseOf(compile: CompileState, errors: number): Phase {
  if (compile.pending) return { kind: "compiling" };
  if (compile.cancelled) return { kind: "stopped" };
  const e = compile.error;
  if (e instanceof ApiError && e.code === "compile_limit") {
    const d = (e.details ?? {}) as { what?: string; hint?: string };
    return { kind: "limit", title: d.what ? `Stopped at the ${d.what}` : "Stopped at a limit", message: e.message, hint: d.hint ?? "" };
  }
  if (e) return { kind: "failed", message: e.message };
  if (errors) return { kind: "errors", count: errors };
  const result = compile.data?.result;
  if (!result) return { kind: "compiling" };
  return { kind: "done", verified: result.stats.verified === true };
}

/** The designer's page: equations on the left, what they become on the right, revisions below. */
export function Workbench({ ws, designId }: { ws: string; designId: string }) {
  const router = useRouter();
  const { data: wsData } = useSWR<{ workspace: WorkspaceInfo }>(`/api/v1/workspaces/${ws}`);
  const designUrl = `/api/v1/workspaces/${ws}/designs/${designId}`;
  const { data: designData, error: designError, mutate: mutateDesign } = useSWR<{ design: DesignItem }>(designUrl);
  const { data: families } = useSWR<{ items: FamilyItem[] }>(`/api/v1/workspaces/${ws}/families`);
  const revKey = `/api/v1/workspaces/${ws}/designs/${designId}/revisions?limit=100`;
  const { data: revisions, error: revisionsError, mutate: mutateRevisions } = useSWR<Page<RevisionSummary>>(revKey);
  const role = wsData?.workspace.role;
  const mayEdit = role ? can(role, "design.edit") : false;
  const maySave = role ? can(role, "revision.save") : false;

  const [source, setSource] = useState<string | null>(null);
  const [familyId, setFamilyId] = useState<string | undefined>(undefined);
  const [settings, setSettings] = useState<WorkbenchSettings>({});
  const [tab, setTab] = useState<Tab>("minimized");
  const [selected, setSelected] = useState<string | null>(null);
  const [saving, setSaving] = useState(false);
  const [saveMessage, setSaveMessage] = useState("");
  const [saveError, setSaveError] = useState<string | null>(null);
  // The text an import replaced, until the designer keeps the import or takes the text back.
  const [beforeImport, setBeforeImport] = useState<string | null>(null);

  const loadedDraft = useMemo(() => (designData ? serverDraftOf(designData.design as Parameters<typeof serverDraftOf>[0]) : null), [designData]);
  const adopt = useCallback((d: ServerDraft) => {
    setSource(d.source);
    setFamilyId(d.familyId);
    setSettings(d.settings);
  }, []);
  useEffect(() => {
    if (source === null && loadedDraft) adopt(loadedDraft);
  }, [loadedDraft, source, adopt]);

  const local = useMemo(
    () => (source !== null && familyId ? { source, familyId, settings } : null),
    [source, familyId, settings],
  );
  const draft = useDraft({
    url: `${designUrl}/draft`,
    local,
    loaded: loadedDraft,
    enabled: mayEdit,
    onAdopt: adopt,
    onSaved: (answer) => void mutateDesign(answer as unknown as { design: DesignItem }, { revalidate: false }),
  });

  const editedAt = useRef(0);
  const compile = useCompile(ws, source, familyId, settings, editedAt);
  const catalog = useLibraryCatalog(ws);
  const resolveLibraries = useLibraryResolver(ws, tab === "table" ? source : null);
  // A compile run to the end as a job: its result stands for the text it was started from.
  const [job, setJob] = useState<{ id: string; key: string; result: CompileResponse["result"] } | null>(null);
  const [jobError, setJobError] = useState<string | null>(null);
  const textKey = JSON.stringify([source, familyId, settings]);
  const jobResult = job && job.key === textKey ? job.result : null;
  const runToEnd = useCallback(async () => {
    if (source === null || !familyId) return;
    setJobError(null);
    try {
      const r = await api<{ job: { id: string } }>(`/api/v1/workspaces/${ws}/jobs`, {
        method: "POST", json: { source, familyId, settings, designId },
      });
      setJob({ id: r.job.id, key: JSON.stringify([source, familyId, settings]), result: null });
    } catch (e) {
      setJobError(e instanceof ApiError ? e.message : String(e));
    }
  }, [ws, source, familyId, settings, designId]);
  // A job's result stands for the text even when the interactive compile was stopped and left nothing
  // (the job was filed only for a source without errors, so there is nothing to note beside it).
  const family = families?.items.find((f) => f.id === familyId);
  const shown: CompileResponse | null = !jobResult
    ? compile.data
    : compile.data
      ? { ...compile.data, result: jobResult }
      : { diagnostics: [], libraries: [], result: jobResult, cached: false,
          family: { id: familyId ?? "", key: family?.key ?? "", name: family?.name ?? "" } };
  const result = shown?.result ?? null;
  const diagnostics = shown?.diagnostics ?? [];
  const errors = diagnostics.filter((d) => d.severity === "error").length;
  const phase: Phase = jobResult ? { kind: "done", verified: jobResult.stats.verified } : phaseOf(compile, errors);

  const saveRevision = useCallback(async () => {
    if (!maySave || source === null || !familyId) return;
    setSaveError(null);
    try {
      const draftVersion = draft.baseVersion();
      await api(`/api/v1/workspaces/${ws}/designs/${designId}/revisions`, {
        method: "POST",
        json: { message: saveMessage.trim() || "Saved from the workbench", source, familyId, settings, ...(draftVersion ? { draftVersion } : {}) },
      });
      setSaving(false);
      setSaveMessage("");
      await Promise.all([mutateRevisions(), mutateDesign()]);
    } catch (e) {
      setSaveError(e instanceof ApiError ? e.message : String(e));
    }
  }, [maySave, source, familyId, ws, designId, saveMessage, settings, mutateRevisions, mutateDesign, draft]);

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if ((e.ctrlKey || e.metaKey) && e.key.toLowerCase() === "s") {
        e.preventDefault();
        if (maySave) setSaving(true);
      }
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [maySave]);

  const critical = useMemo(
    () => ({ nets: new Set(result?.analysis.criticalPath.nets ?? []), gates: new Set(result?.analysis.criticalPath.gates ?? []) }),
    [result],
  );
  const criticalOutput = useMemo(() => {
    const last = result?.analysis.criticalPath.nets.at(-1);
    return result?.netlist.outputs.find((o) => o.net === last)?.name;
  }, [result]);

  const selectGate = useCallback((id: string) => {
    setSelected(id);
    setTab("gates");
  }, []);
  const onEdit = useCallback((v: string) => {
    editedAt.current = performance.now();
    setSource(v);
  }, []);

  if (designError) return <main className="page-frame py-8 text-vermilion" role="alert">{designError.message}</main>;
  const design = designData?.design;
  const latest = revisions?.items[0];
  const stale = phase.kind === "compiling" && !!result;

  const takeImported = (imported: string) => {
    setBeforeImport(source ?? "");
    setSource(imported);
  };

  return (
    <main className="page-frame py-4">
      <ImportDrop ws={ws} into={{ designName: design?.name ?? "this design", onUse: takeImported }}>
      {(importer) => (<>
      <div className="mb-3 flex flex-wrap items-center gap-3">
        <Link prefetch={false} href={`/w/${ws}`} className="text-sm text-graphite hover:text-ink">← Designs</Link>
        <h1 className="text-xl font-semibold">{design?.name ?? "…"}</h1>
        <span className="text-sm text-graphite">
          {family?.name}
          {latest ? ` · last revision r${latest.number}` : revisions ? " · no revision yet" : ""}
        </span>
        <span className="ml-auto flex items-center gap-3 text-sm">
          <CompileStatus phase={phase} onCancel={compile.cancel} onRetry={compile.retry} />
          {mayEdit && <DraftState status={draft.status} error={draft.error} />}
          {latest && (
            <Link prefetch={false} href={`/w/${ws}/d/${designId}/compare?from=${latest.number}&to=draft`} className="text-xs text-graphite hover:text-ink"
              title={`Compare the draft with r${latest.number}`}
              onClick={async (e) => {
                // The comparison compiles the draft the server keeps: send what is typed first.
                e.preventDefault();
                await draft.flush();
                router.push(`/w/${ws}/d/${designId}/compare?from=${latest.number}&to=draft`);
              }}>
              compare draft
            </Link>
          )}
          {maySave ? (
            <button type="button" onClick={() => setSaving(true)} disabled={phase.kind !== "done" || !source}
              className="rounded bg-accent px-3 py-1.5 font-semibold text-paper hover:opacity-90 disabled:opacity-50"
              title={phase.kind === "done" ? "Save a revision (Ctrl+S)" : "A revision can be saved once the current text has compiled"}>
              Save revision
            </button>
          ) : role ? (
            <span className="text-xs text-graphite">read only for your role</span>
          ) : null}
        </span>
      </div>

      {draft.conflict && (
        <ConflictBanner theirs={draft.conflict} onKeepMine={draft.keepMine} onTakeTheirs={draft.takeTheirs} />
      )}

      {beforeImport !== null && (
        <div className="mb-3 flex flex-wrap items-center gap-3 rounded border border-accent/50 bg-sheet px-3 py-2 text-sm" role="status" data-testid="import-used">
          <span>The draft now holds the imported source; it is kept like any typed change.</span>
          <button type="button" onClick={() => { setSource(beforeImport); setBeforeImport(null); }}
            className="rounded border border-rule px-2 py-0.5 hover:border-ink">Take the previous text back</button>
          <button type="button" onClick={() => setBeforeImport(null)} className="ml-auto text-graphite hover:text-ink">Dismiss</button>
        </div>
      )}

      {saving && (
        <form className="mb-3 flex flex-wrap items-center gap-2 rounded border border-accent/50 bg-sheet p-3"
          onSubmit={(e) => { e.preventDefault(); void saveRevision(); }}>
          <label className="text-sm font-semibold" htmlFor="rev-message">What changed</label>
          <input id="rev-message" autoFocus value={saveMessage} onChange={(e) => setSaveMessage(e.target.value)}
            placeholder="e.g. stop now overrides the key" className="min-w-[24rem] flex-1 rounded border border-rule bg-paper px-3 py-1.5 text-sm" />
          <button type="submit" className="rounded bg-accent px-3 py-1.5 text-sm font-semibold text-paper">Save</button>
          <button type="button" onClick={() => setSaving(false)} className="rounded border border-rule px-3 py-1.5 text-sm">Cancel</button>
          {saveError && <p role="alert" className="w-full text-sm text-vermilion">{saveError}</p>}
        </form>
      )}

      <div className="mb-3 rounded border border-rule bg-sheet px-3 py-2">
        {families && (
          <SettingsBar families={families.items} familyId={familyId} onFamily={setFamilyId} settings={settings}
            onChange={setSettings} readOnly={!mayEdit} />
        )}
      </div>

      {source !== null && shown && shown.libraries.length > 0 && (
        <LibraryNotice ws={ws} uses={shown.libraries} source={source} familyId={familyId} settings={settings}
          current={compile.dataKey === textKey ? result : null} mayEdit={mayEdit} onSource={setSource} />
      )}

      <div className="grid gap-4 xl:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
        <section className="flex min-h-[32rem] flex-col rounded border border-rule bg-sheet" aria-label="Equations">
          <div className="flex items-center border-b border-rule px-3 py-1.5 text-xs uppercase tracking-wide text-graphite">
            Equations
            {mayEdit && source !== null && (
              <span className="ml-auto flex gap-2 normal-case tracking-normal">
                {source.trim() === "" && (
                  <button type="button" onClick={() => setSource(STARTER_SOURCE)}
                    className="rounded border border-rule px-2 py-0.5 text-ink hover:border-ink">
                    Start from an example
                  </button>
                )}
                <button type="button" onClick={importer.chooseFile} title="Or drop a .csv truth table or a .v module anywhere on the page"
                  className="rounded border border-rule px-2 py-0.5 text-ink hover:border-ink">
                  Bring in a table or Verilog…
                </button>
                <button type="button" onClick={importer.paste} className="rounded border border-rule px-2 py-0.5 text-ink hover:border-ink">
                  Paste cells…
                </button>
              </span>
            )}
          </div>
          <div className="min-h-[28rem] flex-1" data-testid="editor">
            {source !== null && (
              <EquationEditor value={source} onChange={onEdit} readOnly={!mayEdit}
                diagnostics={diagnostics} height="100%" libraries={catalog} />
            )}
          </div>
        </section>

        <section className="flex flex-col gap-3" aria-label="Results">
          {job && job.key === textKey && (
            <JobPanel ws={ws} jobId={job.id} onClose={() => setJob(null)}
              onDone={(result) => setJob((j) => (j && j.id && !j.result ? { ...j, result } : j))} />
          )}
          {(phase.kind === "limit" || phase.kind === "failed" || phase.kind === "stopped") && !(job && job.key === textKey) && (
            <StopNotice phase={phase} onRetry={compile.retry} onRunToEnd={runToEnd} runError={jobError} />
          )}
          <div className={`rounded border border-rule bg-sheet p-2 ${stale ? "opacity-60" : ""}`}>
            {result ? (
              <SchematicPanel netlist={result.netlist} critical={critical} selected={selected} onSelect={selectGate}
                criticalOutput={criticalOutput} />
            ) : (
              <div className="flex h-[360px] items-center justify-center text-sm text-graphite" data-testid="no-schematic">
                {noResultText(phase)}
              </div>
            )}
          </div>
          {result && (
            <div className={`rounded border border-rule bg-sheet p-3 ${stale ? "opacity-60" : ""}`}>
              <StructuresPanel structures={result.structures} settings={settings} onChange={setSettings} readOnly={!mayEdit} />
            </div>
          )}
          <div className={`rounded border border-rule bg-sheet ${stale ? "opacity-60" : ""}`}>
            <div role="tablist" className="flex border-b border-rule text-sm">
              {([
                ["minimized", "Minimized"],
                ["gates", `Gates${result ? ` (${result.netlist.gates.length})` : ""}`],
                ["figures", "Figures"],
                ["table", "Truth table"],
                ["notes", `Notes${diagnostics.length + (result?.warnings.length ?? 0) ? ` (${diagnostics.length + (result?.warnings.length ?? 0)})` : ""}`],
              ] as Array<[Tab, string]>).map(([t, label]) => (
                <button key={t} role="tab" type="button" aria-selected={tab === t} onClick={() => setTab(t)}
                  className={`px-4 py-2 ${tab === t ? "border-b-2 border-accent font-semibold text-ink" : "text-graphite hover:text-ink"}`}>
                  {label}
                </button>
              ))}
            </div>
            <div className={`p-3 ${tab === "gates" && result ? "" : "max-h-[30rem] overflow-auto"}`}>
              {tab === "table" ? (
                <TruthTableView source={source ?? ""} name={design?.name} resolve={resolveLibraries} />
              ) : tab === "notes" ? (
                <NotesPanel diagnostics={diagnostics} warnings={result?.warnings ?? []} analysis={result?.analysis ?? null}
                  stop={phase.kind === "limit" || phase.kind === "failed" || phase.kind === "stopped" ? noResultText(phase) : null} />
              ) : !result ? (
                <p className="text-sm text-graphite" data-testid="no-result">{noResultText(phase)}</p>
              ) : tab === "minimized" ? (
                <MinimizedPanel covers={result.covers} />
              ) : tab === "gates" ? (
                <GateTable netlist={result.netlist} analysis={result.analysis} selected={selected} onSelect={setSelected}
                  criticalGates={critical.gates} />
              ) : (
                <FiguresPanel analysis={result.analysis} />
              )}
            </div>
          </div>
        </section>
      </div>

      <section className="mt-6 rounded border border-rule bg-sheet p-3" aria-label="Revisions">
        <h2 className="mb-2 text-xs uppercase tracking-wide text-graphite">Revisions</h2>
        {revisionsError && (
          <p role="alert" className="mb-2 text-sm text-vermilion">The revisions could not be loaded: {revisionsError.message}</p>
        )}
        <RevisionsPanel ws={ws} designId={designId} revisions={revisions?.items ?? NO_REVISIONS} />
      </section>
      </>)}
      </ImportDrop>
    </main>
  );
}

/** What the result panels say while there is no result for the text on screen. */
function noResultText(phase: Phase): string {
  switch (phase.kind) {
    case "compiling":
      return "Compiling…";
    case "stopped":
      return "No result: you stopped the compile. Edit the equations or press Run again.";
    case "limit":
      return `No result: ${phase.title.toLowerCase()}.`;
    case "failed":
      return `No result: ${phase.message}`;
    case "errors":
      return "No result: fix the errors in the equations (see the marks in the editor and the Notes tab).";
    case "done":
      return "No result.";
  }
}

function CompileStatus({ phase, onCancel, onRetry }: { phase: Phase; onCancel: () => void; onRetry: () => void }) {
  switch (phase.kind) {
    case "compiling":
      return (
        <span className="flex items-center gap-2 text-graphite" data-testid="compile-status">
          <span className="inline-block h-2 w-2 animate-pulse rounded-full bg-accent" /> compiling…
          <button type="button" onClick={onCancel} className="rounded border border-rule px-2 py-0.5 text-xs hover:border-ink">Cancel</button>
        </span>
      );
    case "stopped":
    case "limit":
    case "failed":
      return (
        <span className="flex items-center gap-2 text-amber" data-testid="compile-status">
          {phase.kind === "stopped" ? "stopped" : phase.kind === "limit" ? "stopped at a limit" : "compile failed"}
          <button type="button" onClick={onRetry} className="rounded border border-rule px-2 py-0.5 text-xs text-ink hover:border-ink">Run again</button>
        </span>
      );
    case "errors":
      return <span className="text-vermilion" data-testid="compile-status">{phase.count} error{phase.count === 1 ? "" : "s"} in the equations</span>;
    case "done":
      return phase.verified
        ? <span className="text-accent" data-testid="compile-status">up to date · verified</span>
        : <span className="text-vermilion" data-testid="compile-status">up to date · not verified</span>;
  }
}

const DRAFT_WORDS: Record<DraftStatus, string> = {
  kept: "draft kept",
  changed: "unsaved changes",
  keeping: "keeping draft…",
  failed: "draft not kept",
  conflict: "draft changed elsewhere",
};

function DraftState({ status, error }: { status: DraftStatus; error: string | null }) {
  const bad = status === "failed" || status === "conflict";
  return (
    <span className={`text-xs ${bad ? "text-vermilion" : "text-graphite"}`} data-testid="draft-state" data-status={status}
      title={status === "kept" ? "The server has the text on screen." : (error ?? undefined)}>
      {DRAFT_WORDS[status]}
      {status === "failed" && error ? `: ${error} (trying again)` : ""}
    </span>
  );
}

function ConflictBanner({ theirs, onKeepMine, onTakeTheirs }: {
  theirs: ServerDraft;
  onKeepMine: () => void;
  onTakeTheirs: () => void;
}) {
  const [show, setShow] = useState(false);
  const who = theirs.updatedBy?.name ?? "Someone";
  const when = theirs.updatedAt ? new Date(theirs.updatedAt).toLocaleTimeString() : "meanwhile";
  return (
    <div role="alert" data-testid="draft-conflict" className="mb-3 rounded border border-vermilion/60 bg-vermilion/5 p-3 text-sm">
      <p>
        <strong>{who}</strong> changed this draft at {when}, in another tab or on another machine, while you were editing
        here. Your text is still on screen and has not been written over theirs. Choose which to keep:
      </p>
      <div className="mt-2 flex flex-wrap gap-2">
        <button type="button" onClick={onKeepMine} className="rounded bg-accent px-3 py-1 font-semibold text-paper">Keep my text</button>
        <button type="button" onClick={onTakeTheirs} className="rounded border border-rule bg-paper px-3 py-1">Take theirs</button>
        <button type="button" onClick={() => setShow((s) => !s)} className="rounded border border-rule bg-paper px-3 py-1">
          {show ? "Hide theirs" : "Show theirs"}
        </button>
      </div>
      {show && (
        <pre className="mt-2 max-h-64 overflow-auto rounded border border-rule bg-paper p-2 font-mono text-xs" data-testid="their-draft">
          {theirs.source}
        </pre>
      )}
    </div>
  );
}

function StopNotice({ phase, onRetry, onRunToEnd, runError }: {
  phase: Extract<Phase, { kind: "limit" | "failed" | "stopped" }>;
  onRetry: () => void;
  onRunToEnd: () => void;
  runError: string | null;
}) {
  return (
    <div className="rounded border border-amber/60 bg-amber/10 px-3 py-2 text-sm" data-testid="stop-notice">
      {phase.kind === "limit" ? (
        <>
          <p className="font-semibold">{phase.title}.</p>
          <p>{phase.message}</p>
          {phase.hint && <p className="mt-1">{phase.hint}</p>}
        </>
      ) : phase.kind === "failed" ? (
        <p>The compile failed: {phase.message}</p>
      ) : (
        <p>You stopped the compile; the results below are empty until it runs again, here or in the background.</p>
      )}
      <div className="mt-2 flex gap-2">
        <button type="button" onClick={onRetry} className="rounded border border-rule bg-paper px-2 py-0.5 text-xs hover:border-ink">Run again</button>
        {(phase.kind === "limit" || phase.kind === "stopped") && (
          <button type="button" onClick={onRunToEnd} className="rounded bg-accent px-2 py-0.5 text-xs font-semibold text-paper"
            title="A job worker runs the compile without the interactive time limit; you can follow it here, leave and come back.">
            Run to the end in the background
          </button>
        )}
      </div>
      {runError && <p className="mt-1 text-vermilion">{runError}</p>}
    </div>
  );
}
