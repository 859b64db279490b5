"use client";
/**
 * "A newer revision of BLOCK is available": for each library block the draft
 * uses at an older revision, the design's figures now and with the newer
 * revision as the compare view sets them side by side (the draft compiled once
 * more with the `at` number moved, under the design's own family and
 * settings), the block's own stored figures beside them, and a button that
 * changes the `at` number in the draft. Changing the text is all the button
 * does; the draft is kept as any edit is.
 */
import Link from "next/link";
import useSWR from "swr";
import { api, ApiError } from "@/lib/client/fetcher";
import { compareFigures, figuresOf, type Comparison } from "@/lib/review";
import type { CompileResponse, WorkbenchSettings } from "./types";
import { FigureDeltas } from "@/components/libraries/FigureDeltas";
import { FigureRows } from "@/components/review/FiguresCompare";

type Result = NonNullable<CompileResponse["result"]>;

type Use = CompileResponse["libraries"][number];

/** The source with the text in `range` (1-based lines and columns, end exclusive) replaced. */
export function replaceRange(source: string, range: { line: number; column: number; endLine: number; endColumn: number }, text: string): string | null {
  const lines = source.split("\n");
  const offset = (line: number, column: number) => {
    let o = 0;
    for (let i = 0; i < line - 1; i++) o += lines[i]!.length + 1;
    return o + column - 1;
  };
  if (range.line > lines.length || range.endLine > lines.length) return null;
  const start = offset(range.line, range.column);
  const end = offset(range.endLine, range.endColumn);
  return source.slice(0, start) + text + source.slice(end);
}

/** The text of a range in the source, or null when the source no longer reaches it. */
function textAt(source: string, range: Use["revisionRange"]): string | null {
  const line = source.split("\n")[range.line - 1];
  if (line === undefined || range.line !== range.endLine) return null;
  return line.slice(range.column - 1, range.endColumn - 1);
}

export interface LibraryNoticeProps {
  ws: string;
  /** The library blocks the shown compile used. */
  uses: Use[];
  /** The draft as it stands. */
  source: string;
  familyId: string | undefined;
  settings: WorkbenchSettings;
  /** The compile of the draft as it stands; null while that compile runs or when it has errors. */
  current: Result | null;
  mayEdit: boolean;
  onSource: (next: string) => void;
}

export function LibraryNotice(p: LibraryNoticeProps) {
  const behind = p.uses.filter((u) => u.newer);
  if (behind.length === 0) return null;
  return (
    <div className="mb-3 space-y-2" data-testid="library-notice">
      {behind.map((u) => <BehindBlock key={`${u.library}/${u.block}`} use={u} {...p} />)}
    </div>
  );
}

/** The compare view's figure rows for two compiles of one design under the same family and settings. */
function compareResults(before: Result, after: Result, settings: WorkbenchSettings): Comparison {
  const side = (r: Result) => figuresOf({ stats: { ...r.stats }, netlist: r.netlist, family: { id: "", name: "" }, settings: { ...settings } });
  return compareFigures(side(before), side(after));
}

function MoveFigures({ comparison: c, fromLabel, toLabel, testId }: { comparison: Comparison; fromLabel: string; toLabel: string; testId: string }) {
  return (
    <table className="text-xs tabular" data-testid={testId}>
      <thead className="text-left uppercase tracking-wide text-graphite">
        <tr>
          <th className="pr-4 font-semibold">Figure</th>
          <th className="pr-4 text-right font-semibold normal-case">{fromLabel}</th>
          <th className="pr-4 text-right font-semibold normal-case">{toLabel}</th>
          <th className="text-right font-semibold">Change</th>
        </tr>
      </thead>
      <tbody>
        <FigureRows comparison={c} cell="pr-4 last:pr-0" />
      </tbody>
    </table>
  );
}

