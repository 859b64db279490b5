import "server-only";
/**
 * One-time e-mail secrets: sign-in links (15 minutes), password resets
 * (30 minutes) and address confirmations sent at sign-up (48 hours). Only
 * hashes are stored; each works once, and following any of them proves the
 * address. The request functions look the address up, issue and mail: the
 * routes run them after answering (lib/api/after.ts), so an address with an
 * account and one without get the same answer in the same time.
 */
import { Op, Sequelize, type Transaction } from "sequelize";
import { db } from "../db/connection";
import { AppError } from "../errors";
import { hashPassword } from "../auth/password";
import { passwordProblem } from "../auth/password-policy";
import { randomSecret, sha256 } from "../auth/secrets";
import { sendMail, siteUrl } from "../auth/mail";
import type { SignedInUser, UserSummary } from "./users";

/** Lifetime of a sign-in link, minutes. */
export const SIGNIN_LINK_MINUTES = 15;
/** Lifetime of a password-reset link, minutes. */
export const RESET_LINK_MINUTES = 30;
/** Lifetime of the address confirmation sent at sign-up, hours. */
export const VERIFY_LINK_HOURS = 48;

type Purpose = "signin" | "reset" | "verify";
type UserRow = InstanceType<ReturnType<typeof db>["models"]["User"]>;

const LIFETIME_MS: Record<Purpose, number> = {
  signin: SIGNIN_LINK_MINUTES * 60_000,
  reset: RESET_LINK_MINUTES * 60_000,
  verify: VERIFY_LINK_HOURS * 3_600_000,
};

const byEmail = (email: string) => Sequelize.where(Sequelize.fn("lower", Sequelize.col("email")), email.trim().toLowerCase());

/** A same-site path to return to after the link, or "" (never another site). */
function callbackQuery(callbackUrl: string | undefined): string {
  return callbackUrl && callbackUrl.startsWith("/") && !callbackUrl.startsWith("//") && !callbackUrl.startsWith("/\\")
    ? `&callbackUrl=${encodeURIComponent(callbackUrl)}`
    : "";
}

async function issue(user: UserRow, purpose: Purpose): Promise<string> {
  const secret = randomSecret();
  await db().models.EmailToken.create({
    purpose,
    email: user.email,
    tokenHash: sha256(secret),
    expiresAt: new Date(Date.now() + LIFETIME_MS[purpose]),
    usedAt: null,
  });
  return secret;
}

/** Mails a one-time sign-in link to the address when it has an account; nothing otherwise. */
export async function requestSignInLink(p: { email: string; callbackUrl?: string }): Promise<void> {
  const user = await db().models.User.findOne({ where: byEmail(p.email) });
  if (!user) return;
  const secret = await issue(user, "signin");
  await sendMail({
    to: user.email,
    subject: "Your Fanbound sign-in link",
    lines: [
      "Someone (we hope you) asked to sign in to Fanbound with this address.",
      `The link works once, for ${SIGNIN_LINK_MINUTES} minutes, and confirms the address. If you did not ask for it, ignore this message.`,
    ],
    link: { url: siteUrl(`/signin/link?token=${encodeURIComponent(secret)}${callbackQuery(p.callbackUrl)}`), label: "Sign in to Fanbound" },
  });
}

/** Mails a password-reset link to the address when it has an account; nothing otherwise. */
export async function requestPasswordReset(p: { email: string }): Promise<void> {
  const user = await db().models.User.findOne({ where: byEmail(p.email) });
  if (!user) return;
  const secret = await issue(user, "reset");
  await sendMail({
    to: user.email,
    subject: "Reset your Fanbound password",
    lines: [
      "Someone (we hope you) asked to reset the password of this Fanbound account.",
      `The link works once, for ${RESET_LINK_MINUTES} minutes. If you did not ask for it, your password stays as it is.`,
    ],
    link: { url: siteUrl(`/reset?token=${encodeURIComponent(secret)}`), label: "Choose a new password" },
  });
}

/**
 * After a sign-up: mails the new account a link that confirms its address, or,
 * when the address had an account already, mails its owner a note instead.
 */
