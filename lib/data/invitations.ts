import "server-only";
/**
 * Invitations by e-mail: a single-use secret that expires (default 7 days).
 * Only its hash is stored; the link in the mail carries the secret.
 */
import { Op, Sequelize } from "sequelize";
import { db } from "../db/connection";
import { conflict, forbidden, notFound, AppError } from "../errors";
import type { Role } from "../auth/permissions";
import { randomSecret, sha256 } from "../auth/secrets";
import { sendMail, siteUrl } from "../auth/mail";
import { iso, requireAccess, requireActor, type Actor } from "./access";
import { recordActivity } from "./activity";

/** How long an invitation stays open: 7 days. */
export const INVITATION_DAYS = 7;

export interface InvitationView {
  id: string;
  email: string;
  role: Role;
  status: "open" | "accepted" | "revoked" | "expired";
  expiresAt: string;
  createdAt: string;
  invitedBy: { id: string; name: string };
}

type Inv = InstanceType<ReturnType<typeof db>["models"]["Invitation"]>;

function status(i: Inv, now = new Date()): InvitationView["status"] {
  if (i.acceptedAt) return "accepted";
  if (i.revokedAt) return "revoked";
  return i.expiresAt <= now ? "expired" : "open";
}

function view(i: Inv, inviter: { id: string; name: string }): InvitationView {
  return {
    id: i.id,
    email: i.email,
    role: i.role,
    status: status(i),
    expiresAt: iso(i.expiresAt)!,
    createdAt: iso(i.createdAt)!,
    invitedBy: inviter,
  };
}

/** The workspace's invitations, newest first (owner). */
export async function listInvitations(p: { actor: Actor | null; slug: string }): Promise<InvitationView[]> {
  const { workspace } = await requireAccess(p.actor, p.slug, "invitation.manage");
  const { Invitation, User } = db().models;
  const rows = await Invitation.findAll({
    where: { workspaceId: workspace.id },
    include: [{ model: User, as: "inviter" }],
    order: [["createdAt", "DESC"]],
  });
  return rows.map((r) => {
    const u = (r as unknown as { inviter: InstanceType<typeof User> }).inviter;
    return view(r, { id: u.id, name: u.name });
  });
}

/**
 * Invites an e-mail address with a role (owner) and mails the link. 409 when
 * that address is a member already or has an open invitation.
 */
export async function createInvitation(p: { actor: Actor | null; slug: string; email: string; role: Role }): Promise<InvitationView> {
  const { workspace } = await requireAccess(p.actor, p.slug, "invitation.manage");
  const { Invitation, User, Membership } = db().models;
  const email = p.email.trim().toLowerCase();
  const existing = await User.findOne({ where: Sequelize.where(Sequelize.fn("lower", Sequelize.col("email")), email) });
  if (existing && (await Membership.findOne({ where: { workspaceId: workspace.id, userId: existing.id } }))) {
    throw conflict(`${email} is a member of this workspace already; change their role under members instead.`);
  }
  const open = await Invitation.findOne({
    where: { workspaceId: workspace.id, email, acceptedAt: { [Op.is]: null }, revokedAt: { [Op.is]: null }, expiresAt: { [Op.gt]: new Date() } },
  });
  if (open) throw conflict(`${email} has an open invitation already; revoke it to send a new one.`);
  const secret = randomSecret();
  const inviter = (await User.findByPk(p.actor!.userId))!;
  const row = await db().sequelize.transaction(async (transaction) => {
    const row = await Invitation.create(
      {
        workspaceId: workspace.id,
        email,
        role: p.role,
        tokenHash: sha256(secret),
        invitedBy: inviter.id,
        expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000),
        acceptedAt: null,
        revokedAt: null,
      },
      { transaction },
    );
    await recordActivity(
      { workspaceId: workspace.id, actorId: inviter.id, action: "invitation.create", subject: { kind: "invitation", id: row.id, label: email }, details: { role: p.role } },
      transaction,
    );
    return row;
  });
  await mailInvitation({ email, secret, inviterName: inviter.name, workspaceName: workspace.name, role: p.role });
  return view(row, { id: inviter.id, name: inviter.name });
}

async function mailInvitation(m: { email: string; secret: string; inviterName: string; workspaceName: string; role: Role; again?: boolean }) {
  const url = siteUrl(`/invite?token=${encodeURIComponent(m.secret)}`);
  await sendMail({
    to: m.email,
    subject: `${m.inviterName} invites you to ${m.workspaceName} on Fanbound`,
    lines: [
      `${m.inviterName} invites you to the workspace "${m.workspaceName}" as ${m.role}.`,
      ...(m.again ? ["This link replaces the one sent before, which no longer works."] : []),
      `The link works once and for ${INVITATION_DAYS} days. Sign in (or create an account) with this e-mail address to accept.`,
    ],
    link: { url, label: "Accept the invitation" },
  });
}

/**
 * Sends an open or expired invitation again (owner): a new link, valid for
 * another INVITATION_DAYS days; the earlier link stops working. 409 for one
 * that was accepted or cancelled, or whose address has joined meanwhile.
 */
