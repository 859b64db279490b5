/**
 * Source → HTML with one <span> per token, for showing Fanbound code where
 * no editor runs (the reference page, read-only listings). Uses the
 * language's own lexer, so the colours always agree with the grammar.
 */
import { lexer } from "./tokens";

/** Tailwind classes per token kind; the theme tokens are defined by the app. */
const CLASSES = {
  keyword: "text-accent font-semibold",
  set: "text-accent",
  number: "text-amber",
  not: "text-amber font-semibold",
  operator: "text-graphite",
  string: "text-graphite",
  comment: "text-graphite italic",
  invalid: "text-vermilion underline",
} as const;

function kindOf(tokenName: string, image: string): keyof typeof CLASSES | null {
  if (tokenName === "Kw_on" || tokenName === "Kw_off" || tokenName === "Kw_dc") return "set";
  if (tokenName.startsWith("Kw_")) return "keyword";
  if (tokenName === "Number") return "number";
  if (tokenName === "String") return "string";
  if (tokenName === "Comment") return "comment";
  if (image === "'" || image === "!" || image === "~") return "not";
  if (tokenName === "Identifier" || tokenName === "Newline") return null;
  return "operator";
}

function escape(s: string): string {
  return s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

/** HTML for the source text (no surrounding <pre>); characters the lexer rejects are marked invalid. */
export function highlightToHtml(source: string): string {
  const lexed = lexer.tokenize(source);
  const marks: { start: number; end: number; kind: keyof typeof CLASSES }[] = [];
  for (const t of [...lexed.tokens, ...(lexed.groups.comments ?? [])]) {
    const kind = kindOf(t.tokenType.name, t.image);
    if (kind) marks.push({ start: t.startOffset, end: t.startOffset + t.image.length, kind });
  }
  for (const e of lexed.errors) marks.push({ start: e.offset, end: e.offset + e.length, kind: "invalid" });
  marks.sort((a, b) => a.start - b.start);
  let html = "";
  let at = 0;
  for (const m of marks) {
    if (m.start < at) continue;
    html += escape(source.slice(at, m.start));
    html += `<span class="${CLASSES[m.kind]}">${escape(source.slice(m.start, m.end))}</span>`;
    at = m.end;
  }
  return html + escape(source.slice(at));
}
