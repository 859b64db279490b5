import "server-only";
import { db } from "../db/connection";
import { conflict } from "../errors";
import { requireAccess, requireActor, type Actor } from "./access";
import type { Role } from "../auth/permissions";

export interface WorkspaceView {
  id: string;
  slug: string;
  name: string;
  role: Role;
  settings: Record<string, unknown>;
}

const view = (w: { id: string; slug: string; name: string; settings: Record<string, unknown> }, role: Role): WorkspaceView => ({
  id: w.id,
  slug: w.slug,
  name: w.name,
  role,
  settings: w.settings ?? {},
});

/** The caller's workspaces with their role, by name. */
export async function listWorkspaces(p: { actor: Actor | null }): Promise<WorkspaceView[]> {
  const userId = requireActor(p.actor);
  const { Membership, Workspace } = db().models;
  const ms = await Membership.findAll({
    where: { userId },
    include: [{ model: Workspace, as: "workspace" }],
    order: [[{ model: Workspace, as: "workspace" }, "name", "ASC"]],
  });
  return ms.map((m) => view((m as unknown as { workspace: InstanceType<typeof Workspace> }).workspace, m.role));
}

/** Creates a workspace with the caller as its owner; 409 when the slug is taken. */
export async function createWorkspace(p: { actor: Actor | null; name: string; slug: string; settings?: Record<string, unknown> }) {
  const userId = requireActor(p.actor);
  const { sequelize, models } = db();
  if (await models.Workspace.findOne({ where: { slug: p.slug } })) {
    throw conflict(`The address "${p.slug}" is taken; choose another slug.`, { field: "slug" });
  }
  try {
    return await sequelize.transaction(async (transaction) => {
      const w = await models.Workspace.create({ name: p.name, slug: p.slug, settings: p.settings ?? {} }, { transaction });
      await models.Membership.create({ workspaceId: w.id, userId, role: "owner" }, { transaction });
      return view(w, "owner");
    });
  } catch (e) {
    if ((e as { name?: string }).name === "SequelizeUniqueConstraintError") {
      throw conflict(`The address "${p.slug}" is taken; choose another slug.`, { field: "slug" });
    }
    throw e;
  }
}

/** One workspace as the caller sees it. */
export async function getWorkspace(p: { actor: Actor | null; slug: string }): Promise<WorkspaceView> {
  const { workspace, role } = await requireAccess(p.actor, p.slug, "workspace.read");
  return view(workspace, role);
}

/** Renames or changes settings (owner); settings given replace the stored object key by key. */
export async function updateWorkspace(p: {
  actor: Actor | null;
  slug: string;
  name?: string;
  settings?: Record<string, unknown>;
}): Promise<WorkspaceView> {
  const { workspace, role } = await requireAccess(p.actor, p.slug, "workspace.settings");
  const patch: { name?: string; settings?: Record<string, unknown> } = {};
  if (p.name !== undefined) patch.name = p.name;
  if (p.settings !== undefined) patch.settings = { ...workspace.settings, ...p.settings };
  await workspace.update(patch);
  return view(workspace, role);
}
