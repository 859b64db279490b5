/**
 * The Fanbound language for Monaco: tokens (Monarch grammar), brackets and
 * comment toggling, completion of keywords and declared names, hover with a
 * name's definition, diagnostics as markers, and the two sheet themes.
 * Works with the local monaco-editor package handed in by the caller.
 */
import type * as Monaco from "monaco-editor";
import { formatSource, KEYWORDS, parseSource, symbolTable, type Diagnostic, type Program, type SymbolInfo } from "../../lib/lang/index";

export const FANBOUND_LANGUAGE_ID = "fanbound";
/** File extension of Fanbound sources. */
export const FANBOUND_EXTENSION = ".fnb";
const MARKER_OWNER = "fanbound";

type MonacoApi = typeof Monaco;

const registered = new WeakSet<object>();

const monarch: Monaco.languages.IMonarchLanguage = {
  defaultToken: "invalid",
  keywords: KEYWORDS.filter((k) => k !== "on" && k !== "off" && k !== "dc"),
  setWords: ["on", "off", "dc"],
  tokenizer: {
    root: [
      [/\/\/.*$/, "comment"],
      [/[A-Za-z_][A-Za-z0-9_]*(?=\s*\()/, { cases: { "@setWords": "keyword.set", "@keywords": "keyword", "@default": "function" } }],
      [/[A-Za-z_][A-Za-z0-9_]*/, { cases: { "@setWords": "keyword.set", "@keywords": "keyword", "@default": "identifier" } }],
      [/[0-9]+/, "number"],
      [/\.\./, "operator.range"],
      [/"[^"\n]*"/, "string"],
      [/"[^"\n]*$/, "string.invalid"],
      [/->/, "operator.arrow"],
      [/'/, "operator.not"],
      [/[!~]/, "operator.not"],
      [/[+|*&\u00b7^=]/, "operator"],
      [/[()]/, "@brackets"],
      [/,/, "delimiter"],
      [/[ \t\r]+/, "white"],
    ],
  },
};

const configuration: Monaco.languages.LanguageConfiguration = {
  comments: { lineComment: "//" },
  brackets: [["(", ")"]],
  autoClosingPairs: [
    { open: "(", close: ")" },
    { open: '"', close: '"', notIn: ["string", "comment"] },
  ],
  surroundingPairs: [
    { open: "(", close: ")" },
    { open: '"', close: '"' },
  ],
  wordPattern: /[A-Za-z_][A-Za-z0-9_]*|[0-9]+/,
  indentationRules: {
    increaseIndentPattern: /^\s*block\b.*$/,
    decreaseIndentPattern: /^\s*end\b.*$/,
  },
};

const keywordHelp: Record<string, string> = {
  inputs: "Declares the inputs. Declaration order is minterm bit order: the first input is the most significant bit.",
  outputs: "Declares the outputs; each is assigned exactly once.",
  on: "on(1, 3, 5..7): the ON-set as minterm indices.",
  off: "off(0, 4): the OFF-set as minterm indices; the rest (minus don't-cares) is ON.",
  dc: "dc(0, 2): don't-care minterms of an output.",
  let: "let t = ...: an intermediate signal, usable in later equations but not an output.",
  never: "never a * b: input combinations that cannot occur; they become don't-cares of every output.",
  block: "block name(x, y) -> (s, c) ... end: a reusable block with one or more results.",
  end: "Ends a block.",
  use: 'use name from "library" at 3: bring in revision 3 of a library block; call it like a block of the design.',
  from: "Names the library in a use line.",
  at: "Names the library revision in a use line.",
};

function blockAt(program: Program, line: number): string | null {
  for (const s of program.statements) {
    if (s.kind === "block" && s.range.line < line && line <= s.range.endLine) return s.name.text;
  }
  return null;
}

function visibleSymbols(program: Program, line: number): SymbolInfo[] {
  const inside = blockAt(program, line);
  return symbolTable(program).filter((s) => s.block === inside || s.role === "block" || s.role === "library");
}

/**
 * What the editor knows of the libraries a workspace may use, for completing
 * use lines and explaining library blocks on hover. Handed in by the page
 * (EquationEditor's `libraries` prop), per editor model.
 */
export interface LibraryCatalog {
  libraries: Array<{
    /** As use lines write it. */
    ref: string;
    name: string;
    blocks: Array<{
      name: string;
      /** The newest revision that may be used; null when none may yet. */
      latest: number | null;
      revisions: Array<{
        number: number;
        state: "published" | "awaiting review";
        message: string;
        inputs: string[];
        outputs: string[];
        family: string;
        stats: { gates?: number; depth?: number; packages?: number | null; delayNs?: number | null };
      }>;
    }>;
  }>;
}

const catalogs = new WeakMap<object, LibraryCatalog>();

/** Gives the language the library catalog for one editor model. */
export function setLibraryCatalog(model: Monaco.editor.ITextModel, catalog: LibraryCatalog | undefined): void {
  if (catalog) catalogs.set(model, catalog);
  else catalogs.delete(model);
}

type CatalogRevision = LibraryCatalog["libraries"][number]["blocks"][number]["revisions"][number];

function portsText(r: CatalogRevision): string {
  return `(${r.inputs.join(", ")}) → (${r.outputs.join(", ")})`;
}

function figuresText(r: CatalogRevision): string {
  const s = r.stats;
  const parts = [
    s.gates !== undefined ? `${s.gates} gates` : null,
    s.depth !== undefined ? `depth ${s.depth}` : null,
    typeof s.packages === "number" ? `${s.packages} packages` : null,
    s.delayNs != null ? `delay ${s.delayNs.toFixed(1)} ns (est.)` : null,
  ].filter(Boolean);
  return `${parts.join(", ")} — ${r.family}`;
}

/** Markdown that explains a library block revision: ports, figures, state. */
export function libraryBlockHover(catalog: LibraryCatalog | undefined, library: string, block: string, revision: number | null): string[] {
  const lib = catalog?.libraries.find((l) => l.ref === library);
  const b = lib?.blocks.find((x) => x.name === block);
  const head = `**library block** \`${block}\` from "${library}"${revision !== null ? ` at ${revision}` : ""}`;
  if (!lib || !b) return [head, "Not among the libraries this workspace may use."];
  const r = b.revisions.find((x) => x.number === revision);
  if (!r) return [head, `No revision ${revision ?? "given"}; its revisions are ${b.revisions.map((x) => x.number).join(", ")} (latest that may be used: ${b.latest ?? "none yet"}).`];
  const out = [
    `${head} — ${lib.name}`,
    `Ports: \`${portsText(r)}\` (its inputs are the parameters of a call, its outputs the results)`,
    `r${r.number}: ${r.message}${r.state === "awaiting review" ? " — awaiting review, not usable yet" : ""}`,
    `Figures when published: ${figuresText(r)}. Estimates; check the parts' data sheets.`,
  ];
  if (b.latest !== null && b.latest > r.number) out.push(`A newer revision is available: r${b.latest}.`);
  return out;
}

/** Completion items for a use line, from the text before the cursor; null when the cursor is not in one. */
function completionsOnUseLine(monaco: MonacoApi, catalog: LibraryCatalog | undefined, before: string, after: string, line: number, column: number): Monaco.languages.CompletionItem[] | null {
  const { languages } = monaco;
  const libs = catalog?.libraries ?? [];
  const at = /^\s*use\s+([A-Za-z_][A-Za-z0-9_]*)\s+from\s+"([^"]*)"\s+at\s+(\d*)$/.exec(before);
  if (at) {
    const b = libs.find((l) => l.ref === at[2])?.blocks.find((x) => x.name === at[1]);
    const range = new monaco.Range(line, column - at[3]!.length, line, column);
    return (b?.revisions ?? []).slice().reverse().map((r, i) => ({
      label: String(r.number),
      kind: languages.CompletionItemKind.Value,
      detail: `${r.number === b!.latest ? "latest · " : ""}${r.state} · ${portsText(r)}`,
      documentation: `${r.message}\n\n${figuresText(r)}`,
      insertText: String(r.number),
      range,
      sortText: String(i).padStart(4, "0"),
    }));
  }
  const afterLib = /^\s*use\s+([A-Za-z_][A-Za-z0-9_]*)\s+from\s+"([^"]*)"\s*$/.exec(before);
  if (afterLib) {
    const b = libs.find((l) => l.ref === afterLib[2])?.blocks.find((x) => x.name === afterLib[1]);
    if (!b || b.latest === null) return [];
    return [{
      label: `at ${b.latest}`,
      kind: languages.CompletionItemKind.Keyword,
      detail: "the latest revision",
      insertText: `${before.endsWith(" ") ? "" : " "}at ${b.latest}`,
      range: new monaco.Range(line, column, line, column),
    }];
  }
  const lib = /^\s*use\s+([A-Za-z_][A-Za-z0-9_]*)\s+from\s+"([^"]*)$/.exec(before);
  if (lib) {
    const typed = lib[2]!;
    const range = new monaco.Range(line, column - typed.length, line, column);
    const closes = after.startsWith('"');
    return libs
      .slice()
      .sort((a, b) => Number(!a.blocks.some((x) => x.name === lib[1])) - Number(!b.blocks.some((x) => x.name === lib[1])))
      .map((l, i) => ({
        label: l.ref,
        kind: languages.CompletionItemKind.Module,
        detail: l.name,
        documentation: `Blocks: ${l.blocks.map((x) => x.name).join(", ") || "none yet"}`,
        insertText: closes ? l.ref : `${l.ref}"`,
        range,
        sortText: String(i).padStart(4, "0"),
      }));
  }
  const name = /^\s*use\s+([A-Za-z_][A-Za-z0-9_]*)?$/.exec(before);
  if (name) {
    const typed = name[1] ?? "";
    const range = new monaco.Range(line, column - typed.length, line, column);
    return libs.flatMap((l) =>
      l.blocks.filter((b) => b.latest !== null).map((b) => {
        const r = b.revisions.find((x) => x.number === b.latest)!;
        return {
          label: b.name,
          kind: languages.CompletionItemKind.Function,
          detail: `from "${l.ref}" at ${b.latest} · ${portsText(r)}`,
          documentation: `${l.name}: ${r.message}\n\n${figuresText(r)}`,
          insertText: `${b.name} from "${l.ref}" at ${b.latest}`,
          range,
        };
      }),
    );
  }
  return null;
}

