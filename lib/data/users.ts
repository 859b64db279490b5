import "server-only";
import { Sequelize } from "sequelize";
import { db } from "../db/connection";
import { hashPassword, verifyPassword } from "../auth/password";
import { conflict, unauthenticated } from "../api/errors";
import { requireActor, type Actor } from "./access";

export interface UserSummary {
  id: string;
  email: string;
  name: string;
}

const byEmail = (email: string) => Sequelize.where(Sequelize.fn("lower", Sequelize.col("email")), email.trim().toLowerCase());

/** The user with this e-mail and password, or null; the same time is spent either way. */
export async function findUserForSignIn(email: string, password: string): Promise<UserSummary | null> {
  const { User } = db().models;
  const user = await User.findOne({ where: byEmail(email) });
  const ok = await verifyPassword(password, user?.passwordHash);
  return ok && user ? { id: user.id, email: user.email, name: user.name } : null;
}

/** The user with this e-mail (any case), or null. */
export async function findUserByEmail(email: string): Promise<UserSummary | null> {
  const { User } = db().models;
  const user = await User.findOne({ where: byEmail(email) });
  return user ? { id: user.id, email: user.email, name: user.name } : null;
}

/** Creates an account with a password; 409 when the e-mail is taken. */
export async function createUser(p: { email: string; name: string; password: string }): Promise<UserSummary> {
  const { User } = db().models;
  const email = p.email.trim().toLowerCase();
  if (await User.findOne({ where: byEmail(email) })) {
    throw conflict("An account with this e-mail exists already; sign in, or reset its password.");
  }
  const passwordHash = await hashPassword(p.password);
  try {
    const u = await User.create({ email, name: p.name.trim(), passwordHash, emailVerifiedAt: null });
    return { id: u.id, email: u.email, name: u.name };
  } catch (e) {
    if ((e as { name?: string }).name === "SequelizeUniqueConstraintError") {
      throw conflict("An account with this e-mail exists already; sign in, or reset its password.");
    }
    throw e;
  }
}

/** The caller and the workspaces they belong to, with their role in each. */
export async function getMe(p: { actor: Actor | null }) {
  const userId = requireActor(p.actor);
  const { User, Membership, Workspace } = db().models;
  const user = await User.findByPk(userId);
  if (!user) throw unauthenticated();
  const ms = await Membership.findAll({
    where: { userId },
    include: [{ model: Workspace, as: "workspace" }],
    order: [[{ model: Workspace, as: "workspace" }, "name", "ASC"]],
  });
  return {
    user: { id: user.id, email: user.email, name: user.name },
    workspaces: ms.map((m) => {
      const w = (m as unknown as { workspace: InstanceType<typeof Workspace> }).workspace;
      return { id: w.id, slug: w.slug, name: w.name, role: m.role };
    }),
  };
}
