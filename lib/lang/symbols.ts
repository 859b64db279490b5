import type { Program, Range } from "./ast";

/** A named thing of a program, for editor completion and hover. */
export interface SymbolInfo {
  name: string;
  role: "input" | "output" | "intermediate" | "block" | "parameter" | "result" | "library";
  /** Where the name is declared (for outputs: on the outputs line). */
  declared: Range;
  /** The statement that gives its value, when there is one. */
  defined: Range | null;
  /** null for the design; the block's name for names inside a block. */
  block: string | null;
}

/** Every declared name of a (possibly partial) program, in source order. */
export function symbolTable(p: Program): SymbolInfo[] {
  const out: SymbolInfo[] = [];
  const defs = new Map<string, Range>();
  const scan = (statements: Program["statements"], block: string | null) => {
    for (const s of statements) {
      if (s.kind === "assign") {
        for (const t of s.targets) {
          const key = `${block ?? ""}:${t.text}`;
          if (!defs.has(key)) defs.set(key, s.range);
          if (s.isLet) out.push({ name: t.text, role: "intermediate", declared: t.range, defined: s.range, block });
        }
      }
    }
  };
  for (const s of p.statements) {
    if (s.kind === "inputs") for (const n of s.names) out.push({ name: n.text, role: "input", declared: n.range, defined: null, block: null });
    if (s.kind === "outputs") for (const n of s.names) out.push({ name: n.text, role: "output", declared: n.range, defined: null, block: null });
    if (s.kind === "use") out.push({ name: s.name.text, role: "library", declared: s.name.range, defined: s.range, block: null });
    if (s.kind === "block") {
      out.push({ name: s.name.text, role: "block", declared: s.name.range, defined: s.headerRange, block: null });
      for (const n of s.params) out.push({ name: n.text, role: "parameter", declared: n.range, defined: null, block: s.name.text });
      for (const n of s.results) out.push({ name: n.text, role: "result", declared: n.range, defined: null, block: s.name.text });
      scan(s.body, s.name.text);
    }
  }
  scan(p.statements, null);
  for (const sym of out) {
    if (sym.role === "output" || sym.role === "result") sym.defined = defs.get(`${sym.block ?? ""}:${sym.name}`) ?? null;
  }
  return out.sort((a, b) => a.declared.line - b.declared.line || a.declared.column - b.declared.column);
}
