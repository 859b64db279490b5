"use client";
/**
 * The equation editor: Monaco with the Fanbound language, loaded from the
 * local monaco-editor package (never a CDN). Import it through next/dynamic
 * with ssr: false, for example:
 *
 *   const EquationEditor = dynamic(() => import("@/components/editor/EquationEditor"), { ssr: false });
 */
import Editor, { loader } from "@monaco-editor/react";
import type * as Monaco from "monaco-editor";
import { useEffect, useMemo, useRef, useState } from "react";
import type { Diagnostic } from "../../lib/lang/index";
import { FANBOUND_LANGUAGE_ID, NIGHT_THEME, PAPER_THEME, registerFanboundLanguage, setDiagnosticsMarkers, setLibraryCatalog, type LibraryCatalog } from "./fanbound-language";

export interface EquationEditorProps {
  value: string;
  onChange?: (value: string) => void;
  /** Default false. */
  readOnly?: boolean;
  /** Shown as markers; pass the diagnostics of compileSource for the current value. */
  diagnostics?: readonly Diagnostic[];
  /** CSS height; default "24rem". */
  height?: number | string;
  /** Default: follows the system colour scheme, as the app's CSS does. */
  theme?: typeof PAPER_THEME | typeof NIGHT_THEME;
  /** Accessible label of the editing area. Default "Equations". */
  ariaLabel?: string;
  /** The libraries the workspace may use: completion of use lines and hover over library blocks. Default none. */
  libraries?: LibraryCatalog;
  /** Called once the editor exists, for callers that move the cursor or reveal a line (e.g. from a diagnostic list). */
  onMount?: (editor: Monaco.editor.IStandaloneCodeEditor, monaco: MonacoApi) => void;
}

type MonacoApi = typeof Monaco;

let loading: Promise<MonacoApi> | null = null;

/** Loads the bundled Monaco once, with its editor worker from the local package. */
function loadMonaco(): Promise<MonacoApi> {
  loading ??= (async () => {
    (self as unknown as { MonacoEnvironment: Monaco.Environment }).MonacoEnvironment = {
      getWorker() {
        return new Worker(new URL("monaco-editor/editor/editor.worker.js", import.meta.url), { type: "module" });
      },
    };
    const monaco = (await import("./monaco")).default as unknown as MonacoApi;
    loader.config({ monaco });
    registerFanboundLanguage(monaco);
    return monaco;
  })();
  return loading;
}

function useSystemDark(): boolean {
  const [dark, setDark] = useState(false);
  useEffect(() => {
    const q = window.matchMedia("(prefers-color-scheme: dark)");
    setDark(q.matches);
    const on = (e: MediaQueryListEvent) => setDark(e.matches);
    q.addEventListener("change", on);
    return () => q.removeEventListener("change", on);
  }, []);
  return dark;
}

export default function EquationEditor({
  value,
  onChange,
  readOnly = false,
  diagnostics = [],
  height = "24rem",
  theme,
  ariaLabel = "Equations",
  libraries,
  onMount,
}: EquationEditorProps) {
  const [monaco, setMonaco] = useState<MonacoApi | null>(null);
  const [failed, setFailed] = useState<string | null>(null);
  const editorRef = useRef<Monaco.editor.IStandaloneCodeEditor | null>(null);
  const monacoRef = useRef<MonacoApi | null>(null);
  // The model is the source of truth while typing. React may commit a render
  // whose `value` is a text the editor reported a few keystrokes ago; pushing
  // that back would undo the newer keystrokes, so only values the editor did
  // not report itself are written into the model.
  const reported = useRef(new Set<string>());
  const dark = useSystemDark();
  // A fresh options object on every render makes Monaco re-apply them and
  // drop keystrokes typed meanwhile, so they change only with their inputs.
  const options = useMemo<Monaco.editor.IStandaloneEditorConstructionOptions>(
    () => ({
      readOnly,
      ariaLabel,
      minimap: { enabled: false },
      fontFamily: "var(--font-mono), ui-monospace, monospace",
      fontSize: 14,
      lineHeight: 21,
      tabSize: 2,
      insertSpaces: true,
      scrollBeyondLastLine: false,
      renderLineHighlight: "line",
      lineNumbersMinChars: 3,
      glyphMargin: false,
      folding: true,
      wordBasedSuggestions: "off",
      automaticLayout: true,
      fixedOverflowWidgets: true,
      // A file dropped on the editor goes to the page's import (a truth table or Verilog module
      // becomes the draft after a preview), not into the text as a path.
      dropIntoEditor: { enabled: false },
    }),
    [readOnly, ariaLabel],
  );

  useEffect(() => {
    const editor = editorRef.current;
    const model = editor?.getModel();
    if (!editor || !model) return;
    if (value === model.getValue()) {
      reported.current.clear();
      return;
    }
    if (reported.current.has(value)) return;
    reported.current.clear();
    // a read-only editor refuses edits, and has no undo history worth keeping
    if (editor.getOption(monacoRef.current!.editor.EditorOption.readOnly)) {
      editor.setValue(value);
      return;
    }
    editor.executeEdits("fanbound-value", [{ range: model.getFullModelRange(), text: value }]);
    editor.pushUndoStop();
  }, [value]);

  useEffect(() => {
    let live = true;
    loadMonaco().then(
      (m) => live && setMonaco(m),
      (e: unknown) => live && setFailed(e instanceof Error ? e.message : String(e)),
    );
    return () => {
      live = false;
    };
  }, []);

  useEffect(() => {
    const model = editorRef.current?.getModel();
    if (monaco && model) setDiagnosticsMarkers(monaco, model, diagnostics);
  }, [monaco, diagnostics]);

  const librariesRef = useRef(libraries);
  librariesRef.current = libraries;
  useEffect(() => {
    const model = editorRef.current?.getModel();
    if (model) setLibraryCatalog(model, libraries);
  }, [monaco, libraries]);

  if (failed) {
    return (
      <div className="border border-vermilion p-3 font-mono text-sm text-vermilion" style={{ height }}>
        The editor could not load ({failed}). Reload the page to try again.
      </div>
    );
  }
  if (!monaco) {
    return (
      <div className="flex items-center border border-rule bg-paper px-3 font-mono text-sm text-graphite" style={{ height }} aria-busy="true">
        Loading the editor…
      </div>
    );
  }
  return (
    <div className="border border-rule" style={{ height }}>
      <Editor
        height="100%"
        language={FANBOUND_LANGUAGE_ID}
        theme={theme ?? (dark ? NIGHT_THEME : PAPER_THEME)}
        defaultValue={value}
        onChange={(v) => {
          reported.current.add(v ?? "");
          onChange?.(v ?? "");
        }}
        onMount={(editor) => {
          editorRef.current = editor;
          monacoRef.current = monaco;
          onMount?.(editor, monaco);
          const model = editor.getModel();
          if (model) setDiagnosticsMarkers(monaco, model, diagnostics);
          if (model) setLibraryCatalog(model, librariesRef.current);
        }}
        loading={<span className="font-mono text-sm text-graphite">Loading the editor…</span>}
        options={options}
      />
    </div>
  );
}
