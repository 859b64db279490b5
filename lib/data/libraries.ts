import "server-only";
/**
 * Shared block libraries. A workspace has named libraries; a library holds
 * blocks; publishing a block (designer, owner) compiles its source through the
 * server's one compile path under a chosen family and keeps an immutable
 * library revision with the source, the figures and the verification. An
 * owner may share a library read-only with another workspace, whose members
 * then read and use it but never publish to it; any other workspace finds
 * nothing (404).
 *
 * When the workspace's setting requireReviewToPublish is on, a new revision is
 * published "awaiting review": it is kept, listed, and counts (may be used,
 * is the latest) once an approved review is recorded for it — see
 * {@link recordLibraryApproval}, the seam the review flow connects to.
 */
import { QueryTypes, type Transaction } from "sequelize";
import { db } from "../db/connection";
import { AppError, conflict, forbidden, invalid, notFound } from "../errors";
import { compileOnServer, storedSettings, type CompileSettings } from "../runtime/compile";
import { checkLibraryBlock, requestKey } from "../lang";
import { blockNameProblem, figureDeltas, libraryRef, type BlockFigures, type FigureDelta } from "../libraries";
import { can } from "../auth/permissions";
import { iso, requireAccess, type Access, type Actor } from "./access";
import { familyOf } from "./families";
import { usableFamily } from "./designs";
import { COUNTS_SQL, loadLibraryAnswers } from "./library-resolve";

/** A library revision counts once published, or, when published under review, once approved. */
export type PublishState = "published" | "awaiting review";

/** The workspace setting that makes new library revisions wait for an approved review. */
export const REQUIRE_REVIEW_SETTING = "requireReviewToPublish";

export function requiresReview(settings: Record<string, unknown> | null | undefined): boolean {
  return settings?.[REQUIRE_REVIEW_SETTING] === true;
}

export interface Person {
  id: string;
  name: string;
}

export interface LibraryRevisionView {
  id: string;
  number: number;
  message: string;
  state: PublishState;
  author: Person;
  createdAt: string;
  inputs: string[];
  outputs: string[];
  family: { id: string; key: string; name: string };
  /** Figures stored when it was published, under its family (delay and power are estimates). */
  stats: BlockFigures;
  /** Designs of the caller's workspace whose saved revisions use this block revision. */
  usedBy?: Array<{ design: { id: string; name: string }; revisions: number[] }>;
  /** Against the revision before it that counts: the figures' changes. */
  deltas?: FigureDelta[] | null;
}

export interface LibraryBlockView {
  name: string;
  /** The newest revision that counts; null when none does yet. */
  latest: number | null;
  revisions: LibraryRevisionView[];
}

export interface LibraryView {
  id: string;
  key: string;
  name: string;
  description: string;
  /** How use lines in the caller's workspace write it: "key", or "slug/key" for a library shared in. */
  ref: string;
  owner: { slug: string; name: string };
  /** True when it belongs to another workspace and is shared with the caller's, read-only. */
  sharedIn: boolean;
  /** The caller may publish to it (their role, and it is their workspace's). */
  mayPublish: boolean;
  /** New revisions wait for an approved review (the owning workspace's setting). */
  requireReview: boolean;
  createdAt: string;
  blocks: LibraryBlockView[];
}

export interface LibraryDetail extends LibraryView {
  /** Workspaces it is shared with (its own workspace's members only; null for a library shared in). */
  shares: Array<{ workspace: { slug: string; name: string }; createdAt: string; by: Person }> | null;
}

interface LibRow {
  id: string;
  key: string;
  name: string;
  description: string;
  workspace_id: string;
  created_at: Date;
  owner_slug: string;
  owner_name: string;
  owner_settings: Record<string, unknown>;
}

interface RevRow {
  id: string;
  block_name: string;
  library_id: string;
  number: number;
  message: string;
  inputs: string[];
  outputs: string[];
  stats: BlockFigures;
  counts: boolean;
  created_at: Date;
  author_id: string;
  author_name: string;
  family_id: string;
  family_key: string;
  family_name: string;
}

