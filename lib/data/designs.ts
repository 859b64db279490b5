import "server-only";
/**
 * Designs of a workspace. Every query is bounded by the workspace the caller
 * was admitted to, so an id from another workspace finds nothing (404).
 */
import { QueryTypes } from "sequelize";
import { db } from "../db/connection";
import { conflict, invalid, notFound } from "../errors";
import { storedSettings, type CompileSettings } from "../runtime/compile";
import { decodeCursor, encodeCursor, iso, requireAccess, type Actor } from "./access";
import { recordActivity } from "./activity";
import { boundaryFamilies } from "./families";

export interface DesignSummary {
  id: string;
  name: string;
  description: string;
  family: { id: string; key: string; name: string };
  latestRevision: {
    number: number;
    createdAt: string;
    message: string;
    author: { id: string; name: string };
    stats: Record<string, unknown>;
  } | null;
  updatedAt: string;
  archivedAt: string | null;
  createdBy: { id: string; name: string };
}

export interface DesignDetail extends DesignSummary {
  draftSource: string;
  settings: Record<string, unknown>;
  /** Bumped by every write of the draft (source, family, settings); a write names the version it started from. */
  draftVersion: number;
  draftUpdatedAt: string | null;
  draftUpdatedBy: { id: string; name: string } | null;
}

export type DesignSort = "name" | "updated" | "gates" | "depth" | "delay";

// Whitelisted order expressions: the sort key never reaches SQL as text.
const ORDER: Record<DesignSort, string> = {
  name: "lower(d.name)",
  updated: "d.updated_at",
  gates: "(r.stats->>'gates')::numeric",
  depth: "(r.stats->>'depth')::numeric",
  delay: "(r.stats->>'delayNs')::numeric",
};

interface Row {
  id: string;
  name: string;
  description: string;
  draft_source: string;
  draft_version: number;
  draft_updated_at: Date | null;
  draft_updated_by: string | null;
  draft_updated_by_name: string | null;
  settings: Record<string, unknown>;
  updated_at: Date;
  archived_at: Date | null;
  creator_id: string;
  creator_name: string;
  family_id: string;
  family_key: string;
  family_name: string;
  rev_number: number | null;
  rev_created_at: Date | null;
  rev_message: string | null;
  rev_stats: Record<string, unknown> | null;
  author_id: string | null;
  author_name: string | null;
}

const SELECT = `
  SELECT d.id, d.name, d.description, d.draft_source, d.draft_version, d.draft_updated_at, d.draft_updated_by,
         du.name AS draft_updated_by_name, d.settings, d.updated_at, d.archived_at,
         cu.id AS creator_id, cu.name AS creator_name,
         f.id AS family_id, f.key AS family_key, f.name AS family_name,
         r.number AS rev_number, r.created_at AS rev_created_at, r.message AS rev_message, r.stats AS rev_stats,
         au.id AS author_id, au.name AS author_name
  FROM designs d
  JOIN logic_families f ON f.id = d.family_id
  JOIN users cu ON cu.id = d.created_by
  LEFT JOIN users du ON du.id = d.draft_updated_by
  LEFT JOIN LATERAL (SELECT * FROM revisions x WHERE x.design_id = d.id ORDER BY x.number DESC LIMIT 1) r ON true
  LEFT JOIN users au ON au.id = r.author_id`;

function summary(r: Row): DesignSummary {
  return {
    id: r.id,
    name: r.name,
    description: r.description,
    family: { id: r.family_id, key: r.family_key, name: r.family_name },
    latestRevision:
      r.rev_number === null
        ? null
        : {
            number: r.rev_number,
            createdAt: iso(r.rev_created_at)!,
            message: r.rev_message ?? "",
            author: { id: r.author_id!, name: r.author_name! },
            stats: r.rev_stats ?? {},
          },
    updatedAt: iso(r.updated_at)!,
    archivedAt: iso(r.archived_at),
    createdBy: { id: r.creator_id, name: r.creator_name },
  };
}

const detail = (r: Row): DesignDetail => ({
  ...summary(r),
  draftSource: r.draft_source,
  settings: r.settings ?? {},
  draftVersion: r.draft_version,
  draftUpdatedAt: iso(r.draft_updated_at),
  draftUpdatedBy: r.draft_updated_by ? { id: r.draft_updated_by, name: r.draft_updated_by_name ?? "" } : null,
});

/**
 * One page of the workspace's designs. Defaults: sort "updated", order "desc"
 * for updated and "asc" otherwise, archived false, limit 50 (max 200).
 */
