"use client";
/**
 * The workbench's view of the libraries: the catalog the editor completes
 * and explains from, and a resolver for what compiles in the browser (the
 * truth table), answered by the server's resolve route exactly as its own
 * compiles answer.
 */
import { useMemo } from "react";
import useSWR from "swr";
import { api } from "@/lib/client/fetcher";
import { findUses, requestKey, resolverFrom, type LibraryAnswer, type LibraryResolver } from "@/lib/lang";
import type { LibraryItem } from "@/lib/client/types";
import { answerOfResolved, type ResolvedUse } from "@/lib/libraries";
import type { LibraryCatalog } from "@/components/editor/fanbound-language";

/** The libraries this workspace may use, shaped for the editor's completion and hover. */
export function useLibraryCatalog(ws: string): LibraryCatalog {
  const { data } = useSWR<{ items: LibraryItem[] }>(`/api/v1/workspaces/${ws}/libraries`);
  return useMemo(
    () => ({
      libraries: (data?.items ?? []).map((l) => ({
        ref: l.ref,
        name: l.name,
        blocks: l.blocks.map((b) => ({
          name: b.name,
          latest: b.latest,
          revisions: b.revisions.map((r) => ({
            number: r.number, state: r.state, message: r.message, inputs: r.inputs, outputs: r.outputs, family: r.family.name,
            stats: { gates: r.stats.gates, depth: r.stats.depth, packages: typeof r.stats.packages === "number" ? r.stats.packages : null, delayNs: r.stats.delayNs ?? null },
          })),
        })),
      })),
    }),
    [data],
  );
}

/**
 * A resolver for `source`'s use lines (null while the answers load, or when
 * `source` is null); undefined when the source has no use lines.
 */
export function useLibraryResolver(ws: string, source: string | null): LibraryResolver | null | undefined {
  const uses = useMemo(() => (source === null ? null : findUses(source).map(({ library, block, revision }) => ({ library, block, revision }))), [source]);
  const key = uses && uses.length ? JSON.stringify(uses) : null;
  const { data } = useSWR<{ items: ResolvedUse[] }>(key ? [`/api/v1/workspaces/${ws}/libraries/resolve`, key] : null, ([url, body]: [string, string]) =>
    api<{ items: ResolvedUse[] }>(url, { method: "POST", json: { uses: JSON.parse(body) } }),
  );
  return useMemo(() => {
    if (source === null) return null;
    if (!key) return undefined;
    if (!data) return null;
    const answers = new Map<string, LibraryAnswer>();
    for (const it of data.items) {
      answers.set(requestKey(it), answerOfResolved(it, "the server gave no answer"));
    }
    return resolverFrom(answers, (r) => `block '${r.block}' from "${r.library}" is being looked up`);
  }, [source, key, data]);
}