const LIB_SELECT = `
  SELECT l.id, l.key, l.name, l.description, l.workspace_id, l.created_at,
         w.slug AS owner_slug, w.name AS owner_name, w.settings AS owner_settings
    FROM libraries l JOIN workspaces w ON w.id = l.workspace_id`;

const VISIBLE = `(l.workspace_id = :ws OR EXISTS (SELECT 1 FROM library_shares s WHERE s.library_id = l.id AND s.workspace_id = :ws))`;

async function revisionsOf(libraryIds: string[]): Promise<RevRow[]> {
  if (libraryIds.length === 0) return [];
  return db().sequelize.query<RevRow>(
    `SELECT r.id, b.name AS block_name, b.library_id, r.number, r.message, r.inputs, r.outputs, r.stats, ${COUNTS_SQL} AS counts,
            r.created_at, u.id AS author_id, u.name AS author_name, f.id AS family_id, f.key AS family_key, f.name AS family_name
       FROM library_revisions r
       JOIN library_blocks b ON b.id = r.block_id
       JOIN users u ON u.id = r.author_id
       JOIN logic_families f ON f.id = r.family_id
      WHERE b.library_id IN (:ids)
      ORDER BY b.name, r.number`,
    { replacements: { ids: libraryIds }, type: QueryTypes.SELECT },
  );
}

async function blockRows(libraryIds: string[]): Promise<Array<{ library_id: string; name: string }>> {
  if (libraryIds.length === 0) return [];
  return db().sequelize.query(
    "SELECT library_id, name FROM library_blocks WHERE library_id IN (:ids) ORDER BY name",
    { replacements: { ids: libraryIds }, type: QueryTypes.SELECT },
  );
}

function revisionView(r: RevRow): LibraryRevisionView {
  return {
    id: r.id,
    number: r.number,
    message: r.message,
    state: r.counts ? "published" : "awaiting review",
    author: { id: r.author_id, name: r.author_name },
    createdAt: iso(r.created_at)!,
    inputs: r.inputs,
    outputs: r.outputs,
    family: { id: r.family_id, key: r.family_key, name: r.family_name },
    stats: r.stats,
  };
}

function assemble(l: LibRow, access: Access, blocks: Array<{ name: string }>, revs: RevRow[]): LibraryView {
  const own = l.workspace_id === access.workspace.id;
  return {
    id: l.id,
    key: l.key,
    name: l.name,
    description: l.description,
    ref: libraryRef(l.owner_slug, l.key, access.workspace.slug),
    owner: { slug: l.owner_slug, name: l.owner_name },
    sharedIn: !own,
    mayPublish: own && can(access.role, "library.publish"),
    requireReview: requiresReview(l.owner_settings),
    createdAt: iso(l.created_at)!,
    blocks: blocks.map((b) => {
      const mine = revs.filter((r) => r.block_name === b.name);
      const counting = mine.filter((r) => r.counts);
      return { name: b.name, latest: counting.at(-1)?.number ?? null, revisions: mine.map(revisionView) };
    }),
  };
}

/** The libraries the caller's workspace may use: its own first, then those shared with it; each with its blocks and revisions (no sources). */
export async function listLibraries(p: { actor: Actor | null; slug: string }): Promise<LibraryView[]> {
  const access = await requireAccess(p.actor, p.slug, "library.read");
  const libs = await db().sequelize.query<LibRow>(
    `${LIB_SELECT} WHERE ${VISIBLE} ORDER BY (l.workspace_id = :ws) DESC, w.slug, lower(l.name)`,
    { replacements: { ws: access.workspace.id }, type: QueryTypes.SELECT },
  );
  const ids = libs.map((l) => l.id);
  const [blocks, revs] = await Promise.all([blockRows(ids), revisionsOf(ids)]);
  return libs.map((l) => assemble(l, access, blocks.filter((b) => b.library_id === l.id), revs.filter((r) => r.library_id === l.id)));
}