const roleLabel: Record<SymbolInfo["role"], string> = {
  input: "input",
  output: "output",
  intermediate: "intermediate",
  block: "block",
  parameter: "block parameter",
  result: "block result",
  library: "library block",
};

/**
 * Registers the language, its themes and providers on this Monaco instance.
 * Safe to call more than once.
 */
export function registerFanboundLanguage(monaco: MonacoApi): void {
  if (registered.has(monaco)) return;
  registered.add(monaco);
  const { languages } = monaco;
  languages.register({ id: FANBOUND_LANGUAGE_ID, extensions: [FANBOUND_EXTENSION], aliases: ["Fanbound", "fanbound"] });
  languages.setMonarchTokensProvider(FANBOUND_LANGUAGE_ID, monarch);
  languages.setLanguageConfiguration(FANBOUND_LANGUAGE_ID, configuration);
  defineThemes(monaco);
  registerNavigation(monaco);

  languages.registerCompletionItemProvider(FANBOUND_LANGUAGE_ID, {
    triggerCharacters: ["(", ",", '"', " "],
    provideCompletionItems(model, position, context) {
      const lineText = model.getLineContent(position.lineNumber);
      const upToCursor = lineText.slice(0, position.column - 1);
      if (!upToCursor.includes("//")) {
        const use = completionsOnUseLine(monaco, catalogs.get(model), upToCursor, lineText.slice(position.column - 1), position.lineNumber, position.column);
        if (use) return { suggestions: use };
      }
      // A space or a quote opens the list only on use lines.
      if (context.triggerCharacter === " " || context.triggerCharacter === '"') return { suggestions: [] };
      const word = model.getWordUntilPosition(position);
      const range = new monaco.Range(position.lineNumber, word.startColumn, position.lineNumber, word.endColumn);
      const before = model.getLineContent(position.lineNumber).slice(0, word.startColumn - 1);
      if (before.includes("//")) return { suggestions: [] };
      const program = parseSource(model.getValue()).program;
      const suggestions: Monaco.languages.CompletionItem[] = [];
      for (const k of KEYWORDS) {
        suggestions.push({
          label: k,
          kind: languages.CompletionItemKind.Keyword,
          insertText: k === "on" || k === "off" || k === "dc" ? `${k}($0)` : k,
          insertTextRules: languages.CompletionItemInsertTextRule.InsertAsSnippet,
          documentation: keywordHelp[k],
          range,
          sortText: "2" + k,
        });
      }
      suggestions.push({
        label: "block … end",
        kind: languages.CompletionItemKind.Snippet,
        insertText: "block ${1:name}(${2:x, y}) -> (${3:s, c})\n  $0\nend",
        insertTextRules: languages.CompletionItemInsertTextRule.InsertAsSnippet,
        documentation: keywordHelp.block,
        range,
        sortText: "3block",
      });
      const seen = new Set<string>();
      for (const s of visibleSymbols(program, position.lineNumber)) {
        if (seen.has(s.name)) continue;
        seen.add(s.name);
        const isBlock = s.role === "block" || s.role === "library";
        suggestions.push({
          label: s.name,
          kind: isBlock
            ? languages.CompletionItemKind.Function
            : s.role === "input" || s.role === "parameter"
              ? languages.CompletionItemKind.Variable
              : languages.CompletionItemKind.Field,
          detail: roleLabel[s.role],
          insertText: isBlock ? `${s.name}($0)` : s.name,
          insertTextRules: languages.CompletionItemInsertTextRule.InsertAsSnippet,
          range,
          sortText: "1" + s.name,
        });
      }
      return { suggestions };
    },
  });

  languages.registerHoverProvider(FANBOUND_LANGUAGE_ID, {
    provideHover(model, position) {
      const word = model.getWordAtPosition(position);
      if (!word) return null;
      const range = new monaco.Range(position.lineNumber, word.startColumn, position.lineNumber, word.endColumn);
      if (word.word in keywordHelp) return { range, contents: [{ value: `**${word.word}** — ${keywordHelp[word.word]}` }] };
      const program = parseSource(model.getValue()).program;
      const all = symbolTable(program);
      const sym = visibleSymbols(program, position.lineNumber).find((s) => s.name === word.word);
      if (!sym) return null;
      if (sym.role === "library") {
        const use = program.statements.find((x): x is Extract<Program["statements"][number], { kind: "use" }> => x.kind === "use" && x.name.text === sym.name);
        if (use) return { range, contents: libraryBlockHover(catalogs.get(model), use.library, use.name.text, use.revision).map((value) => ({ value })) };
      }
      const at = sym.defined ?? sym.declared;
      const lines: string[] = [];
      for (let l = at.line; l <= Math.min(at.endLine, at.line + 5); l++) lines.push(model.getLineContent(l).trim());
      let head = `**${roleLabel[sym.role]}** \`${sym.name}\``;
      if (sym.role === "input") {
        const inputs = all.filter((s) => s.role === "input");
        const k = inputs.findIndex((s) => s.declared.line === sym.declared.line && s.declared.column === sym.declared.column);
        head += ` — input ${k + 1} of ${inputs.length}, minterm bit ${inputs.length - 1 - k} (the first input is the most significant)`;
      }
      const where = sym.defined ? `defined on line ${at.line}` : `declared on line ${at.line}`;
      return {
        range,
        contents: [{ value: `${head}; ${where}` }, { value: "```fanbound\n" + lines.join("\n") + "\n```" }],
      };
    },
  });
}

