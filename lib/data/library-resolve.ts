import "server-only";
/**
 * Use lines → library block revisions, for the server's compiles. The server
 * parses on the request thread and the language core asks its resolver
 * synchronously, so the revisions a source names are loaded first (its use
 * lines found from the tokens), and the resolver answers from that list.
 *
 * What a workspace may use: its own libraries ("key") and those another
 * workspace shares with it ("slug/key"). Anything else reads as missing, so a
 * library's existence is not revealed. A revision published while its
 * workspace asked for an approved review counts once approved.
 */
import { QueryTypes } from "sequelize";
import { db } from "../db/connection";
import { findUses, requestKey, type LibraryAnswer, type LibraryRequest, type LibraryResolver, type UseLine } from "../lang";
import { libraryRef, parseLibraryName, type BlockFigures } from "../libraries";

/** What the server knows of a block revision a use line named (beyond the answer the core gets). */
export interface ResolvedBlock {
  libraryId: string;
  /** As this workspace's use lines write it. */
  ref: string;
  libraryName: string;
  block: string;
  libraryRevisionId: string;
  revision: number;
  inputs: string[];
  outputs: string[];
  stats: BlockFigures;
  /** The newest revision that counts (published, or approved), when it is newer than this one. */
  newer: { number: number; inputs: string[]; outputs: string[]; stats: BlockFigures; message: string } | null;
}

/** Answers for a source's use lines, and the library revisions behind the ones that resolved. */
export interface LibraryAnswers {
  answers: Map<string, LibraryAnswer>;
  resolved: Map<string, ResolvedBlock>;
}

interface LibRow {
  id: string;
  key: string;
  name: string;
  workspace_id: string;
  slug: string;
}

interface RevRow {
  id: string;
  number: number;
  source: string;
  message: string;
  inputs: string[];
  outputs: string[];
  stats: BlockFigures;
  counts: boolean;
}

/** The libraries a workspace may use: its own and those shared with it. */
export async function usableLibraries(workspaceId: string): Promise<LibRow[]> {
  return db().sequelize.query<LibRow>(
    `SELECT l.id, l.key, l.name, l.workspace_id, w.slug
       FROM libraries l JOIN workspaces w ON w.id = l.workspace_id
      WHERE l.workspace_id = :ws OR EXISTS (SELECT 1 FROM library_shares s WHERE s.library_id = l.id AND s.workspace_id = :ws)
      ORDER BY (l.workspace_id = :ws) DESC, w.slug, l.key`,
    { replacements: { ws: workspaceId }, type: QueryTypes.SELECT },
  );
}

/** A revision counts (may be used, is "latest") when it needed no review or has its approval. */
export const COUNTS_SQL = `(NOT r.needs_review OR EXISTS (SELECT 1 FROM library_approvals a WHERE a.library_revision_id = r.id))`;

async function revisionsOf(libraryId: string, block: string): Promise<RevRow[] | null> {
  const b = await db().sequelize.query<{ id: string }>(
    "SELECT id FROM library_blocks WHERE library_id = :lib AND name = :name",
    { replacements: { lib: libraryId, name: block }, type: QueryTypes.SELECT },
  );
  if (!b[0]) return null;
  return db().sequelize.query<RevRow>(
    `SELECT r.id, r.number, r.source, r.message, r.inputs, r.outputs, r.stats, ${COUNTS_SQL} AS counts
       FROM library_revisions r WHERE r.block_id = :block ORDER BY r.number`,
    { replacements: { block: b[0].id }, type: QueryTypes.SELECT },
  );
}

async function blockNames(libraryId: string): Promise<string[]> {
  const rows = await db().sequelize.query<{ name: string }>(
    "SELECT name FROM library_blocks WHERE library_id = :lib ORDER BY name",
    { replacements: { lib: libraryId }, type: QueryTypes.SELECT },
  );
  return rows.map((r) => r.name);
}

const quoteList = (xs: string[]) => xs.map((x) => `"${x}"`).join(", ");

/**
 * Loads the answers for these use lines in a workspace. `workspaceId` null
 * (a compile outside any workspace) answers every line with where libraries
 * can be used.
 */
export async function loadLibraryAnswers(workspaceId: string | null, uses: readonly LibraryRequest[]): Promise<LibraryAnswers> {
  const answers = new Map<string, LibraryAnswer>();
  const resolved = new Map<string, ResolvedBlock>();
  if (uses.length === 0) return { answers, resolved };
  if (!workspaceId) {
    for (const u of uses) {
      answers.set(requestKey(u), {
        ok: false,
        message: `library blocks are used within a workspace; compile this design in its workspace (in the API, give "workspace") to use block '${u.block}' from "${u.library}"`,
      });
    }
    return { answers, resolved };
  }
  const ws = await db().models.Workspace.findByPk(workspaceId);
  const libs = await usableLibraries(workspaceId);
  const refOf = (l: LibRow) => libraryRef(l.slug, l.key, ws!.slug);
  for (const u of uses) {
    const k = requestKey(u);
    if (answers.has(k)) continue;
    const answer = await answerOne(u, ws!.slug, libs, refOf, resolved, k);
    answers.set(k, answer);
  }
  return { answers, resolved };
}

