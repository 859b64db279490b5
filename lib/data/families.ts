import "server-only";
/**
 * Logic families a workspace can use: the built-in ones (no workspace) and
 * its own. Owners manage their own; built-ins are read-only everywhere.
 */
import { Op } from "sequelize";
import { db } from "../db/connection";
import { conflict, invalid, notFound, unauthenticated } from "../errors";
import { BUILT_IN_FAMILIES, compatibilityMatrix, deriveFamily, familyFanOut, FIGURES, validateFamily, type Family } from "../families";
import { iso, requireAccess, type Actor } from "./access";
import { recordActivity } from "./activity";

export interface FamilyView {
  id: string;
  key: string;
  name: string;
  builtin: boolean;
  fanIn: number | null;
  fanOut: number | null;
  data: Record<string, unknown>;
  /** When an owner archived it; an archived family is kept for what used it and not offered for new designs. */
  archivedAt: string | null;
}

type Rec = InstanceType<ReturnType<typeof db>["models"]["LogicFamilyRecord"]>;

/** The family description of a record, with its key and name filled in. */
export function familyOf(r: { key: string; name: string; data: Record<string, unknown> }): Family {
  return { ...(r.data as unknown as Family), id: r.key, name: r.name };
}

export function familyView(r: Rec): FamilyView {
  let fanIn: number | null = null;
  let fanOut: number | null = null;
  try {
    const f = familyOf(r);
    fanIn = deriveFamily(f).fanIn.value;
    fanOut = familyFanOut(f);
  } catch {
    // A stored family with incomplete figures still lists; the mapper will say what is missing.
  }
  return { id: r.id, key: r.key, name: r.name, builtin: r.workspaceId === null, fanIn, fanOut, data: r.data, archivedAt: iso(r.archivedAt) };
}

const visible = (workspaceId: string) => ({ [Op.or]: [{ workspaceId: null }, { workspaceId }] });

/** Built-in families, then the workspace's own (archived ones too, marked), by name. */
export async function listFamilies(p: { actor: Actor | null; slug: string }): Promise<FamilyView[]> {
  const { workspace } = await requireAccess(p.actor, p.slug, "family.read");
  const rows = await db().models.LogicFamilyRecord.findAll({
    where: visible(workspace.id),
    order: [["workspaceId", "ASC NULLS FIRST"], ["name", "ASC"]],
  });
  return rows.map(familyView);
}

/** A family the workspace can use (built-in or its own); anything else is reported missing. */
export async function getFamily(p: { actor: Actor | null; slug: string; familyId: string }): Promise<FamilyView> {
  const { workspace } = await requireAccess(p.actor, p.slug, "family.read");
  const row = await db().models.LogicFamilyRecord.findOne({ where: { id: p.familyId, ...visible(workspace.id) } });
  if (!row) throw notFound("family");
  return familyView(row);
}

function check(key: string, name: string, data: Record<string, unknown>) {
  const problems = validateFamily({ ...(data as Partial<Family>), id: key, name });
  if (problems.length) {
    throw invalid(`The family has ${problems.length} problem(s): ${problems[0]!.message}.`, problems.map((x) => ({ path: `data.${x.field}`, message: x.message })));
  }
}

/**
 * Adds a workspace family (owner), empty or as a copy of a family the
 * workspace can see (`copyOf`; figures given in `data` replace the copy's).
 * 409 when the key is used in the workspace or by a built-in family.
 */
export async function createFamily(p: { actor: Actor | null; slug: string; key: string; name: string; data?: Record<string, unknown>; copyOf?: string }) {
  const { workspace } = await requireAccess(p.actor, p.slug, "family.manage");
  const { LogicFamilyRecord } = db().models;
  let base: Record<string, unknown> = {};
  let copiedFrom: string | undefined;
  if (p.copyOf) {
    const src = await LogicFamilyRecord.findOne({ where: { id: p.copyOf, ...visible(workspace.id) } });
    if (!src) throw invalid("copyOf names no family this workspace can see; pick one from the families list.", [{ path: "copyOf", message: "unknown family" }]);
    const { id: _id, name: _name, builtIn: _b, ...figures } = src.data as Record<string, unknown>;
    base = figures;
    copiedFrom = src.name;
  }
  const data = { ...base, ...(p.data ?? {}) };
  check(p.key, p.name, data);
  if (BUILT_IN_FAMILIES.some((f) => f.id === p.key)) {
    throw conflict(`The key "${p.key}" belongs to a built-in family; choose another key for this workspace's own.`, { field: "key" });
  }
  if (await LogicFamilyRecord.findOne({ where: { workspaceId: workspace.id, key: p.key } })) {
    throw conflict(`This workspace has a family with the key "${p.key}" already; choose another key.`, { field: "key" });
  }
  const row = await db().sequelize.transaction(async (transaction) => {
    const row = await LogicFamilyRecord.create(
      { workspaceId: workspace.id, key: p.key, name: p.name, builtin: false, data: { ...data, id: p.key, name: p.name, builtIn: false } },
      { transaction },
    );
    await recordActivity(
      {
        workspaceId: workspace.id, actorId: p.actor!.userId, action: "family.create",
        subject: { kind: "family", id: row.id, label: p.name }, details: copiedFrom ? { key: p.key, copiedFrom } : { key: p.key },
      },
      transaction,
    );
    return row;
  });
  return familyView(row);
}

