import "server-only";
import { randomUUID } from "node:crypto";
import { QueryTypes, Sequelize } from "sequelize";
import { db } from "../db/connection";
import { hashPassword, verifyPassword } from "../auth/password";
import { passwordProblem } from "../auth/password-policy";
import { invalid, unauthenticated } from "../errors";
import { requireActor, type Actor } from "./access";

export interface UserSummary {
  id: string;
  email: string;
  name: string;
}

/** A user as signed in: the session carries the session version it started with. */
export interface SignedInUser extends UserSummary {
  sessionVersion: number;
}

const byEmail = (email: string) => Sequelize.where(Sequelize.fn("lower", Sequelize.col("email")), email.trim().toLowerCase());

/** The user with this e-mail and password, or null; the same time is spent either way. */
export async function findUserForSignIn(email: string, password: string): Promise<SignedInUser | null> {
  const { User } = db().models;
  const user = await User.findOne({ where: byEmail(email) });
  const ok = await verifyPassword(password, user?.passwordHash);
  return ok && user ? { id: user.id, email: user.email, name: user.name, sessionVersion: user.sessionVersion } : null;
}

/** 400 naming the password field when the password will not do for this account. */
export function requireGoodPassword(password: string, account: { email: string; name?: string }): void {
  const problem = passwordProblem(password, account);
  if (problem) throw invalid(problem, [{ path: "password", code: "weak_password", message: problem }]);
}

// ---- sessions ------------------------------------------------------------------

/**
 * Whether a session that started at `version` is still live: the account
 * exists and its session version has not been raised since.
 */
export async function sessionIsCurrent(userId: string, version: unknown): Promise<boolean> {
  if (typeof version !== "number" || !/^[0-9a-f-]{36}$/i.test(userId)) return false;
  const user = await db().models.User.findByPk(userId, { attributes: ["sessionVersion"] });
  return !!user && user.sessionVersion === version;
}

/** Ends every session of the account (sign out everywhere): its session version goes up by one. */
export async function endAllSessions(userId: string): Promise<void> {
  await db().models.User.increment("sessionVersion", { by: 1, where: { id: userId } });
}

/**
 * Sign-out: ends the account's sessions when the one signing out is still
 * live (one version serves every session of an account, so this ends them all).
 */
export async function endSessionsFrom(userId: string, version: unknown): Promise<void> {
  if (typeof version !== "number" || !/^[0-9a-f-]{36}$/i.test(userId)) return;
  await db().models.User.increment("sessionVersion", { by: 1, where: { id: userId, sessionVersion: version } });
}

/** Sign out everywhere, for the caller. */
export async function endMySessions(p: { actor: Actor | null }): Promise<void> {
  await endAllSessions(requireActor(p.actor));
}

/** The user with this e-mail (any case), or null. */
export async function findUserByEmail(email: string): Promise<UserSummary | null> {
  const { User } = db().models;
  const user = await User.findOne({ where: byEmail(email) });
  return user ? { id: user.id, email: user.email, name: user.name } : null;
}

/**
 * Creates an account with a password, its address not yet confirmed. The work
 * is the same whether or not the address has an account already (the password
 * is checked and hashed, then one INSERT that does nothing on a taken
 * address), so neither the answer nor its time tells which; `created` says it
 * to the caller, which mails a confirmation link or a note to the owner.
 */
export async function registerUser(p: { email: string; name: string; password: string }): Promise<{ created: boolean; email: string; name: string }> {
  const email = p.email.trim().toLowerCase();
  const name = p.name.trim();
  requireGoodPassword(p.password, { email, name });
  const passwordHash = await hashPassword(p.password);
  const id = randomUUID();
  const rows = await db().sequelize.query<{ id: string }>(
    `INSERT INTO users (id, email, name, password_hash, email_verified_at, session_version, created_at, updated_at)
     VALUES (:id, :email, :name, :passwordHash, NULL, 0, now(), now())
     ON CONFLICT ((lower(email))) DO NOTHING
     RETURNING id`,
    { replacements: { id, email, name, passwordHash }, type: QueryTypes.SELECT },
  );
  return { created: rows.length === 1, email, name };
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
    user: { id: user.id, email: user.email, name: user.name, emailConfirmed: !!user.emailVerifiedAt },
    workspaces: ms.map((m) => {
      const w = (m as unknown as { workspace: InstanceType<typeof Workspace> }).workspace;
      return { id: w.id, slug: w.slug, name: w.name, role: m.role };
    }),
  };
}
