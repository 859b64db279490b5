/**
 * The equation source of two sides as a line diff, from the `diff` package's
 * line diff (Myers' O(ND) algorithm): every line of both texts once, in
 * reading order, kept, removed or added, with its number on each side.
 */
import { diffLines } from "diff";

export interface DiffLine {
  kind: "same" | "removed" | "added";
  /** 1-based line number in the `from` text; null for an added line. */
  from: number | null;
  /** 1-based line number in the `to` text; null for a removed line. */
  to: number | null;
  text: string;
}

function lines(s: string): string[] {
  const t = s.replace(/\r\n?/g, "\n");
  if (t === "") return [];
  const parts = t.split("\n");
  if (parts[parts.length - 1] === "") parts.pop();
  return parts;
}

/**
 * Lines of `from` and `to` as kept, removed and added. A missing newline at
 * the end of either text does not count as a change.
 */
export function lineDiff(from: string, to: string): DiffLine[] {
  const a = lines(from);
  const b = lines(to);
  const join = (ls: string[]) => ls.map((l) => `${l}\n`).join("");
  const out: DiffLine[] = [];
  let i = 0;
  let j = 0;
  for (const c of diffLines(join(a), join(b))) {
    for (let k = 0; k < c.count; k++) {
      if (c.added) out.push({ kind: "added", from: null, to: ++j, text: b[j - 1]! });
      else if (c.removed) out.push({ kind: "removed", from: ++i, to: null, text: a[i - 1]! });
      else out.push({ kind: "same", from: ++i, to: ++j, text: b[j - 1]! });
    }
  }
  return out;
}

/** How many lines were added and removed. */
export function diffCounts(d: DiffLine[]): { added: number; removed: number } {
  return { added: d.filter((l) => l.kind === "added").length, removed: d.filter((l) => l.kind === "removed").length };
}