export async function resendInvitation(p: { actor: Actor | null; slug: string; id: string }): Promise<InvitationView> {
  const { workspace } = await requireAccess(p.actor, p.slug, "invitation.manage");
  const { sequelize, models } = db();
  const secret = randomSecret();
  const row = await sequelize.transaction(async (transaction) => {
    const row = await models.Invitation.findOne({ where: { id: p.id, workspaceId: workspace.id }, lock: transaction.LOCK.UPDATE, transaction });
    if (!row) throw notFound("invitation");
    if (row.acceptedAt) throw conflict("That invitation was accepted already; there is nothing to send.");
    if (row.revokedAt) throw conflict("That invitation was cancelled; invite the address again instead.");
    const user = await models.User.findOne({ where: Sequelize.where(Sequelize.fn("lower", Sequelize.col("email")), row.email.toLowerCase()), transaction });
    if (user && (await models.Membership.findOne({ where: { workspaceId: workspace.id, userId: user.id }, transaction }))) {
      throw conflict(`${row.email} is a member of this workspace already; cancel the invitation instead.`);
    }
    await row.update({ tokenHash: sha256(secret), expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000) }, { transaction });
    await recordActivity(
      { workspaceId: workspace.id, actorId: p.actor!.userId, action: "invitation.resend", subject: { kind: "invitation", id: row.id, label: row.email }, details: { role: row.role } },
      transaction,
    );
    return row;
  });
  const sender = (await models.User.findByPk(p.actor!.userId))!;
  const inviter = (await models.User.findByPk(row.invitedBy))!;
  await mailInvitation({ email: row.email, secret, inviterName: sender.name, workspaceName: workspace.name, role: row.role, again: true });
  return view(row, { id: inviter.id, name: inviter.name });
}

/** Revokes an open invitation (owner); one of another workspace is reported missing. */
export async function revokeInvitation(p: { actor: Actor | null; slug: string; id: string }): Promise<InvitationView> {
  const { workspace } = await requireAccess(p.actor, p.slug, "invitation.manage");
  const { Invitation, User } = db().models;
  const row = await Invitation.findOne({ where: { id: p.id, workspaceId: workspace.id } });
  if (!row) throw notFound("invitation");
  if (row.acceptedAt) throw conflict("That invitation was accepted already; remove the member instead.");
  if (!row.revokedAt) {
    await db().sequelize.transaction(async (transaction) => {
      await row.update({ revokedAt: new Date() }, { transaction });
      await recordActivity(
        { workspaceId: workspace.id, actorId: p.actor!.userId, action: "invitation.revoke", subject: { kind: "invitation", id: row.id, label: row.email }, details: { role: row.role } },
        transaction,
      );
    });
  }
  const u = (await User.findByPk(row.invitedBy))!;
  return view(row, { id: u.id, name: u.name });
}

/** 403 for an account whose address is not confirmed, saying how to confirm it. */
export function unconfirmedAddress(email: string): AppError {
  return new AppError(
    "forbidden",
    `Confirm that ${email} is your address before you accept: open the link in the mail we sent it when you signed up, ` +
      `or sign out and sign in with "Link by e-mail" to ${email} (either link confirms it). Then open the invitation again.`,
    { reason: "email_unconfirmed", email },
  );
}

/**
 * Accepts an invitation for the signed-in caller, whose e-mail must be the
 * invited one and confirmed (by a link mailed to it). The token works once;
 * expired or revoked ones are refused.
 */
export async function acceptInvitation(p: { actor: Actor | null; token: string }) {
  const userId = requireActor(p.actor);
  const { sequelize, models } = db();
  return sequelize.transaction(async (transaction) => {
    const row = await models.Invitation.findOne({
      where: { tokenHash: sha256(p.token) },
      lock: transaction.LOCK.UPDATE,
      transaction,
    });
    if (!row || row.revokedAt || row.expiresAt <= new Date()) {
      throw new AppError("not_found", "This invitation link is not valid any more; ask the owner for a new one.");
    }
    if (row.acceptedAt) throw conflict("This invitation has been used already.");
    const user = await models.User.findByPk(userId, { transaction });
    if (!user || user.email.toLowerCase() !== row.email.toLowerCase()) {
      throw forbidden(`accepting an invitation sent to ${row.email}; sign in with that address`);
    }
    // Whoever signs up with an address has not shown it is theirs: only a link mailed to it does.
    if (!user.emailVerifiedAt) throw unconfirmedAddress(user.email);
    const workspace = (await models.Workspace.findByPk(row.workspaceId, { transaction }))!;
    const existing = await models.Membership.findOne({ where: { workspaceId: workspace.id, userId }, transaction });
    if (!existing) await models.Membership.create({ workspaceId: workspace.id, userId, role: row.role }, { transaction });
    await row.update({ acceptedAt: new Date() }, { transaction });
    if (!existing) {
      const joined = { kind: "membership" as const, id: user.id, label: `${user.name} (${user.email})` };
      await recordActivity({ workspaceId: workspace.id, actorId: user.id, action: "member.join", subject: joined, details: { role: row.role } }, transaction);
    }
    return { workspace: { id: workspace.id, slug: workspace.slug, name: workspace.name, role: existing?.role ?? row.role } };
  });
}
