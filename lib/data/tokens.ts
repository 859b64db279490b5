import "server-only";
/**
 * Personal API tokens: the secret is shown once at creation; the database
 * keeps its SHA-256 and a short prefix by which the owner recognises it.
 */
import { QueryTypes } from "sequelize";
import { db } from "../db/connection";
import { randomSecret, sha256 } from "../auth/secrets";
import { invalid, notFound } from "../errors";
import { iso, requireActor, type Actor } from "./access";

/** Longest allowed token life: 365 days. */
export const MAX_TOKEN_DAYS = 365;
const PREFIX_LENGTH = 10;

export interface TokenSummary {
  id: string;
  name: string;
  prefix: string;
  createdAt: string;
  expiresAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

function summary(t: InstanceType<ReturnType<typeof db>["models"]["ApiToken"]>): TokenSummary {
  return {
    id: t.id,
    name: t.name,
    prefix: t.prefix,
    createdAt: iso(t.createdAt)!,
    expiresAt: iso(t.expiresAt)!,
    lastUsedAt: iso(t.lastUsedAt),
    revokedAt: iso(t.revokedAt),
  };
}

/** The caller's tokens, newest first, revoked and expired ones included. */
export async function listTokens(p: { actor: Actor | null }): Promise<TokenSummary[]> {
  const userId = requireActor(p.actor);
  const { ApiToken } = db().models;
  const rows = await ApiToken.findAll({ where: { userId }, order: [["createdAt", "DESC"]] });
  return rows.map(summary);
}

/**
 * Makes a token that expires at `expiresAt` (at most MAX_TOKEN_DAYS ahead).
 * Returns the secret once; it cannot be read again.
 */
export async function createToken(p: { actor: Actor | null; name: string; expiresAt: Date; now?: Date }) {
  const userId = requireActor(p.actor);
  const now = p.now ?? new Date();
  if (p.expiresAt.getTime() <= now.getTime()) throw invalid("expiresAt must lie in the future.", [{ path: "expiresAt", message: "in the past" }]);
  if (p.expiresAt.getTime() > now.getTime() + MAX_TOKEN_DAYS * 86_400_000) {
    throw invalid(`A token may live at most ${MAX_TOKEN_DAYS} days; choose an earlier expiresAt.`, [{ path: "expiresAt", message: "too far ahead" }]);
  }
  const secret = `fb_${randomSecret(30)}`;
  const { ApiToken } = db().models;
  const row = await ApiToken.create({
    userId,
    name: p.name,
    prefix: secret.slice(0, PREFIX_LENGTH),
    tokenHash: sha256(secret),
    expiresAt: p.expiresAt,
    lastUsedAt: null,
    revokedAt: null,
  });
  return { token: summary(row), secret };
}

/** Revokes one of the caller's tokens; another user's token is reported missing. */
export async function revokeToken(p: { actor: Actor | null; id: string }): Promise<TokenSummary> {
  const userId = requireActor(p.actor);
  const { ApiToken } = db().models;
  const row = await ApiToken.findOne({ where: { id: p.id, userId } });
  if (!row) throw notFound("token");
  if (!row.revokedAt) await row.update({ revokedAt: new Date() });
  return summary(row);
}

/** The user id of a live (unrevoked, unexpired) token, or null. Notes when it was last used. */
export async function resolveApiToken(secret: string): Promise<string | null> {
  if (!secret.startsWith("fb_") || secret.length > 200) return null;
  // A plain statement: every request with a token starts here.
  const rows = await db().sequelize.query<{ id: string; user_id: string; last_used_at: Date | null }>(
    "SELECT id, user_id, last_used_at FROM api_tokens WHERE token_hash = $1 AND revoked_at IS NULL AND expires_at > now()",
    { bind: [sha256(secret)], type: QueryTypes.SELECT },
  );
  const row = rows[0];
  if (!row) return null;
  // Once a minute is precise enough and spares a write per request.
  if (!row.last_used_at || Date.now() - new Date(row.last_used_at).getTime() > 60_000) {
    await db().sequelize.query("UPDATE api_tokens SET last_used_at = now() WHERE id = $1", { bind: [row.id], type: QueryTypes.UPDATE });
  }
  return row.user_id;
}