/** Go to definition (F12) and document formatting (Shift+Alt+F) with the canonical printer. */
function registerNavigation(monaco: MonacoApi): void {
  const { languages } = monaco;
  languages.registerDefinitionProvider(FANBOUND_LANGUAGE_ID, {
    provideDefinition(model, position) {
      const word = model.getWordAtPosition(position);
      if (!word) return null;
      const program = parseSource(model.getValue()).program;
      const sym = visibleSymbols(program, position.lineNumber).find((s) => s.name === word.word);
      if (!sym) return null;
      const r = sym.role === "output" || sym.role === "result" ? (sym.defined ?? sym.declared) : sym.declared;
      return { uri: model.uri, range: new monaco.Range(r.line, r.column, r.endLine, r.endColumn) };
    },
  });
  languages.registerDocumentFormattingEditProvider(FANBOUND_LANGUAGE_ID, {
    provideDocumentFormattingEdits(model) {
      const result = formatSource(model.getValue());
      if (!("text" in result) || result.text === model.getValue()) return [];
      return [{ range: model.getFullModelRange(), text: result.text }];
    },
  });
}

/**
 * Shows diagnostics as markers on the model. Zero-width ranges are widened
 * to one character so that they stay visible.
 */
export function setDiagnosticsMarkers(monaco: MonacoApi, model: Monaco.editor.ITextModel, diagnostics: readonly Diagnostic[]): void {
  const markers: Monaco.editor.IMarkerData[] = diagnostics.map((d) => {
    const zero = d.line === d.endLine && d.column === d.endColumn;
    return {
      severity: d.severity === "error" ? monaco.MarkerSeverity.Error : monaco.MarkerSeverity.Warning,
      message: d.message,
      startLineNumber: d.line,
      startColumn: zero ? Math.max(1, d.column - 1) : d.column,
      endLineNumber: d.endLine,
      endColumn: zero ? d.column + (d.column === 1 ? 1 : 0) : d.endColumn,
      source: "fanbound",
    };
  });
  monaco.editor.setModelMarkers(model, MARKER_OWNER, markers);
}

