import "server-only";
/**
 * Revisions: immutable records of a design. The server compiles the source
 * itself and stores the figures it computed, never figures from the client.
 * Numbers are assigned under a row lock on the design, so concurrent saves
 * get consecutive numbers instead of colliding.
 */
import { QueryTypes } from "sequelize";
import { db } from "../db/connection";
import { AppError, notFound } from "../errors";
import { compileOnServer, storedSettings, type CompileSettings as Settings, type SavedNetlist } from "../runtime/compile";
import { toCsv, toVerilog, toVhdl } from "../export";
import { designSettingsSchema } from "../pipeline/settings";
import type { Family } from "../families";
import { decodeCursor, encodeCursor, iso, requireAccess, type Actor } from "./access";
import { boundaryFamilies, familyOf } from "./families";
import { recordActivity } from "./activity";
import { usableFamily } from "./designs";
import { pinnedAnswers } from "./library-resolve";

export interface RevisionSummary {
  id: string;
  number: number;
  message: string;
  author: { id: string; name: string };
  createdAt: string;
  stats: Record<string, unknown>;
  family: { id: string; key: string; name: string };
}

export interface RevisionDetail extends RevisionSummary {
  source: string;
  settings: Record<string, unknown>;
  familySnapshot: Record<string, unknown>;
  /** The library block revisions it used, pinned with it. */
  libraries: Array<{ library: string; block: string; revision: number }>;
}

type Rev = InstanceType<ReturnType<typeof db>["models"]["Revision"]>;
type Loaded = Rev & {
  author: { id: string; name: string };
  family: { id: string; key: string; name: string };
};

function summary(r: Loaded): RevisionSummary {
  return {
    id: r.id,
    number: r.number,
    message: r.message,
    author: { id: r.author.id, name: r.author.name },
    createdAt: iso(r.createdAt)!,
    stats: r.stats,
    family: { id: r.family.id, key: r.family.key, name: r.family.name },
  };
}

async function detail(r: Loaded): Promise<RevisionDetail> {
  const libraries = await db().sequelize.query<{ library: string; block: string; revision: number }>(
    `SELECT rl.library, rl.block, lr.number AS revision FROM revision_libraries rl
       JOIN library_revisions lr ON lr.id = rl.library_revision_id WHERE rl.revision_id = :id ORDER BY rl.library, rl.block`,
    { replacements: { id: r.id }, type: QueryTypes.SELECT },
  );
  return { ...summary(r), source: r.source, settings: r.settings, familySnapshot: r.familySnapshot, libraries };
}

function include() {
  const { User, LogicFamilyRecord } = db().models;
  return [
    { model: User, as: "author", attributes: ["id", "name"] },
    { model: LogicFamilyRecord, as: "family", attributes: ["id", "key", "name"] },
  ];
}

async function designIn(workspaceId: string, designId: string) {
  const d = await db().models.Design.findOne({ where: { id: designId, workspaceId } });
  if (!d) throw notFound("design");
  return d;
}

/** A design's revisions, newest first; limit default 50 (max 200). */
export async function listRevisions(p: { actor: Actor | null; slug: string; designId: string; limit?: number; cursor?: string }) {
  const { workspace } = await requireAccess(p.actor, p.slug, "revision.read");
  await designIn(workspace.id, p.designId);
  const limit = Math.min(Math.max(p.limit ?? 50, 1), 200);
  const offset = decodeCursor(p.cursor);
  const rows = (await db().models.Revision.findAll({
    where: { designId: p.designId },
    include: include(),
    order: [["number", "DESC"]],
    limit: limit + 1,
    offset,
  })) as Loaded[];
  const more = rows.length > limit;
  return { items: rows.slice(0, limit).map(summary), nextCursor: more ? encodeCursor(offset + limit) : null };
}

/** One revision by its number within the design. */
export async function getRevision(p: { actor: Actor | null; slug: string; designId: string; number: number }): Promise<RevisionDetail> {
  const { workspace } = await requireAccess(p.actor, p.slug, "revision.read");
  await designIn(workspace.id, p.designId);
  const r = (await db().models.Revision.findOne({ where: { designId: p.designId, number: p.number }, include: include() })) as Loaded | null;
  if (!r) throw notFound("revision");
  return detail(r);
}

/**
 * Compiles and saves a new revision (designer or owner). The design's draft,
 * family and settings follow the saved revision when the draft is still at
 * `draftVersion` (the version the saver's text came from), or, without it,
 * when the draft is empty or already holds this source; a draft someone has
 * changed meanwhile is left alone. 422 with the diagnostics when the source
 * has errors.
 */
