import "server-only";
import type { Transaction } from "sequelize";
import { db } from "../db/connection";
import { conflict, notFound } from "../errors";
import type { Role } from "../auth/permissions";
import { iso, requireAccess, type Actor } from "./access";
import { recordActivity } from "./activity";

export interface MemberView {
  userId: string;
  email: string;
  name: string;
  role: Role;
  joinedAt: string;
}

/** Members of a workspace, by name (any member may read). */
export async function listMembers(p: { actor: Actor | null; slug: string }): Promise<MemberView[]> {
  const { workspace } = await requireAccess(p.actor, p.slug, "member.read");
  const { Membership, User } = db().models;
  const ms = await Membership.findAll({
    where: { workspaceId: workspace.id },
    include: [{ model: User, as: "user" }],
    order: [[{ model: User, as: "user" }, "name", "ASC"]],
  });
  return ms.map((m) => {
    const u = (m as unknown as { user: InstanceType<typeof User> }).user;
    return { userId: u.id, email: u.email, name: u.name, role: m.role, joinedAt: iso(m.createdAt)! };
  });
}

/** A person as the activity list names them: "Name (e-mail)". */
export const who = (u: { name: string; email: string }) => `${u.name} (${u.email})`;

/**
 * Runs a membership change with the workspace row locked, so two owners
 * stepping down at once are serialised and the last-owner check holds.
 */
function underWorkspaceLock<T>(workspaceId: string, fn: (transaction: Transaction) => Promise<T>): Promise<T> {
  const { sequelize, models } = db();
  return sequelize.transaction(async (transaction) => {
    await models.Workspace.findByPk(workspaceId, { lock: transaction.LOCK.UPDATE, transaction });
    return fn(transaction);
  });
}

async function ownerCount(workspaceId: string, transaction: Transaction) {
  return db().models.Membership.count({ where: { workspaceId, role: "owner" }, transaction });
}

/** Changes a member's role (owner); the last owner cannot step down (409). */
export async function updateMemberRole(p: { actor: Actor | null; slug: string; userId: string; role: Role }): Promise<MemberView> {
  const { workspace } = await requireAccess(p.actor, p.slug, "member.manage");
  const { Membership, User } = db().models;
  const u = await User.findByPk(p.userId);
  const m = await underWorkspaceLock(workspace.id, async (transaction) => {
    const m = await Membership.findOne({ where: { workspaceId: workspace.id, userId: p.userId }, transaction });
    if (!m || !u) throw notFound("member");
    if (m.role === "owner" && p.role !== "owner" && (await ownerCount(workspace.id, transaction)) <= 1) {
      throw conflict("A workspace needs at least one owner; make someone else owner first.");
    }
    const from = m.role;
    if (from === p.role) return m;
    await m.update({ role: p.role }, { transaction });
    await recordActivity(
      { workspaceId: workspace.id, actorId: p.actor!.userId, action: "member.role", subject: { kind: "membership", id: u.id, label: who(u) }, details: { from, to: p.role } },
      transaction,
    );
    return m;
  });
  return { userId: u!.id, email: u!.email, name: u!.name, role: m.role, joinedAt: iso(m.createdAt)! };
}

/** Removes a member (owner); the last owner cannot be removed (409). */
export async function removeMember(p: { actor: Actor | null; slug: string; userId: string }): Promise<void> {
  const { workspace } = await requireAccess(p.actor, p.slug, "member.manage");
  const { Membership, User } = db().models;
  const u = await User.findByPk(p.userId);
  await underWorkspaceLock(workspace.id, async (transaction) => {
    const m = await Membership.findOne({ where: { workspaceId: workspace.id, userId: p.userId }, transaction });
    if (!m || !u) throw notFound("member");
    if (m.role === "owner" && (await ownerCount(workspace.id, transaction)) <= 1) {
      throw conflict("A workspace needs at least one owner; make someone else owner first.");
    }
    await m.destroy({ transaction });
    await recordActivity(
      { workspaceId: workspace.id, actorId: p.actor!.userId, action: "member.remove", subject: { kind: "membership", id: u.id, label: who(u) }, details: { role: m.role } },
      transaction,
    );
  });
}