async function ownFamily(workspaceId: string, familyId: string): Promise<Rec> {
  const row = await db().models.LogicFamilyRecord.findOne({ where: { id: familyId, ...visible(workspaceId) } });
  if (!row) throw notFound("family");
  if (row.workspaceId === null) throw conflict("Built-in families cannot be changed; copy it into a family of your own.");
  return row;
}

const SYMBOL = new Map<string, string>(FIGURES.map((f) => [f.key, f.symbol]));
const same = (a: unknown, b: unknown) => JSON.stringify(a ?? null) === JSON.stringify(b ?? null);

/** What an edit changed, in the words of the activity list: figure symbols, "sources", "gate types"… */
function changedParts(before: Record<string, unknown>, after: Record<string, unknown>): string[] {
  const out: string[] = [];
  for (const k of new Set([...Object.keys(before), ...Object.keys(after)])) {
    if (["id", "name", "builtIn"].includes(k) || same(before[k], after[k])) continue;
    out.push(SYMBOL.get(k) ?? ({ gates: "gate types", transistors: "transistor counts", sources: "sources", ratedDrive: "rated output point", fanIn: "fan-in", fanOut: "fan-out" } as Record<string, string>)[k] ?? k);
  }
  return out;
}

/**
 * Changes a workspace family's name or figures, or archives / restores it
 * (owner). Saved revisions keep their snapshot; an archived family is no
 * longer offered for new designs, and designs on it keep working.
 */
export async function updateFamily(p: { actor: Actor | null; slug: string; familyId: string; name?: string; data?: Record<string, unknown>; archived?: boolean }) {
  const { workspace } = await requireAccess(p.actor, p.slug, "family.manage");
  const row = await ownFamily(workspace.id, p.familyId);
  const name = p.name ?? row.name;
  const data = p.data ?? row.data;
  // Archiving or restoring alone never fails on figures stored before a rule was added.
  if (p.name !== undefined || p.data !== undefined) check(row.key, name, data);
  const before = { ...row.data };
  const beforeName = row.name;
  const wasArchived = row.archivedAt !== null;
  await db().sequelize.transaction(async (transaction) => {
    const next: { name: string; data: Record<string, unknown>; archivedAt?: Date | null } = { name, data: { ...data, id: row.key, name, builtIn: false } };
    if (p.archived !== undefined) next.archivedAt = p.archived ? (row.archivedAt ?? new Date()) : null;
    await row.update(next, { transaction });
    const actor = { workspaceId: workspace.id, actorId: p.actor!.userId, subject: { kind: "family" as const, id: row.id, label: name } };
    const changed = changedParts(before, next.data);
    if (beforeName !== name) changed.unshift(`name (was “${beforeName}”)`);
    if (changed.length) await recordActivity({ ...actor, action: "family.update", details: { changed } }, transaction);
    if (p.archived === true && !wasArchived) await recordActivity({ ...actor, action: "family.archive" }, transaction);
    if (p.archived === false && wasArchived) await recordActivity({ ...actor, action: "family.restore" }, transaction);
  });
  return familyView(row);
}