/** A library the caller's workspace may see, or 404. */
async function visibleLibrary(access: Access, libraryId: string): Promise<LibRow> {
  const rows = await db().sequelize.query<LibRow>(`${LIB_SELECT} WHERE l.id = :id AND ${VISIBLE}`, {
    replacements: { id: libraryId, ws: access.workspace.id },
    type: QueryTypes.SELECT,
  });
  if (!rows[0]) throw notFound("library");
  return rows[0];
}

/** One library: blocks, every revision with its figures and state, where each is used in the caller's workspace, and (for its own workspace) its shares. */
export async function getLibrary(p: { actor: Actor | null; slug: string; libraryId: string }): Promise<LibraryDetail> {
  const access = await requireAccess(p.actor, p.slug, "library.read");
  const l = await visibleLibrary(access, p.libraryId);
  const [blocks, revs] = await Promise.all([blockRows([l.id]), revisionsOf([l.id])]);
  const view = assemble(l, access, blocks, revs);
  const uses = await db().sequelize.query<{ library_revision_id: string; design_id: string; design_name: string; number: number }>(
    `SELECT rl.library_revision_id, d.id AS design_id, d.name AS design_name, r.number
       FROM revision_libraries rl
       JOIN revisions r ON r.id = rl.revision_id
       JOIN designs d ON d.id = r.design_id
       JOIN library_revisions lr ON lr.id = rl.library_revision_id
       JOIN library_blocks b ON b.id = lr.block_id
      WHERE b.library_id = :lib AND d.workspace_id = :ws
      ORDER BY lower(d.name), r.number`,
    { replacements: { lib: l.id, ws: access.workspace.id }, type: QueryTypes.SELECT },
  );
  for (const b of view.blocks) {
    let before: LibraryRevisionView | null = null;
    for (const r of b.revisions) {
      const mine = uses.filter((u) => u.library_revision_id === r.id);
      const byDesign = new Map<string, { design: { id: string; name: string }; revisions: number[] }>();
      for (const u of mine) {
        const entry = byDesign.get(u.design_id) ?? { design: { id: u.design_id, name: u.design_name }, revisions: [] };
        entry.revisions.push(u.number);
        byDesign.set(u.design_id, entry);
      }
      r.usedBy = [...byDesign.values()];
      r.deltas = before ? figureDeltas(before.stats, r.stats) : null;
      if (r.state === "published") before = r;
    }
  }
  let shares: LibraryDetail["shares"] = null;
  if (!view.sharedIn) {
    const rows = await db().sequelize.query<{ slug: string; name: string; created_at: Date; by_id: string; by_name: string }>(
      `SELECT w.slug, w.name, s.created_at, u.id AS by_id, u.name AS by_name
         FROM library_shares s JOIN workspaces w ON w.id = s.workspace_id JOIN users u ON u.id = s.created_by
        WHERE s.library_id = :lib ORDER BY w.slug`,
      { replacements: { lib: l.id }, type: QueryTypes.SELECT },
    );
    shares = rows.map((s) => ({ workspace: { slug: s.slug, name: s.name }, createdAt: iso(s.created_at)!, by: { id: s.by_id, name: s.by_name } }));
  }
  return { ...view, shares };
}

function keyTaken(e: unknown, key: string): never {
  if ((e as { name?: string }).name === "SequelizeUniqueConstraintError") {
    throw conflict(`This workspace has a library with the key "${key}" already; choose another key.`, { field: "key" });
  }
  throw e;
}

