import { createHash, randomBytes } from "node:crypto";

/** A URL-safe random secret of `bytes` random bytes (default 32). */
export function randomSecret(bytes = 32): string {
  return randomBytes(bytes).toString("base64url");
}

/** Hex SHA-256 of a secret: what the database keeps instead of the secret. */
export function sha256(secret: string): string {
  return createHash("sha256").update(secret, "utf8").digest("hex");
}