async function answerOne(
  u: LibraryRequest,
  ownSlug: string,
  libs: LibRow[],
  refOf: (l: LibRow) => string,
  resolved: Map<string, ResolvedBlock>,
  key: string,
): Promise<LibraryAnswer> {
  const available = libs.length ? `the libraries this workspace can use are ${quoteList(libs.map(refOf))}` : "this workspace has no libraries yet (add one on its Libraries page)";
  const name = parseLibraryName(u.library);
  if (!name) {
    return { ok: false, message: `"${u.library}" is not a library name: write "KEY" for a library of this workspace or "WORKSPACE/KEY" for one shared with it; ${available}` };
  }
  const slug = name.workspace ?? ownSlug;
  const lib = libs.find((l) => l.slug === slug && l.key === name.key);
  if (!lib) {
    const elsewhere = name.workspace === null ? libs.find((l) => l.key === name.key) : undefined;
    const hint = elsewhere ? `; the library shared from ${elsewhere.slug} is written "${refOf(elsewhere)}"` : `; ${available}`;
    return { ok: false, message: `there is no library "${u.library}" this workspace can use${hint}` };
  }
  const revs = await revisionsOf(lib.id, u.block);
  if (!revs) {
    const names = await blockNames(lib.id);
    return {
      ok: false,
      message: `library "${u.library}" has no block '${u.block}'; ${names.length ? `its blocks are ${names.join(", ")}` : "it has no blocks yet"}`,
    };
  }
  const counting = revs.filter((r) => r.counts);
  const latest = counting[counting.length - 1];
  if (!latest) {
    return { ok: false, message: `block '${u.block}' in "${u.library}" has no revision that may be used yet: each awaits an approved review` };
  }
  const rev = u.revision === null ? latest : revs.find((r) => r.number === u.revision);
  if (!rev) {
    return {
      ok: false,
      message: `block '${u.block}' in "${u.library}" has no revision ${u.revision}; its revisions are ${counting.map((r) => r.number).join(", ")} (write at ${latest.number} for the latest)`,
    };
  }
  if (!rev.counts) {
    return {
      ok: false,
      message: `revision ${rev.number} of '${u.block}' in "${u.library}" awaits an approved review and may not be used yet; write at ${latest.number} (the latest that may be used)`,
    };
  }
  resolved.set(key, {
    libraryId: lib.id,
    ref: refOf(lib),
    libraryName: lib.name,
    block: u.block,
    libraryRevisionId: rev.id,
    revision: rev.number,
    inputs: rev.inputs,
    outputs: rev.outputs,
    stats: rev.stats,
    newer: latest.number > rev.number
      ? { number: latest.number, inputs: latest.inputs, outputs: latest.outputs, stats: latest.stats, message: latest.message }
      : null,
  });
  return { ok: true, source: rev.source, revision: rev.number, latest: latest.number };
}

/** The answers a source's use lines need, loaded for the workspace. */
export async function answersForSource(workspaceId: string | null, source: string): Promise<LibraryAnswers & { uses: UseLine[] }> {
  const uses = findUses(source);
  return { ...(await loadLibraryAnswers(workspaceId, uses)), uses };
}

/** The ids of the library block revisions the loaded answers resolved to, for the compile cache's key. */
export function pinsOf(loaded: LibraryAnswers): string[] {
  return [...new Set([...loaded.resolved.values()].map((r) => r.libraryRevisionId))].sort();
}

/** A synchronous resolver over loaded answers. */
export function resolverOf(loaded: LibraryAnswers): LibraryResolver {
  return (r) =>
    loaded.answers.get(requestKey(r)) ?? {
      ok: false,
      message: `block '${r.block}' from "${r.library}" was not loaded before the compile; try again`,
    };
}

/**
 * The answers a saved design revision gets from the library revisions it
 * pinned (its stored list), whatever has happened to the libraries since:
 * its function never changes.
 */
export async function pinnedAnswers(revisionId: string): Promise<LibraryAnswers> {
  const rows = await db().sequelize.query<{ library: string; block: string; number: number; source: string; id: string; inputs: string[]; outputs: string[]; stats: BlockFigures; library_id: string; library_name: string }>(
    `SELECT rl.library, rl.block, r.number, r.source, r.id, r.inputs, r.outputs, r.stats, l.id AS library_id, l.name AS library_name
       FROM revision_libraries rl
       JOIN library_revisions r ON r.id = rl.library_revision_id
       JOIN library_blocks b ON b.id = r.block_id
       JOIN libraries l ON l.id = b.library_id
      WHERE rl.revision_id = :rev`,
    { replacements: { rev: revisionId }, type: QueryTypes.SELECT },
  );
  const answers = new Map<string, LibraryAnswer>();
  const resolved = new Map<string, ResolvedBlock>();
  for (const r of rows) {
    const k = requestKey({ library: r.library, block: r.block, revision: r.number });
    answers.set(k, { ok: true, source: r.source, revision: r.number });
    resolved.set(k, {
      libraryId: r.library_id, ref: r.library, libraryName: r.library_name, block: r.block, libraryRevisionId: r.id,
      revision: r.number, inputs: r.inputs, outputs: r.outputs, stats: r.stats, newer: null,
    });
  }
  return { answers, resolved };
}
