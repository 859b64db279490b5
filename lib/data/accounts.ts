import "server-only";
/**
 * One-time e-mail secrets: sign-in links (15 minutes) and password resets
 * (30 minutes). Only hashes are stored; each works once. Requests for an
 * unknown address succeed silently, so the API does not tell who has an account.
 */
import { Sequelize } from "sequelize";
import { db } from "../db/connection";
import { AppError } from "../api/errors";
import { hashPassword } from "../auth/password";
import { randomSecret, sha256 } from "../auth/secrets";
import { sendMail, siteUrl } from "../auth/mail";
import type { UserSummary } from "./users";

/** Lifetime of a sign-in link, minutes. */
export const SIGNIN_LINK_MINUTES = 15;
/** Lifetime of a password-reset link, minutes. */
export const RESET_LINK_MINUTES = 30;

type Purpose = "signin" | "reset";

async function issue(email: string, purpose: Purpose): Promise<string | null> {
  const { User, EmailToken } = db().models;
  const user = await User.findOne({
    where: Sequelize.where(Sequelize.fn("lower", Sequelize.col("email")), email.trim().toLowerCase()),
  });
  if (!user) return null;
  const secret = randomSecret();
  const minutes = purpose === "signin" ? SIGNIN_LINK_MINUTES : RESET_LINK_MINUTES;
  await EmailToken.create({
    purpose,
    email: user.email,
    tokenHash: sha256(secret),
    expiresAt: new Date(Date.now() + minutes * 60_000),
    usedAt: null,
  });
  return secret;
}

/** Mails a one-time sign-in link to the address when it has an account. */
export async function requestSignInLink(p: { email: string; callbackUrl?: string }): Promise<void> {
  const secret = await issue(p.email, "signin");
  if (!secret) return;
  const cb = p.callbackUrl && p.callbackUrl.startsWith("/") && !p.callbackUrl.startsWith("//") ? `&callbackUrl=${encodeURIComponent(p.callbackUrl)}` : "";
  await sendMail({
    to: p.email,
    subject: "Your Fanbound sign-in link",
    lines: [
      "Someone (we hope you) asked to sign in to Fanbound with this address.",
      `The link works once, for ${SIGNIN_LINK_MINUTES} minutes. If you did not ask for it, ignore this message.`,
    ],
    link: { url: siteUrl(`/signin/link?token=${encodeURIComponent(secret)}${cb}`), label: "Sign in to Fanbound" },
  });
}

/** Mails a password-reset link to the address when it has an account. */
export async function requestPasswordReset(p: { email: string }): Promise<void> {
  const secret = await issue(p.email, "reset");
  if (!secret) return;
  await sendMail({
    to: p.email,
    subject: "Reset your Fanbound password",
    lines: [
      "Someone (we hope you) asked to reset the password of this Fanbound account.",
      `The link works once, for ${RESET_LINK_MINUTES} minutes. If you did not ask for it, your password stays as it is.`,
    ],
    link: { url: siteUrl(`/reset?token=${encodeURIComponent(secret)}`), label: "Choose a new password" },
  });
}

/** Marks a live secret used and returns its user; null when unknown, used or expired. */
async function consume(secret: string, purpose: Purpose, after?: (userId: string, t: import("sequelize").Transaction) => Promise<void>) {
  const { sequelize, models } = db();
  return sequelize.transaction(async (transaction) => {
    const row = await models.EmailToken.findOne({
      where: { tokenHash: sha256(secret), purpose },
      lock: transaction.LOCK.UPDATE,
      transaction,
    });
    if (!row || row.usedAt || row.expiresAt <= new Date()) return null;
    const user = await models.User.findOne({
      where: Sequelize.where(Sequelize.fn("lower", Sequelize.col("email")), row.email.toLowerCase()),
      transaction,
    });
    if (!user) return null;
    await row.update({ usedAt: new Date() }, { transaction });
    // Following a link sent to the address proves it.
    if (!user.emailVerifiedAt) await user.update({ emailVerifiedAt: new Date() }, { transaction });
    if (after) await after(user.id, transaction);
    return { id: user.id, email: user.email, name: user.name } satisfies UserSummary;
  });
}

/** The user a sign-in link belongs to, using it up; null when it is not (or no longer) valid. */
export function consumeSignInLink(secret: string): Promise<UserSummary | null> {
  return consume(secret, "signin");
}

/** Sets a new password with a reset secret; 400 when the link is not valid any more. */
export async function completePasswordReset(p: { token: string; password: string }): Promise<UserSummary> {
  const hash = await hashPassword(p.password);
  const user = await consume(p.token, "reset", async (userId, transaction) => {
    await db().models.User.update({ passwordHash: hash }, { where: { id: userId }, transaction });
  });
  if (!user) throw new AppError("invalid_input", "This reset link is not valid any more (used or expired); ask for a new one.", [{ path: "token", message: "not valid" }]);
  return user;
}