export const PAPER_THEME = "fanbound-paper";
export const NIGHT_THEME = "fanbound-night";

function defineThemes(monaco: MonacoApi): void {
  monaco.editor.defineTheme(PAPER_THEME, {
    base: "vs",
    inherit: true,
    rules: [
      { token: "", foreground: "1d2430" },
      { token: "keyword", foreground: "0f7b6c", fontStyle: "bold" },
      { token: "keyword.set", foreground: "0f7b6c" },
      { token: "identifier", foreground: "1d2430" },
      { token: "function", foreground: "1d2430", fontStyle: "underline" },
      { token: "number", foreground: "8a5a00" },
      { token: "operator", foreground: "585e68" },
      { token: "operator.not", foreground: "b0700a", fontStyle: "bold" },
      { token: "operator.range", foreground: "8a5a00" },
      { token: "operator.arrow", foreground: "0f7b6c" },
      { token: "delimiter", foreground: "585e68" },
      { token: "string", foreground: "5b4a8a" },
      { token: "comment", foreground: "7c8089", fontStyle: "italic" },
      { token: "invalid", foreground: "cc3e20", fontStyle: "underline" },
    ],
    colors: {
      "editor.background": "#f6f4ee",
      "editor.foreground": "#1d2430",
      "editorLineNumber.foreground": "#a29d90",
      "editorLineNumber.activeForeground": "#1d2430",
      "editor.lineHighlightBackground": "#efece3",
      "editor.lineHighlightBorder": "#efece3",
      "editorCursor.foreground": "#0f7b6c",
      "editor.selectionBackground": "#cfe4de",
      "editor.inactiveSelectionBackground": "#e3e6df",
      "editorIndentGuide.background1": "#e2ded2",
      "editorBracketMatch.border": "#0f7b6c",
      "editorBracketMatch.background": "#dcebe6",
      "editorGutter.background": "#f6f4ee",
      "editorError.foreground": "#cc3e20",
      "editorWarning.foreground": "#b0700a",
      "editorWidget.background": "#fcfbf7",
      "editorWidget.border": "#d6d1c4",
      "editorHoverWidget.background": "#fcfbf7",
      "editorHoverWidget.border": "#d6d1c4",
      "editorSuggestWidget.background": "#fcfbf7",
      "editorSuggestWidget.border": "#d6d1c4",
      "editorSuggestWidget.selectedBackground": "#dcebe6",
    },
  });
  monaco.editor.defineTheme(NIGHT_THEME, {
    base: "vs-dark",
    inherit: true,
    rules: [
      { token: "", foreground: "e6e3da" },
      { token: "keyword", foreground: "40b8a4", fontStyle: "bold" },
      { token: "keyword.set", foreground: "40b8a4" },
      { token: "identifier", foreground: "e6e3da" },
      { token: "function", foreground: "e6e3da", fontStyle: "underline" },
      { token: "number", foreground: "e6aa3c" },
      { token: "operator", foreground: "a0a4aa" },
      { token: "operator.not", foreground: "e6aa3c", fontStyle: "bold" },
      { token: "operator.range", foreground: "e6aa3c" },
      { token: "operator.arrow", foreground: "40b8a4" },
      { token: "delimiter", foreground: "a0a4aa" },
      { token: "string", foreground: "b7a6e6" },
      { token: "comment", foreground: "868b93", fontStyle: "italic" },
      { token: "invalid", foreground: "f06e50", fontStyle: "underline" },
    ],
    colors: {
      "editor.background": "#181b20",
      "editor.foreground": "#e6e3da",
      "editorLineNumber.foreground": "#5d636c",
      "editorLineNumber.activeForeground": "#e6e3da",
      "editor.lineHighlightBackground": "#1f2329",
      "editor.lineHighlightBorder": "#1f2329",
      "editorCursor.foreground": "#40b8a4",
      "editor.selectionBackground": "#2c4a45",
      "editorIndentGuide.background1": "#2c3038",
      "editorBracketMatch.border": "#40b8a4",
      "editorBracketMatch.background": "#24403c",
      "editorGutter.background": "#181b20",
      "editorError.foreground": "#f06e50",
      "editorWarning.foreground": "#e6aa3c",
      "editorWidget.background": "#1f2329",
      "editorWidget.border": "#3e434b",
      "editorHoverWidget.background": "#1f2329",
      "editorHoverWidget.border": "#3e434b",
      "editorSuggestWidget.background": "#1f2329",
      "editorSuggestWidget.border": "#3e434b",
      "editorSuggestWidget.selectedBackground": "#24403c",
    },
  });
}