function BehindBlock({ use: u, ws, source, familyId, settings, current, mayEdit, onSource }: LibraryNoticeProps & { use: Use }) {
  const newer = u.newer!;
  const lineAsCompiled = textAt(source, u.revisionRange) === String(u.revision);
  const moved = lineAsCompiled ? replaceRange(source, u.revisionRange, String(newer.number)) : null;
  // The draft compiled with the newer revision, once the draft itself has compiled (the server keeps both results).
  const key = moved !== null && current && familyId ? JSON.stringify([moved, familyId, settings]) : null;
  // Each answer carries the figures it is compared with, so the last pair stays on view (dimmed) while the next is worked out.
  const { data, error, isValidating } = useSWR<{ before: Result; moved: CompileResponse }, Error>(
    key ? ["library-move", ws, key] : null,
    async () => ({ before: current!, moved: await api<CompileResponse>("/api/v1/compile", { method: "POST", json: { source: moved, workspace: ws, familyId, settings } }) }),
    { revalidateOnFocus: false, revalidateOnReconnect: false, revalidateIfStale: false, shouldRetryOnError: false, keepPreviousData: true },
  );
  const move = () => {
    if (moved !== null) onSource(moved);
  };
  const after = data?.moved.result ?? null;
  const firstError = data?.moved.diagnostics.find((d) => d.severity === "error");
  const stale = key === null || isValidating;

  return (
    <div className="rounded border border-accent/50 bg-sheet px-3 py-2 text-sm">
      <div className="flex flex-wrap items-center gap-2">
        <span>
          A newer revision of <code className="font-mono font-semibold">{u.block}</code> is available:{" "}
          <span className="font-mono">r{newer.number}</span> (this design uses <span className="font-mono">r{u.revision}</span>) —{" "}
          <span className="text-graphite">{newer.message}</span>
        </span>
        <Link prefetch={false} href={`/w/${ws}/libraries/${u.libraryId}`} className="text-xs text-graphite hover:text-ink">{u.libraryName}</Link>
        {mayEdit && (
          <button type="button" onClick={move} disabled={moved === null}
            title={moved !== null ? `Change “at ${u.revision}” to “at ${newer.number}” in the draft` : "The use line has changed since this compile"}
            className="ml-auto rounded bg-accent px-2.5 py-1 text-xs font-semibold text-paper disabled:opacity-50">
            Move to r{newer.number}
          </button>
        )}
      </div>
      {newer.portChange && <p className="mt-1 text-xs text-amber" role="note">Its ports differ: {newer.portChange}.</p>}
      <div className="mt-2 flex flex-wrap items-start gap-x-10 gap-y-2">
        <div>
          <p className="mb-1 text-xs font-semibold text-ink">This design, under its own family and settings (the compare view&apos;s figures)</p>
          {error && !isValidating ? (
            <p className="max-w-md text-xs text-vermilion">
              The figures with r{newer.number} could not be worked out: {error instanceof ApiError ? error.message : String(error)}
            </p>
          ) : data ? (
            <div className={stale ? "opacity-50" : ""} aria-busy={stale}>
              {after ? (
                <MoveFigures comparison={compareResults(data.before, after, settings)} fromLabel={`with r${u.revision}`} toLabel={`with r${newer.number}`}
                  testId={`deltas-${u.block}`} />
              ) : firstError ? (
                <p className="max-w-md text-xs text-vermilion" data-testid={`move-errors-${u.block}`}>
                  With r{newer.number} the draft would not compile: line {firstError.line}: {firstError.message}
                </p>
              ) : (
                <p className="max-w-md text-xs text-graphite">With r{newer.number} the compile gave no result.</p>
              )}
            </div>
          ) : (
            <p className="text-xs text-graphite">{key ? `Working out the figures with r${newer.number}…` : "The figures follow once the draft compiles."}</p>
          )}
        </div>
        <div>
          <p className="mb-1 text-xs font-semibold text-ink">The block alone, as published</p>
          <FigureDeltas deltas={newer.deltas} fromLabel={`r${u.revision}`} toLabel={`r${newer.number}`} testId={`block-deltas-${u.block}`} />
        </div>
      </div>
      <p className="mt-1 text-xs text-graphite">
        The block&apos;s own figures were stored when each revision was published, each under the family it was published with. Delay and
        power are estimates from the families&apos; typical figures: check the parts&apos; data sheets and your own design rules.
      </p>
    </div>
  );
}
