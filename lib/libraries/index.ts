/**
 * Shared block libraries, the parts every caller agrees on: how a use line
 * names a library, the names blocks may have, the figures compared when a
 * design could move to a newer block revision, and the folder layout the CLI
 * reads with --library. Pure: data in, data out.
 */
import { KEYWORDS, type LibraryAnswer } from "../lang/index";

/** A library's key: what use lines write. 1–64 lower-case letters, digits or dashes, starting with a letter or digit. */
export const LIBRARY_KEY = /^[a-z0-9][a-z0-9-]{0,63}$/;
/** A block's name: a name of the language (it is called like a block). */
export const BLOCK_NAME = /^[A-Za-z_][A-Za-z0-9_]{0,63}$/;

/** Why a block name cannot be used, or null when it can. */
export function blockNameProblem(name: string): string | null {
  if (!BLOCK_NAME.test(name)) return "a block's name uses letters, digits and _, does not start with a digit, and has at most 64 characters";
  if ((KEYWORDS as readonly string[]).includes(name)) return `'${name}' is a reserved word of the language`;
  return null;
}

/** A library as a use line names it: "key" (this workspace's) or "slug/key" (a workspace's, shared with this one). */
export interface LibraryName {
  /** The owning workspace's slug; null for the workspace the design is in. */
  workspace: string | null;
  key: string;
}

/** Reads the name between the quotes of a use line; null when it is not of either form. */
export function parseLibraryName(text: string): LibraryName | null {
  const parts = text.split("/");
  if (parts.length === 1 && LIBRARY_KEY.test(parts[0]!)) return { workspace: null, key: parts[0]! };
  if (parts.length === 2 && /^[a-z0-9][a-z0-9-]{1,62}$/.test(parts[0]!) && LIBRARY_KEY.test(parts[1]!)) {
    return { workspace: parts[0]!, key: parts[1]! };
  }
  return null;
}

/** How a use line in workspace `from` writes the library `key` of workspace `owner`. */
export function libraryRef(owner: string, key: string, from: string): string {
  return owner === from ? key : `${owner}/${key}`;
}

/** The figures of a library revision that an upgrade notice compares (stored with each revision; never recomputed). */
export interface BlockFigures {
  gates?: number | null;
  depth?: number | null;
  packages?: number | null;
  delayNs?: number | null;
  staticMw?: number | null;
  dynamicMw?: number | null;
  verified?: boolean;
  [k: string]: unknown;
}

export interface FigureDelta {
  figure: "gates" | "depth" | "packages" | "delayNs" | "powerMw";
  label: string;
  unit: string;
  from: number | null;
  to: number | null;
  /** to − from; null when either is unknown. Lower is better for every figure here. */
  delta: number | null;
}

const num = (v: unknown): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);
const power = (s: BlockFigures): number | null => {
  const a = num(s.staticMw);
  const b = num(s.dynamicMw);
  return a === null && b === null ? null : (a ?? 0) + (b ?? 0);
};

/**
 * The figure deltas of moving from one block revision to another, from the
 * figures stored with each (each under the family it was published with).
 * Delay and power are estimates.
 */
export function figureDeltas(from: BlockFigures, to: BlockFigures): FigureDelta[] {
  const rows: Array<[FigureDelta["figure"], string, string, number | null, number | null]> = [
    ["gates", "gates", "", num(from.gates), num(to.gates)],
    ["depth", "depth", "levels", num(from.depth), num(to.depth)],
    ["packages", "packages", "", num(from.packages), num(to.packages)],
    ["delayNs", "delay", "ns", num(from.delayNs), num(to.delayNs)],
    ["powerMw", "power", "mW", power(from), power(to)],
  ];
  return rows.map(([figure, label, unit, a, b]) => ({
    figure, label, unit, from: a, to: b,
    delta: a === null || b === null ? null : Math.round((b - a) * 1000) / 1000,
  }));
}

/** What changes for callers between two revisions' ports, in words; null when the ports are the same. */
export function portChange(from: { inputs: string[]; outputs: string[] }, to: { inputs: string[]; outputs: string[] }): string | null {
  const same = (a: string[], b: string[]) => a.length === b.length && a.every((x, i) => x === b[i]);
  const parts: string[] = [];
  if (!same(from.inputs, to.inputs)) parts.push(`its inputs change from (${from.inputs.join(", ")}) to (${to.inputs.join(", ")})`);
  if (!same(from.outputs, to.outputs)) parts.push(`its results change from (${from.outputs.join(", ")}) to (${to.outputs.join(", ")})`);
  if (parts.length === 0) return null;
  const calls = from.inputs.length !== to.inputs.length || from.outputs.length !== to.outputs.length;
  return `${parts.join(" and ")}${calls ? "; the calls of the block need changing too" : "; check that the calls still connect what you mean"}`;
}

/**
 * The CLI's library folders (`--library NAME=DIR`): one file per block
 * revision, DIR/BLOCK/N.fnb, where N is the revision number (1, 2, …) and the
 * file holds the block's source. The path below DIR of a block revision.
 */
export function libraryFilePath(block: string, revision: number): string {
  return `${block}/${revision}.fnb`;
}

/** Reads a revision number from a file name of that layout ("3.fnb" → 3); null for other files. */
export function revisionOfFile(name: string): number | null {
  const m = /^([1-9][0-9]{0,8})\.fnb$/.exec(name);
  return m ? Number(m[1]) : null;
}

/** One item of the resolve route's answer (POST …/libraries/resolve; its zod schema is in lib/api/routes.ts), as clients read it. */
export interface ResolvedUse {
  library: string;
  block: string;
  revision: number | null;
  ok: boolean;
  source?: string;
  number?: number;
  latest?: number;
  message?: string;
}

/** The language core's answer for a use line from the resolve route's item (`missing` when the server gave none). */
export function answerOfResolved(item: ResolvedUse | undefined, missing: string): LibraryAnswer {
  return item?.ok && item.source !== undefined && item.number !== undefined
    ? { ok: true, source: item.source, revision: item.number, ...(item.latest !== undefined ? { latest: item.latest } : {}) }
    : { ok: false, message: item?.message ?? missing };
}