export async function mailAfterSignUp(p: { email: string; created: boolean; callbackUrl?: string }): Promise<void> {
  const user = await db().models.User.findOne({ where: byEmail(p.email) });
  if (!user) return;
  if (!p.created) {
    await sendMail({
      to: user.email,
      subject: "Someone tried to create a Fanbound account with your address",
      lines: [
        "Someone (perhaps you) tried to create a new Fanbound account with this address. You have an account with it already, so nothing was created and nothing changed.",
        "If it was you, sign in instead, or choose a new password if you have forgotten yours. If it was not you, you can ignore this message.",
      ],
      link: { url: siteUrl("/signin"), label: "Sign in to Fanbound" },
    });
    return;
  }
  const secret = await issue(user, "verify");
  await sendMail({
    to: user.email,
    subject: "Confirm your address for Fanbound",
    lines: [
      `Welcome to Fanbound, ${user.name}. Confirm that this address is yours: until then, invitations to workspaces cannot be accepted with it.`,
      `The link works once, for ${VERIFY_LINK_HOURS} hours. If you did not create an account, ignore this message.`,
    ],
    link: { url: siteUrl(`/verify?token=${encodeURIComponent(secret)}${callbackQuery(p.callbackUrl)}`), label: "Confirm my address" },
  });
}

/**
 * Marks a live secret used and returns its user, with the address confirmed
 * (following a link sent to it proves it); null when unknown, used or
 * expired. `then` runs in the same transaction; an error it throws leaves the
 * secret unused.
 */
async function consume(secret: string, purpose: Purpose, then?: (user: UserRow, t: Transaction) => Promise<void>): Promise<UserRow | null> {
  const { sequelize, models } = db();
  return sequelize.transaction(async (transaction) => {
    const row = await models.EmailToken.findOne({
      where: { tokenHash: sha256(secret), purpose },
      lock: transaction.LOCK.UPDATE,
      transaction,
    });
    if (!row || row.usedAt || row.expiresAt <= new Date()) return null;
    const user = await models.User.findOne({ where: byEmail(row.email), lock: transaction.LOCK.UPDATE, transaction });
    if (!user) return null;
    await row.update({ usedAt: new Date() }, { transaction });
    if (!user.emailVerifiedAt) await user.update({ emailVerifiedAt: new Date() }, { transaction });
    if (then) await then(user, transaction);
    return user;
  });
}

/** The user a sign-in link belongs to, using it up; null when it is not (or no longer) valid. */
export async function consumeSignInLink(secret: string): Promise<SignedInUser | null> {
  const user = await consume(secret, "signin");
  return user ? { id: user.id, email: user.email, name: user.name, sessionVersion: user.sessionVersion } : null;
}

/** Confirms the address with the secret from the sign-up mail; 400 when the link is not valid any more. */
export async function confirmEmail(p: { token: string }): Promise<UserSummary> {
  const user = await consume(p.token, "verify");
  if (!user) {
    throw new AppError("invalid_input", "This confirmation link is not valid any more (used or expired). Sign in with a link by e-mail instead: it confirms the address too.", [
      { path: "token", message: "not valid" },
    ]);
  }
  return { id: user.id, email: user.email, name: user.name };
}

/**
 * Sets a new password with a reset secret. Every session of the account ends
 * (its session version goes up); with `revokeApiTokens`, its live personal
 * API tokens are revoked too. 400 when the link is not valid any more, or the
 * password will not do (the link stays usable then).
 */
export async function completePasswordReset(p: { token: string; password: string; revokeApiTokens?: boolean }): Promise<{ user: UserSummary; tokensRevoked: number }> {
  const hash = await hashPassword(p.password);
  let tokensRevoked = 0;
  const user = await consume(p.token, "reset", async (u, transaction) => {
    const problem = passwordProblem(p.password, { email: u.email, name: u.name });
    if (problem) throw new AppError("invalid_input", problem, [{ path: "password", code: "weak_password", message: problem }]);
    await u.update({ passwordHash: hash, sessionVersion: u.sessionVersion + 1 }, { transaction });
    if (p.revokeApiTokens) {
      const [n] = await db().models.ApiToken.update(
        { revokedAt: new Date() },
        { where: { userId: u.id, revokedAt: { [Op.is]: null } }, transaction },
      );
      tokensRevoked = n;
    }
  });
  if (!user) throw new AppError("invalid_input", "This reset link is not valid any more (used or expired); ask for a new one.", [{ path: "token", message: "not valid" }]);
  return { user: { id: user.id, email: user.email, name: user.name }, tokensRevoked };
}
