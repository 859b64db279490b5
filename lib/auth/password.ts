import bcrypt from "bcryptjs";

/** bcrypt cost 12: a few hundred milliseconds here, slow enough for stolen hashes. */
const COST = Number(process.env.FANBOUND_BCRYPT_COST ?? 12);

export function hashPassword(plain: string): Promise<string> {
  return bcrypt.hash(plain, COST);
}

let decoy: Promise<string> | null = null;

export async function verifyPassword(plain: string, hash: string | null | undefined): Promise<boolean> {
  // Compare against a decoy when the account has no password, so timing does not tell whether it exists.
  decoy ??= bcrypt.hash("decoy-password", COST);
  const ok = await bcrypt.compare(plain, hash ?? (await decoy));
  return ok && !!hash;
}