/** Creates a library (designer, owner); 409 when the key is taken in the workspace. */
export async function createLibrary(p: { actor: Actor | null; slug: string; key: string; name: string; description?: string }): Promise<LibraryDetail> {
  const access = await requireAccess(p.actor, p.slug, "library.edit");
  let id: string;
  try {
    const row = await db().models.Library.create({
      workspaceId: access.workspace.id, key: p.key, name: p.name, description: p.description ?? "", createdBy: p.actor!.userId,
    });
    id = row.id;
  } catch (e) {
    keyTaken(e, p.key);
  }
  return getLibrary({ actor: p.actor, slug: p.slug, libraryId: id });
}

/** The library, if the caller's workspace owns it: a shared-in library is read-only (403), another workspace's is missing (404). */
async function ownLibrary(access: Access, libraryId: string, doing: string): Promise<LibRow> {
  const l = await visibleLibrary(access, libraryId);
  if (l.workspace_id !== access.workspace.id) {
    throw new AppError("forbidden", `This library belongs to the workspace ${l.owner_slug} and is shared with yours read-only; ${doing} happens there.`);
  }
  return l;
}

/**
 * Publishes a block's source as its next revision (designer, owner of the
 * library's own workspace). The source must compile as a block (no use lines,
 * no dc(...)); it is compiled through the server's compile path under the
 * family chosen, and its figures and verification are kept. 422 with the
 * diagnostics when it does not compile. Under requireReviewToPublish the
 * revision is kept "awaiting review".
 */
export async function publishBlock(p: {
  actor: Actor | null;
  slug: string;
  libraryId: string;
  block: string;
  source: string;
  familyId: string;
  settings: CompileSettings;
  message: string;
}): Promise<LibraryRevisionView & { block: string; library: string }> {
  const access = await requireAccess(p.actor, p.slug, "library.publish");
  const l = await ownLibrary(access, p.libraryId, "publishing");
  const nameProblem = blockNameProblem(p.block);
  if (nameProblem) throw invalid(`block: ${nameProblem}.`, [{ path: "block", message: nameProblem }]);
  const check = checkLibraryBlock(p.source);
  if (check.diagnostics.some((d) => d.severity === "error")) {
    throw new AppError("compile_errors", "The block's source has errors; fix them before publishing.", { diagnostics: check.diagnostics });
  }
  const familyRow = await usableFamily(access.workspace.id, p.familyId);
  const family = familyOf(familyRow);
  const outcome = await compileOnServer({ source: p.source, family, settings: p.settings, userId: p.actor!.userId, workspaceId: access.workspace.id });
  if (!outcome.result) {
    throw new AppError("compile_errors", "The block's source has errors; fix them before publishing.", { diagnostics: outcome.diagnostics });
  }
  const needsReview = requiresReview(access.workspace.settings);
  const { sequelize, models } = db();
  const revisionId = await sequelize.transaction(async (transaction) => {
    // The library row's lock serialises publishes to it: a new block is made once, numbers follow without gaps.
    await models.Library.findByPk(l.id, { lock: transaction.LOCK.UPDATE, transaction });
    const [block] = await models.LibraryBlock.findOrCreate({ where: { libraryId: l.id, name: p.block }, defaults: { libraryId: l.id, name: p.block }, transaction });
    const last = (await models.LibraryRevision.max("number", { where: { blockId: block.id }, transaction })) as number | null;
    const rev = await models.LibraryRevision.create(
      {
        blockId: block.id,
        number: (last ?? 0) + 1,
        source: p.source,
        message: p.message,
        inputs: check.inputs,
        outputs: check.outputs,
        familyId: familyRow.id,
        familySnapshot: { ...family } as unknown as Record<string, unknown>,
        settings: storedSettings(p.settings),
        stats: outcome.result!.stats as unknown as Record<string, unknown>,
        verification: (outcome.result!.verification ?? null) as unknown as Record<string, unknown> | null,
        authorId: p.actor!.userId,
        needsReview,
      },
      { transaction },
    );
    await models.Library.update({ updatedAt: new Date() }, { where: { id: l.id }, transaction });
    if (needsReview) await askLibraryReview({ libraryRevisionId: rev.id, requestedBy: p.actor!.userId, transaction });
    return rev.id;
  });
  const [row] = (await revisionsOf([l.id])).filter((r) => r.id === revisionId);
  return { ...revisionView(row!), block: p.block, library: l.key };
}

