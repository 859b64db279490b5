"use client";
import Link from "next/link";
import dynamic from "next/dynamic";
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import useSWR from "swr";
import { api, ApiError } from "@/lib/client/fetcher";
import { can } from "@/lib/auth/permissions";
import type { DesignItem, FamilyItem, Page, RevisionSummary, WorkspaceInfo } from "@/lib/client/types";
import type { WorkbenchSettings } from "./types";
import { useCompile, useDebounced } from "./useCompile";
import { SettingsBar } from "./SettingsBar";
import { MinimizedPanel } from "./MinimizedPanel";
import { GateTable } from "./GateTable";
import { FiguresPanel } from "./FiguresPanel";
import { NotesPanel } from "./NotesPanel";
import { RevisionsPanel } from "./RevisionsPanel";
import { Schematic } from "@/components/schematic/Schematic";

const EquationEditor = dynamic(() => import("@/components/editor/EquationEditor"), {
  ssr: false,
  loading: () => <div className="h-full animate-pulse rounded border border-rule bg-sheet" />,
});

type Tab = "minimized" | "gates" | "figures" | "notes";

/** The designer's page: equations on the left, what they become on the right, revisions below. */
export function Workbench({ ws, designId }: { ws: string; designId: string }) {
  const { data: wsData } = useSWR<{ workspace: WorkspaceInfo }>(`/api/v1/workspaces/${ws}`);
  const { data: designData, error: designError, mutate: mutateDesign } = useSWR<{ design: DesignItem }>(
    `/api/v1/workspaces/${ws}/designs/${designId}`,
  );
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
  const [draftState, setDraftState] = useState<"saved" | "saving" | "unsaved" | "failed">("saved");
  const loaded = useRef(false);

  useEffect(() => {
    if (loaded.current || !designData) return;
    loaded.current = true;
    const d = designData.design;
    setSource(d.draftSource ?? "");
    setFamilyId(d.family.id);
    setSettings(stripFamily(d.settings ?? {}));
  }, [designData]);

  const compile = useCompile(ws, source ?? "", familyId, settings);
  const result = compile.data?.result ?? null;
  const diagnostics = compile.data?.diagnostics ?? [];
  const errors = diagnostics.filter((d) => d.severity === "error").length;

  // Keep the draft on the server as the designer types, so nothing typed is lost.
  // The source goes on its own: a setting the server refuses never costs the text.
  const draft = useDebounced({ source, familyId, settings }, 1200);
  const [draftError, setDraftError] = useState<string | null>(null);
  useEffect(() => {
    if (!mayEdit || !loaded.current || draft.source === null || !designData) return;
    const d = designData.design;
    const url = `/api/v1/workspaces/${ws}/designs/${designId}`;
    const sourceChanged = draft.source !== d.draftSource;
    const settingsChanged = draft.familyId !== d.family.id || JSON.stringify(draft.settings) !== JSON.stringify(stripFamily(d.settings ?? {}));
    if (!sourceChanged && !settingsChanged) return;
    setDraftState("saving");
    (async () => {
      let latest: { design: DesignItem } | null = null;
      try {
        if (sourceChanged) latest = await api<{ design: DesignItem }>(url, { method: "PATCH", json: { draftSource: draft.source } });
        if (settingsChanged) latest = await api<{ design: DesignItem }>(url, { method: "PATCH", json: { familyId: draft.familyId, settings: draft.settings } });
        setDraftState("saved");
        setDraftError(null);
      } catch (e) {
        setDraftState("failed");
        setDraftError(e instanceof ApiError ? e.message : "The server could not be reached; your text stays here and is sent again with the next change.");
      }
      if (latest) void mutateDesign(latest, { revalidate: false });
    })();
  }, [draft, mayEdit, ws, designId, designData, mutateDesign]);

  useEffect(() => {
    if (source !== null && designData && source !== designData.design.draftSource) setDraftState("unsaved");
  }, [source, designData]);

  const saveRevision = useCallback(async () => {
    if (!maySave || source === null || !familyId) return;
    setSaveError(null);
    try {
      await api(`/api/v1/workspaces/${ws}/designs/${designId}/revisions`, {
        method: "POST",
        json: { message: saveMessage.trim() || "Saved from the workbench", source, familyId, settings },
      });
      setSaving(false);
      setSaveMessage("");
      await mutateRevisions();
    } catch (e) {
      setSaveError(e instanceof ApiError ? e.message : String(e));
    }
  }, [maySave, source, familyId, ws, designId, saveMessage, settings, mutateRevisions]);

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

  const selectGate = (id: string) => {
    setSelected(id);
    setTab("gates");
    requestAnimationFrame(() => document.getElementById(`gate-row-${id}`)?.scrollIntoView({ block: "nearest" }));
  };

  if (designError) return <main className="p-8 text-vermilion" role="alert">{designError.message}</main>;
  const design = designData?.design;
  const latest = revisions?.items[0];
  const family = families?.items.find((f) => f.id === familyId);

  return (
    <main className="mx-auto max-w-[100rem] px-4 py-4">
      <div className="mb-3 flex flex-wrap items-center gap-3">
        <Link href={`/w/${ws}`} className="text-sm text-graphite hover:text-ink">← Designs</Link>
        <h1 className="text-xl font-semibold">{design?.name ?? "…"}</h1>
        <span className="text-sm text-graphite">
          {family?.name}
          {latest ? ` · last revision r${latest.number}` : revisions ? " · no revision yet" : ""}
        </span>
        <span className="ml-auto flex items-center gap-3 text-sm">
          <CompileStatus pending={compile.pending || compile.isValidating} cancelled={compile.cancelled}
            errors={errors} error={compile.error} onCancel={compile.cancel} />
          {mayEdit && (
            <span className={`text-xs ${draftState === "failed" ? "text-vermilion" : "text-graphite"}`} data-testid="draft-state"
              title={draftError ?? undefined}>
              {draftState === "saving" ? "keeping draft…" : draftState === "failed" ? `draft not kept: ${draftError ?? "try again"}` : draftState === "unsaved" ? "draft changed" : "draft kept"}
            </span>
          )}
          {maySave ? (
            <button type="button" onClick={() => setSaving(true)} disabled={errors > 0 || !source}
              className="rounded bg-accent px-3 py-1.5 font-semibold text-paper hover:opacity-90 disabled:opacity-50"
              title="Save a revision (Ctrl+S)">
              Save revision
            </button>
          ) : role ? (
            <span className="text-xs text-graphite">read only for your role</span>
          ) : null}
        </span>
      </div>

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

      <div className="grid gap-4 xl:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
        <section className="flex min-h-[32rem] flex-col rounded border border-rule bg-sheet" aria-label="Equations">
          <div className="border-b border-rule px-3 py-1.5 text-xs uppercase tracking-wide text-graphite">Equations</div>
          <div className="min-h-[28rem] flex-1" data-testid="editor">
            {source !== null && (
              <EquationEditor value={source} onChange={(v: string) => setSource(v)} readOnly={!mayEdit}
                diagnostics={diagnostics} height="100%" />
            )}
          </div>
        </section>

        <section className="flex flex-col gap-3" aria-label="Results">
          <div className="rounded border border-rule bg-sheet p-2">
            {result ? (
              <Schematic netlist={result.netlist} critical={critical} selected={selected} onSelect={selectGate} />
            ) : (
              <div className="flex h-[360px] items-center justify-center text-sm text-graphite">
                {errors ? "Fix the errors in the equations to see the schematic." : "Compiling…"}
              </div>
            )}
          </div>
          <div className="rounded border border-rule bg-sheet">
            <div role="tablist" className="flex border-b border-rule text-sm">
              {([
                ["minimized", "Minimized"],
                ["gates", `Gates${result ? ` (${result.netlist.gates.length})` : ""}`],
                ["figures", "Figures"],
                ["notes", `Notes${diagnostics.length + (result?.warnings.length ?? 0) ? ` (${diagnostics.length + (result?.warnings.length ?? 0)})` : ""}`],
              ] as Array<[Tab, string]>).map(([t, label]) => (
                <button key={t} role="tab" type="button" aria-selected={tab === t} onClick={() => setTab(t)}
                  className={`px-4 py-2 ${tab === t ? "border-b-2 border-accent font-semibold text-ink" : "text-graphite hover:text-ink"}`}>
                  {label}
                </button>
              ))}
            </div>
            <div className="max-h-[30rem] overflow-auto p-3">
              {!result && !diagnostics.length && !compile.error ? (
                <p className="text-sm text-graphite">Compiling…</p>
              ) : tab === "notes" || !result ? (
                <NotesPanel diagnostics={diagnostics} warnings={result?.warnings ?? []} analysis={result?.analysis ?? null} />
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
        <RevisionsPanel ws={ws} designId={designId} revisions={revisions?.items ?? []} />
      </section>
    </main>
  );
}

function stripFamily(s: Record<string, unknown>): WorkbenchSettings {
  const { familyId: _f, ...rest } = s;
  return rest as WorkbenchSettings;
}

function CompileStatus({ pending, cancelled, errors, error, onCancel }: {
  pending: boolean;
  cancelled: boolean;
  errors: number;
  error: unknown;
  onCancel: () => void;
}) {
  if (pending) {
    return (
      <span className="flex items-center gap-2 text-graphite" data-testid="compile-status">
        <span className="inline-block h-2 w-2 animate-pulse rounded-full bg-accent" /> minimizing…
        <button type="button" onClick={onCancel} className="rounded border border-rule px-2 py-0.5 text-xs hover:border-ink">Cancel</button>
      </span>
    );
  }
  if (cancelled) return <span className="text-amber" data-testid="compile-status">stopped — edit to run again</span>;
  if (error instanceof ApiError) {
    const limit = (error.details as { limit?: string } | undefined)?.limit;
    return (
      <span role="alert" className="max-w-xl text-vermilion" data-testid="compile-status">
        {limit ? `Stopped at a limit (${limit}): ` : ""}{error.message}
      </span>
    );
  }
  if (errors) return <span className="text-vermilion" data-testid="compile-status">{errors} error{errors === 1 ? "" : "s"} in the equations</span>;
  return <span className="text-accent" data-testid="compile-status">up to date · verified</span>;
}