export async function listDesigns(p: {
  actor: Actor | null;
  slug: string;
  q?: string;
  sort?: DesignSort;
  order?: "asc" | "desc";
  archived?: boolean;
  limit?: number;
  cursor?: string;
}): Promise<{ items: DesignSummary[]; nextCursor: string | null }> {
  const { workspace } = await requireAccess(p.actor, p.slug, "design.read");
  const sort = p.sort ?? "updated";
  const dir = (p.order ?? (sort === "updated" ? "desc" : "asc")) === "desc" ? "DESC" : "ASC";
  const limit = Math.min(Math.max(p.limit ?? 50, 1), 200);
  const offset = decodeCursor(p.cursor);
  const where = ["d.workspace_id = :ws", p.archived ? "d.archived_at IS NOT NULL" : "d.archived_at IS NULL"];
  const replacements: Record<string, unknown> = { ws: workspace.id, limit: limit + 1, offset };
  if (p.q && p.q.trim()) {
    where.push("(d.name ILIKE :q OR d.description ILIKE :q)");
    replacements.q = `%${p.q.trim().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
  }
  const rows = await db().sequelize.query<Row>(
    `${SELECT} WHERE ${where.join(" AND ")} ORDER BY ${ORDER[sort]} ${dir} NULLS LAST, d.id ASC LIMIT :limit OFFSET :offset`,
    { replacements, type: QueryTypes.SELECT },
  );
  const more = rows.length > limit;
  return { items: rows.slice(0, limit).map(summary), nextCursor: more ? encodeCursor(offset + limit) : null };
}

async function loadDetail(workspaceId: string, designId: string): Promise<DesignDetail> {
  const rows = await db().sequelize.query<Row>(`${SELECT} WHERE d.workspace_id = :ws AND d.id = :id`, {
    replacements: { ws: workspaceId, id: designId },
    type: QueryTypes.SELECT,
  });
  if (!rows[0]) throw notFound("design");
  return detail(rows[0]);
}

/** One design with its draft and settings. */
export async function getDesign(p: { actor: Actor | null; slug: string; designId: string }): Promise<DesignDetail> {
  const { workspace } = await requireAccess(p.actor, p.slug, "design.read");
  return loadDetail(workspace.id, p.designId);
}

/**
 * A family id the workspace may use (built-in or its own), or 400. An
 * archived family is refused unless it is `current` — the family the design
 * is on already, which keeps working after its family is archived.
 */
export async function usableFamily(workspaceId: string, familyId: string, current?: string) {
  const { LogicFamilyRecord } = db().models;
  const row = await LogicFamilyRecord.findByPk(familyId);
  if (!row || (row.workspaceId !== null && row.workspaceId !== workspaceId)) {
    throw invalid("familyId names no family this workspace can use; pick one from the families list.", [{ path: "familyId", message: "unknown family" }]);
  }
  if (row.archivedAt && row.id !== current) {
    throw invalid(`The family "${row.name}" is archived and no longer offered for new designs; pick another, or ask an owner to restore it.`, [
      { path: "familyId", message: "archived family" },
    ]);
  }
  return row;
}

function nameTaken(e: unknown, name: string): never {
  if ((e as { name?: string }).name === "SequelizeUniqueConstraintError") {
    throw conflict(`A design called "${name}" exists in this workspace already; choose another name.`, { field: "name" });
  }
  throw e;
}

/** Creates a design (designer or owner). */
export async function createDesign(p: {
  actor: Actor | null;
  slug: string;
  name: string;
  description?: string;
  familyId: string;
  settings?: CompileSettings;
  draftSource?: string;
}): Promise<DesignDetail> {
  const { workspace } = await requireAccess(p.actor, p.slug, "design.edit");
  const family = await usableFamily(workspace.id, p.familyId);
  if (p.settings) await boundaryFamilies(workspace.id, p.settings);
  const { Design } = db().models;
  let id: string;
  try {
    id = await db().sequelize.transaction(async (transaction) => {
      const d = await Design.create(
        {
          workspaceId: workspace.id,
          name: p.name,
          description: p.description ?? "",
          familyId: p.familyId,
          settings: storedSettings(p.settings ?? {}),
          draftSource: p.draftSource ?? "",
          draftUpdatedAt: new Date(),
          draftUpdatedBy: p.actor!.userId,
          createdBy: p.actor!.userId,
          archivedAt: null,
        },
        { transaction },
      );
      await recordActivity(
        { workspaceId: workspace.id, actorId: p.actor!.userId, action: "design.create", subject: { kind: "design", id: d.id, label: p.name }, details: { family: family.name } },
        transaction,
      );
      return d.id;
    });
  } catch (e) {
    nameTaken(e, p.name);
  }
  return loadDetail(workspace.id, id);
}

/** Renames, describes, archives or restores a design (designer or owner). The draft has its own write, {@link saveDraft}. */
export async function updateDesign(p: {
  actor: Actor | null;
  slug: string;
  designId: string;
  name?: string;
  description?: string;
  archived?: boolean;
}): Promise<DesignDetail> {
  const { workspace } = await requireAccess(p.actor, p.slug, "design.edit");
  const { Design } = db().models;
  const d = await Design.findOne({ where: { id: p.designId, workspaceId: workspace.id } });
  if (!d) throw notFound("design");
  const patch: Partial<{ name: string; description: string; archivedAt: Date | null }> = {};
  if (p.name !== undefined) patch.name = p.name;
  if (p.description !== undefined) patch.description = p.description;
  if (p.archived !== undefined) patch.archivedAt = p.archived ? (d.archivedAt ?? new Date()) : null;
  const was = { name: d.name, archived: d.archivedAt !== null };
  try {
    await db().sequelize.transaction(async (transaction) => {
      await d.update(patch, { transaction });
      const entry = { workspaceId: workspace.id, actorId: p.actor!.userId, subject: { kind: "design" as const, id: d.id, label: d.name } };
      if (p.name !== undefined && p.name !== was.name) await recordActivity({ ...entry, action: "design.rename", details: { from: was.name, to: p.name } }, transaction);
      if (p.archived === true && !was.archived) await recordActivity({ ...entry, action: "design.archive" }, transaction);
      if (p.archived === false && was.archived) await recordActivity({ ...entry, action: "design.restore" }, transaction);
    });
  } catch (e) {
    nameTaken(e, p.name ?? d.name);
  }
  return loadDetail(workspace.id, d.id);
}

/** What a draft write carries; the family and settings travel with the source, so one write keeps them together. */
export interface DraftWrite {
  source: string;
  familyId: string;
  settings: CompileSettings;
  /** The draftVersion the writer's text started from. */
  baseVersion: number;
}

/**
 * Writes a design's draft (designer or owner) when it is still at
 * `baseVersion`, and bumps the version. When someone else wrote it since,
 * nothing is written and the answer is 409 with the draft as it now is
 * (details.draft), so the writer can choose between the two texts. A repeat of
 * a write that already landed (same text, family and settings) is not a
 * conflict: it answers the current draft.
 */
export async function saveDraft(p: { actor: Actor | null; slug: string; designId: string } & DraftWrite): Promise<DesignDetail> {
  const { workspace } = await requireAccess(p.actor, p.slug, "design.edit");
  const current = await db().models.Design.findOne({ where: { id: p.designId, workspaceId: workspace.id } });
  if (!current) throw notFound("design");
  // A design keeps the family it is on after that family is archived; it cannot move onto an archived one.
  const family = await usableFamily(workspace.id, p.familyId, current.familyId);
  await boundaryFamilies(workspace.id, p.settings);
  const settings = storedSettings(p.settings);
  const count = await db().sequelize.transaction(async (transaction) => {
    const [, count] = await db().sequelize.query(
      `UPDATE designs SET draft_source = :source, family_id = :familyId, settings = CAST(:settings AS jsonb),
              draft_version = draft_version + 1, draft_updated_at = now(), draft_updated_by = :userId, updated_at = now()
       WHERE id = :id AND workspace_id = :ws AND draft_version = :base`,
      {
        replacements: {
          source: p.source, familyId: p.familyId, settings: JSON.stringify(settings), userId: p.actor!.userId,
          id: p.designId, ws: workspace.id, base: p.baseVersion,
        },
        type: QueryTypes.UPDATE,
        transaction,
      },
    );
    // The text and settings change as the designer types; the activity list records only a move to another family.
    if (count === 1 && current.familyId !== p.familyId) {
      const before = await db().models.LogicFamilyRecord.findByPk(current.familyId, { transaction });
      await recordActivity(
        {
          workspaceId: workspace.id, actorId: p.actor!.userId, action: "design.family",
          subject: { kind: "design", id: current.id, label: current.name }, details: { from: before?.name ?? "?", to: family.name },
        },
        transaction,
      );
    }
    return count;
  });
  const now = await loadDetail(workspace.id, p.designId);
  if (count === 1) return now;
  const same = now.draftSource === p.source && now.family.id === p.familyId && sameJson(now.settings, settings);
  if (same) return now;
  throw conflict(
    now.draftUpdatedBy
      ? `${now.draftUpdatedBy.name} changed this draft since you loaded it (now at version ${now.draftVersion}); keep your text or take theirs.`
      : `This draft changed since you loaded it (now at version ${now.draftVersion}); keep your text or take the current one.`,
    { draft: draftOf(now) },
  );
}

/** The draft part of a design, as a 409 reports it. */
export function draftOf(d: DesignDetail) {
  return {
    source: d.draftSource,
    familyId: d.family.id,
    settings: d.settings,
    version: d.draftVersion,
    updatedAt: d.draftUpdatedAt,
    updatedBy: d.draftUpdatedBy,
  };
}

function sameJson(a: unknown, b: unknown): boolean {
  return JSON.stringify(sortKeys(a)) === JSON.stringify(sortKeys(b));
}

function sortKeys(v: unknown): unknown {
  if (Array.isArray(v)) return v.map(sortKeys);
  if (v && typeof v === "object") {
    return Object.fromEntries(Object.keys(v).sort().map((k) => [k, sortKeys((v as Record<string, unknown>)[k])]));
  }
  return v;
}