/** One block revision with its source, settings and verification. */
export async function getLibraryRevision(p: { actor: Actor | null; slug: string; libraryId: string; block: string; number: number }) {
  const access = await requireAccess(p.actor, p.slug, "library.read");
  const l = await visibleLibrary(access, p.libraryId);
  const row = await db().sequelize.query<RevRow & { source: string; settings: Record<string, unknown>; verification: Record<string, unknown> | null }>(
    `SELECT r.id, b.name AS block_name, b.library_id, r.number, r.message, r.inputs, r.outputs, r.stats, ${COUNTS_SQL} AS counts,
            r.created_at, u.id AS author_id, u.name AS author_name, f.id AS family_id, f.key AS family_key, f.name AS family_name,
            r.source, r.settings, r.verification
       FROM library_revisions r
       JOIN library_blocks b ON b.id = r.block_id
       JOIN users u ON u.id = r.author_id
       JOIN logic_families f ON f.id = r.family_id
      WHERE b.library_id = :lib AND b.name = :block AND r.number = :n`,
    { replacements: { lib: l.id, block: p.block, n: p.number }, type: QueryTypes.SELECT },
  );
  if (!row[0]) throw notFound("library revision");
  const r = row[0];
  return { ...revisionView(r), block: r.block_name, library: libraryRef(l.owner_slug, l.key, access.workspace.slug), source: r.source, settings: r.settings, verification: r.verification };
}

/** Shares a library read-only with another workspace, named by its slug (owner of the library's workspace). */
export async function shareLibrary(p: { actor: Actor | null; slug: string; libraryId: string; workspace: string }): Promise<LibraryDetail> {
  const access = await requireAccess(p.actor, p.slug, "library.share");
  const l = await ownLibrary(access, p.libraryId, "sharing it");
  if (p.workspace === access.workspace.slug) throw invalid("A library is always usable in its own workspace; name another workspace to share it with.", [{ path: "workspace", message: "this workspace" }]);
  const target = await db().models.Workspace.findOne({ where: { slug: p.workspace } });
  if (!target) throw notFound("workspace to share with");
  const [, created] = await db().models.LibraryShare.findOrCreate({
    where: { libraryId: l.id, workspaceId: target.id },
    defaults: { libraryId: l.id, workspaceId: target.id, createdBy: p.actor!.userId },
  });
  if (!created) throw conflict(`This library is shared with ${p.workspace} already.`);
  return getLibrary({ actor: p.actor, slug: p.slug, libraryId: l.id });
}

/**
 * Ends a share (owner). Saved revisions of the other workspace keep the
 * library revisions they pinned; its drafts can no longer use the library.
 */
export async function unshareLibrary(p: { actor: Actor | null; slug: string; libraryId: string; workspace: string }): Promise<LibraryDetail> {
  const access = await requireAccess(p.actor, p.slug, "library.share");
  const l = await ownLibrary(access, p.libraryId, "sharing it");
  const target = await db().models.Workspace.findOne({ where: { slug: p.workspace } });
  const gone = target ? await db().models.LibraryShare.destroy({ where: { libraryId: l.id, workspaceId: target.id } }) : 0;
  if (!gone) throw notFound("share with that workspace");
  return getLibrary({ actor: p.actor, slug: p.slug, libraryId: l.id });
}

/**
 * Answers use lines for a client that compiles on its own (the CLI, the
 * workbench's truth table): per line, the block revision's source and ports,
 * or the reason it cannot be used — the same answers the server's compiles get.
 */