export async function createRevision(p: {
  actor: Actor | null;
  slug: string;
  designId: string;
  message: string;
  source: string;
  familyId: string;
  settings: Settings;
  draftVersion?: number;
}): Promise<RevisionDetail> {
  const { workspace } = await requireAccess(p.actor, p.slug, "revision.save");
  const current = await designIn(workspace.id, p.designId);
  const familyRow = await usableFamily(workspace.id, p.familyId, current.familyId);
  const boundary = await boundaryFamilies(workspace.id, p.settings);
  const family = familyOf(familyRow);
  // The same path as the workbench's compiles: a result the designer just saw comes from the cache.
  const outcome = await compileOnServer({
    source: p.source, family, settings: p.settings, userId: p.actor!.userId, workspaceId: workspace.id, families: boundary,
  });
  const settings = storedSettings(p.settings);
  if (!outcome.result) {
    throw new AppError("compile_errors", "The source has errors; fix them before saving a revision.", { diagnostics: outcome.diagnostics });
  }
  const stats = outcome.result.stats as unknown as Record<string, unknown>;
  const cp = outcome.result.analysis.criticalPath;
  const saved: SavedNetlist = { model: outcome.result.model, document: outcome.result.document, critical: { nets: cp.nets, gates: cp.gates } };
  const { sequelize, models } = db();
  const id = await sequelize.transaction(async (transaction) => {
    // The lock serialises saves of one design; numbers follow without gaps or collisions.
    const d = await models.Design.findOne({ where: { id: p.designId, workspaceId: workspace.id }, lock: transaction.LOCK.UPDATE, transaction });
    if (!d) throw notFound("design");
    const last = (await models.Revision.max("number", { where: { designId: d.id }, transaction })) as number | null;
    const rev = await models.Revision.create(
      {
        designId: d.id,
        number: (last ?? 0) + 1,
        source: p.source,
        familyId: familyRow.id,
        familySnapshot: { ...family } as unknown as Record<string, unknown>,
        settings,
        stats,
        netlist: saved as unknown as Record<string, unknown>,
        authorId: p.actor!.userId,
        message: p.message,
      },
      { transaction },
    );
    // The library revisions this one used: pinned with it, never changed when the libraries move on.
    const pinned = new Map(outcome.libraryUses.map((u) => [u.libraryRevisionId, u]));
    for (const u of pinned.values()) {
      await models.RevisionLibrary.create({ revisionId: rev.id, libraryRevisionId: u.libraryRevisionId, library: u.library, block: u.block }, { transaction });
    }
    const follows = p.draftVersion !== undefined ? p.draftVersion === d.draftVersion : d.draftSource === "" || d.draftSource === p.source;
    if (follows) {
      d.set({
        draftSource: p.source, familyId: familyRow.id, settings,
        draftVersion: d.draftVersion + 1, draftUpdatedAt: new Date(), draftUpdatedBy: p.actor!.userId,
      });
    }
    d.changed("updatedAt", true);
    await d.save({ transaction });
    await recordActivity(
      {
        workspaceId: workspace.id, actorId: p.actor!.userId, action: "design.revision",
        subject: { kind: "design", id: d.id, label: d.name }, details: { number: rev.number, message: p.message, family: familyRow.name },
      },
      transaction,
    );
    return rev.id;
  });
  const r = (await models.Revision.findByPk(id, { include: include() })) as Loaded;
  return detail(r);
}

export type ExportFormat = "verilog" | "vhdl" | "csv" | "json";
const EXT: Record<ExportFormat, [string, string]> = {
  verilog: ["v", "text/x-verilog; charset=utf-8"],
  vhdl: ["vhd", "text/x-vhdl; charset=utf-8"],
  csv: ["csv", "text/csv; charset=utf-8"],
  json: ["json", "application/json"],
};

/**
 * A revision's netlist as a file: rendered from the netlist saved with the
 * revision, so every download is the netlist that was reviewed. Rows saved
 * before netlists were kept are rebuilt from their own source, settings and
 * family snapshot.
 */
export async function exportRevision(p: { actor: Actor | null; slug: string; designId: string; number: number; format: ExportFormat }) {
  const rev = await getRevision(p);
  const design = await designIn((await requireAccess(p.actor, p.slug, "revision.read")).workspace.id, p.designId);
  const saved = (await db().models.Revision.findOne({ where: { designId: design.id, number: rev.number }, attributes: ["netlist"] }))
    ?.netlist as unknown as SavedNetlist | null;
  let body: string | undefined;
  if (saved?.model && saved.document) {
    body = renderSaved(saved, p.format, design.name, rev);
  } else {
    const family = rev.familySnapshot as unknown as Family;
    const settings = designSettingsSchema.safeParse(rev.settings);
    const outcome = await compileOnServer({
      source: rev.source, family, settings: settings.success ? settings.data : {}, userId: p.actor!.userId,
      workspaceId: design.workspaceId, exports: [p.format], unitName: design.name, libraryAnswers: await pinnedAnswers(rev.id),
    });
    body = outcome.result?.exports[p.format];
    if (!outcome.result || body === undefined) {
      throw new AppError("compile_errors", "This revision no longer compiles with the current language; export an earlier one.", { diagnostics: outcome.diagnostics });
    }
  }
  const base = `${design.name}-r${rev.number}`.replace(/[^A-Za-z0-9._-]+/g, "_");
  const [ext, type] = EXT[p.format];
  return { filename: `${base}.${ext}`, contentType: type, body };
}

function renderSaved(saved: SavedNetlist, format: ExportFormat, unitName: string, rev: RevisionDetail): string {
  const family = rev.familySnapshot as unknown as Family;
  const factored = rev.settings.structure === "factored" ? ", factored" : "";
  const header = [`Fanbound netlist, family ${family.name} (${family.id})${factored}, saved with revision ${rev.number}`];
  switch (format) {
    case "verilog":
      return toVerilog(saved.model, { name: unitName, header });
    case "vhdl":
      return toVhdl(saved.model, { name: unitName, header });
    case "csv":
      return toCsv(saved.model);
    case "json":
      return JSON.stringify(saved.document, null, 2);
  }
}