/** Deletes a workspace family (owner); 409 while a design, a revision or a library block revision uses it (archive it instead). */
export async function deleteFamily(p: { actor: Actor | null; slug: string; familyId: string }): Promise<void> {
  const { workspace } = await requireAccess(p.actor, p.slug, "family.manage");
  const row = await ownFamily(workspace.id, p.familyId);
  const { Design, Revision, LibraryRevision } = db().models;
  const used = (await Design.count({ where: { familyId: row.id } })) + (await Revision.count({ where: { familyId: row.id } }))
    + (await LibraryRevision.count({ where: { familyId: row.id } }));
  if (used) {
    throw conflict("Designs, revisions or library block revisions use this family; archive it instead, so they keep it and new designs do not offer it.", { uses: used });
  }
  // A design that names it at its inputs or outputs checks that boundary against it on every compile.
  const edges = await Design.count({
    where: { workspaceId: workspace.id, [Op.or]: [{ settings: { inputsDrivenBy: row.key } }, { settings: { outputsDrive: row.key } }] },
  });
  if (edges) {
    throw conflict(
      `${edges === 1 ? "A design names" : `${edges} designs name`} this family at its inputs or outputs; archive it instead, or choose another family there first.`,
      { boundaryUses: edges },
    );
  }
  await db().sequelize.transaction(async (transaction) => {
    await row.destroy({ transaction });
    await recordActivity(
      { workspaceId: workspace.id, actorId: p.actor!.userId, action: "family.delete", subject: { kind: "family", id: row.id, label: row.name }, details: { key: row.key } },
      transaction,
    );
  });
}

/**
 * Families named by a design's settings as the driver of its inputs or the
 * receiver of its outputs that the pipeline does not know by itself (the
 * workspace's own; built-ins it finds on its own). 400 for a key the
 * workspace cannot see.
 */
export async function boundaryFamilies(workspaceId: string, settings: { inputsDrivenBy?: string; outputsDrive?: string }): Promise<Family[]> {
  const keys = [...new Set([settings.inputsDrivenBy, settings.outputsDrive].filter((k): k is string => typeof k === "string" && k !== ""))];
  const out: Family[] = [];
  for (const key of keys) {
    const own = await db().models.LogicFamilyRecord.findOne({ where: { workspaceId, key } });
    if (own) out.push(familyOf(own));
    else if (!BUILT_IN_FAMILIES.some((f) => f.id === key)) {
      const field = settings.inputsDrivenBy === key ? "settings.inputsDrivenBy" : "settings.outputsDrive";
      throw invalid(`${field} names no family this workspace can see ("${key}"); give the key of a family from the families list.`, [{ path: field, message: "unknown family" }]);
    }
  }
  return out;
}

/**
 * The family a compile asks for: a built-in by key or id (any signed-in user),
 * or a workspace family by id (members of that workspace only; others get 404).
 */
export async function resolveCompileFamily(p: {
  actor: Actor | null;
  slug?: string;
  familyId?: string;
  familyKey?: string;
  settings?: { inputsDrivenBy?: string; outputsDrive?: string };
}): Promise<{ record: FamilyView; family: Family; workspaceId: string | null; boundary: Family[] }> {
  if (!p.actor) throw unauthenticated();
  const { LogicFamilyRecord } = db().models;
  let row: Rec | null;
  let workspaceId: string | null = null;
  // The workspace whose own families may stand at the design's edges (the family's, when no slug is given).
  let edgesWs: string | null = null;
  if (p.slug) {
    const { workspace } = await requireAccess(p.actor, p.slug, "compile.run");
    workspaceId = workspace.id;
    edgesWs = workspace.id;
    row = p.familyId
      ? await LogicFamilyRecord.findOne({ where: { id: p.familyId, ...visible(workspace.id) } })
      : await LogicFamilyRecord.findOne({ where: { key: p.familyKey ?? "", workspaceId: null } });
  } else if (p.familyId) {
    row = await LogicFamilyRecord.findOne({ where: { id: p.familyId } });
    if (row?.workspaceId) {
      const member = await db().models.Membership.findOne({ where: { workspaceId: row.workspaceId, userId: p.actor.userId } });
      if (!member) row = null;
      else edgesWs = row.workspaceId;
    }
  } else {
    row = await LogicFamilyRecord.findOne({ where: { key: p.familyKey ?? "", workspaceId: null } });
  }
  if (!row) throw notFound("family");
  // Without a workspace only the built-ins can stand at the design's edges; the pipeline finds those itself.
  const boundary = edgesWs && p.settings ? await boundaryFamilies(edgesWs, p.settings) : [];
  return { record: familyView(row), family: familyOf(row), workspaceId, boundary };
}

/**
 * The driver → receiver compatibility of every pair of families the
 * workspace can see, built-in and its own (any member). Archived families
 * are left out unless `archived` is true.
 */
export async function familyMatrix(p: { actor: Actor | null; slug: string; archived?: boolean }) {
  const rows = (await listFamilies(p)).filter((f) => p.archived || f.archivedAt === null);
  const families = rows.map((r) => ({ ...(r.data as unknown as Family), id: r.key, name: r.name }));
  return {
    families: rows.map((r) => ({ id: r.id, key: r.key, name: r.name, builtin: r.builtin, archivedAt: r.archivedAt })),
    pairs: compatibilityMatrix(families),
  };
}
