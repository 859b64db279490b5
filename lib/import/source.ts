/**
 * Writing design sources: declarations, minterm lists and sums of products
 * in the language's canonical spelling, with long lines continued after a
 * comma or an operator (the language joins such lines into one statement).
 */
import { cubeToString, type Cube } from "../logic/index";

/** Lines are continued once they would pass this many characters. */
export const LINE_WIDTH = 100;

/** `head` followed by the items joined with `sep`, continued on new lines (indented by `indent`) after a separator. */
export function wrapJoin(head: string, items: readonly string[], sep: string, tail = "", indent = "    "): string {
  const lines: string[] = [];
  let line = head;
  for (let i = 0; i < items.length; i++) {
    const piece = items[i]! + (i < items.length - 1 ? sep.trimEnd() : "");
    const candidate = line + (i === 0 || line === indent ? "" : " ") + piece;
    if (i > 0 && line !== indent && candidate.length > LINE_WIDTH) {
      lines.push(line);
      line = indent + piece;
    } else {
      line = candidate;
    }
  }
  lines.push(line + tail);
  return lines.join("\n");
}

/** Length of wrapJoin's text without the line breaks, for comparing spellings. */
export function joinedLength(items: readonly string[], sep: string): number {
  let n = 0;
  for (const it of items) n += it.length;
  return n + Math.max(0, items.length - 1) * sep.length;
}

/** Minterm indices (ascending, distinct) as list items: runs of three or more become lo..hi. */
export function indexItems(minterms: readonly number[]): string[] {
  const out: string[] = [];
  let i = 0;
  while (i < minterms.length) {
    let j = i;
    while (j + 1 < minterms.length && minterms[j + 1] === minterms[j]! + 1) j++;
    if (j - i >= 2) out.push(`${minterms[i]}..${minterms[j]}`);
    else for (let k = i; k <= j; k++) out.push(String(minterms[k]));
    i = j + 1;
  }
  return out;
}

/** A cube as a product of literals over `inputs` (postfix ' for NOT); the empty product is 1. */
export function productText(c: Cube, inputs: readonly string[]): string {
  const s = cubeToString(c, inputs.length);
  const lits: string[] = [];
  for (let i = 0; i < s.length; i++) {
    if (s[i] === "1") lits.push(inputs[i]!);
    else if (s[i] === "0") lits.push(`${inputs[i]}'`);
  }
  return lits.length ? lits.join(" * ") : "1";
}