export async function resolveUses(p: { actor: Actor | null; slug: string; uses: Array<{ library: string; block: string; revision: number | null }> }) {
  const access = await requireAccess(p.actor, p.slug, "library.read");
  const loaded = await loadLibraryAnswers(access.workspace.id, p.uses);
  return p.uses.map((u) => {
    const key = requestKey(u);
    const a = loaded.answers.get(key)!;
    const r = loaded.resolved.get(key);
    return a.ok
      ? { ...u, ok: true as const, source: a.source, number: a.revision, latest: a.latest ?? a.revision, inputs: r?.inputs ?? [], outputs: r?.outputs ?? [], stats: r?.stats ?? {} }
      : { ...u, ok: false as const, message: a.message };
  });
}

/**
 * Approves a block revision published awaiting review (a reviewer or an owner
 * of the library's own workspace, never its author), with an optional note:
 * from then on it counts — use lines may name it and it is the block's latest.
 * 409 when it needed no review or is approved already.
 */
export async function approveLibraryRevision(p: {
  actor: Actor | null;
  slug: string;
  libraryId: string;
  block: string;
  number: number;
  note?: string;
}): Promise<LibraryRevisionView & { block: string; library: string }> {
  const access = await requireAccess(p.actor, p.slug, "review.approve");
  const l = await ownLibrary(access, p.libraryId, "approving its revisions");
  const { models } = db();
  const block = await models.LibraryBlock.findOne({ where: { libraryId: l.id, name: p.block } });
  const rev = block ? await models.LibraryRevision.findOne({ where: { blockId: block.id, number: p.number } }) : null;
  if (!rev) throw notFound("library revision");
  await recordLibraryApproval({ libraryRevisionId: rev.id, reviewId: null, approvedBy: p.actor!.userId, note: p.note ?? "" });
  const [row] = (await revisionsOf([l.id])).filter((r) => r.id === rev.id);
  return { ...revisionView(row!), block: p.block, library: l.key };
}

// ---- REVIEW SEAM ------------------------------------------------------------------------------------------------
// Reviews of design revisions are being built on another branch. When they land, the lead connects them here:
//
//  1. askLibraryReview: called inside the publish transaction for a revision published "awaiting review". Today it
//     does nothing: the library page shows the revision as awaiting review. Connect it to the review flow's "ask"
//     (a review of a library revision: its source, and a comparison of its figures with the revision before).
//  2. recordLibraryApproval: the review flow calls it when such a review is approved. It writes the approval row
//     (immutable); from then on the revision counts: use lines may name it and it is the block's latest. Until the
//     flow reviews library revisions, a reviewer or an owner approves one on the library page
//     (approveLibraryRevision, POST …/revisions/{number}/approval), under the flow's rule that an author never
//     approves their own work; its approval row has no review_id.
//
// Nothing else needs to change: states come from library_approvals (COUNTS_SQL in library-resolve.ts).

/** REVIEW SEAM: ask for the review of a library revision published awaiting review (a no-op until reviews are connected). */
export async function askLibraryReview(_p: { libraryRevisionId: string; requestedBy: string; transaction?: Transaction }): Promise<void> {
  // Intentionally empty until the review flow lands (see the note above).
}

/**
 * REVIEW SEAM: records that an approved review lets a library revision count.
 * Refuses a revision that needed no review, one approved already, and an
 * approval by the revision's own author.
 */
export async function recordLibraryApproval(p: { libraryRevisionId: string; reviewId: string | null; approvedBy: string; note?: string }): Promise<void> {
  const { models } = db();
  const rev = await models.LibraryRevision.findByPk(p.libraryRevisionId);
  if (!rev) throw notFound("library revision");
  if (!rev.needsReview) throw conflict("This library revision was published without a review; it counts already.");
  if (rev.authorId === p.approvedBy) throw forbidden("approving a library revision you published");
  if (await models.LibraryApproval.findOne({ where: { libraryRevisionId: rev.id } })) throw conflict("This library revision is approved already.");
  await models.LibraryApproval.create({ libraryRevisionId: rev.id, reviewId: p.reviewId, approvedBy: p.approvedBy, note: p.note ?? "" });
}
