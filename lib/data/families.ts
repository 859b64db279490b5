import "server-only";
/**
 * Logic families a workspace can use: the built-in ones (no workspace) and
 * its own. Owners manage their own; built-ins are read-only everywhere.
 */
import { Op } from "sequelize";
import { db } from "../db/connection";
import { conflict, invalid, notFound, unauthenticated } from "../errors";
import { deriveFamily, familyFanOut, validateFamily, type Family } from "../families";
import { requireAccess, type Actor } from "./access";

export interface FamilyView {
  id: string;
  key: string;
  name: string;
  builtin: boolean;
  fanIn: number | null;
  fanOut: number | null;
  data: Record<string, unknown>;
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
  return { id: r.id, key: r.key, name: r.name, builtin: r.workspaceId === null, fanIn, fanOut, data: r.data };
}

const visible = (workspaceId: string) => ({ [Op.or]: [{ workspaceId: null }, { workspaceId }] });

/** Built-in families, then the workspace's own, by name. */
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

/** Adds a workspace family (owner); 409 when the key is used in the workspace. */
export async function createFamily(p: { actor: Actor | null; slug: string; key: string; name: string; data: Record<string, unknown> }) {
  const { workspace } = await requireAccess(p.actor, p.slug, "family.manage");
  check(p.key, p.name, p.data);
  const { LogicFamilyRecord } = db().models;
  if (await LogicFamilyRecord.findOne({ where: { workspaceId: workspace.id, key: p.key } })) {
    throw conflict(`This workspace has a family with the key "${p.key}" already; choose another key.`, { field: "key" });
  }
  const row = await LogicFamilyRecord.create({
    workspaceId: workspace.id,
    key: p.key,
    name: p.name,
    builtin: false,
    data: { ...p.data, id: p.key, name: p.name, builtIn: false },
  });
  return familyView(row);
}

async function ownFamily(workspaceId: string, familyId: string): Promise<Rec> {
  const row = await db().models.LogicFamilyRecord.findOne({ where: { id: familyId, ...visible(workspaceId) } });
  if (!row) throw notFound("family");
  if (row.workspaceId === null) throw conflict("Built-in families cannot be changed; copy it into a family of your own.");
  return row;
}

/** Changes a workspace family's name or figures (owner). Saved revisions keep their snapshot. */
export async function updateFamily(p: { actor: Actor | null; slug: string; familyId: string; name?: string; data?: Record<string, unknown> }) {
  const { workspace } = await requireAccess(p.actor, p.slug, "family.manage");
  const row = await ownFamily(workspace.id, p.familyId);
  const name = p.name ?? row.name;
  const data = p.data ?? row.data;
  check(row.key, name, data);
  await row.update({ name, data: { ...data, id: row.key, name, builtIn: false } });
  return familyView(row);
}

/** Deletes a workspace family (owner); 409 while a design or revision uses it. */
export async function deleteFamily(p: { actor: Actor | null; slug: string; familyId: string }): Promise<void> {
  const { workspace } = await requireAccess(p.actor, p.slug, "family.manage");
  const row = await ownFamily(workspace.id, p.familyId);
  const { Design, Revision } = db().models;
  const used = (await Design.count({ where: { familyId: row.id } })) + (await Revision.count({ where: { familyId: row.id } }));
  if (used) throw conflict("Designs or revisions use this family; move them to another family first.", { uses: used });
  await row.destroy();
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
}): Promise<{ record: FamilyView; family: Family; workspaceId: string | null }> {
  if (!p.actor) throw unauthenticated();
  const { LogicFamilyRecord } = db().models;
  let row: Rec | null;
  let workspaceId: string | null = null;
  if (p.slug) {
    const { workspace } = await requireAccess(p.actor, p.slug, "compile.run");
    workspaceId = workspace.id;
    row = p.familyId
      ? await LogicFamilyRecord.findOne({ where: { id: p.familyId, ...visible(workspace.id) } })
      : await LogicFamilyRecord.findOne({ where: { key: p.familyKey ?? "", workspaceId: null } });
  } else if (p.familyId) {
    row = await LogicFamilyRecord.findOne({ where: { id: p.familyId } });
    if (row?.workspaceId) {
      const member = await db().models.Membership.findOne({ where: { workspaceId: row.workspaceId, userId: p.actor.userId } });
      if (!member) row = null;
    }
  } else {
    row = await LogicFamilyRecord.findOne({ where: { key: p.familyKey ?? "", workspaceId: null } });
  }
  if (!row) throw notFound("family");
  return { record: familyView(row), family: familyOf(row), workspaceId };
}
