/**
 * Bench users for the benchmarks that drive a started server: each a designer
 * of the workspace "load-bench" (made directly in the server's database, so
 * the demo workspace is left as it is), with an API token and a design.
 */
import { readFileSync } from "node:fs";
import path from "node:path";

export interface Client {
  token: string;
  designId: string;
}

async function databaseUrl(): Promise<string> {
  if (process.env.DATABASE_URL) return process.env.DATABASE_URL;
  // The database `npm start` serves from, as its owner role (the bench makes users and tokens there).
  const services = await import("../scripts/services.mjs");
  const roles = await import("../db/roles.mjs");
  return roles.urlForRole(services.databaseUrl(services.profiles.dev.database), roles.ROLES.owner);
}

/** Bench users, each a designer of the load-bench workspace with a token and a design of its own. */
export async function prepareClients(n: number): Promise<Client[]> {
  process.env.DATABASE_URL = await databaseUrl();
  const { db } = await import("../db/connection");
  const { createToken } = await import("../data/tokens");
  const { User, Workspace, Membership, Design, LogicFamilyRecord } = db().models;
  const [ws] = await Workspace.findOrCreate({ where: { slug: "load-bench" }, defaults: { name: "Load bench", slug: "load-bench", settings: {} } });
  const family = await LogicFamilyRecord.findOne({ where: { key: "ttl-std-5v", workspaceId: null } });
  if (!family) throw new Error("the built-in families are missing: run npm start once");
  const source = readFileSync(path.join("lib/lang/examples", "chamber-interlock.fnb"), "utf8");
  const clients: Client[] = [];
  for (let i = 0; i < n; i++) {
    const email = `load-${i}@bench.ferrow.example`;
    const [u] = await User.findOrCreate({ where: { email }, defaults: { email, name: `Load client ${i}`, passwordHash: null, emailVerifiedAt: new Date() } });
    await Membership.findOrCreate({ where: { workspaceId: ws.id, userId: u.id }, defaults: { workspaceId: ws.id, userId: u.id, role: "designer" } });
    const [d] = await Design.findOrCreate({
      where: { workspaceId: ws.id, name: `Load design ${i}` },
      defaults: { workspaceId: ws.id, name: `Load design ${i}`, description: "", familyId: family.id, settings: {}, draftSource: source, createdBy: u.id, archivedAt: null },
    });
    const { secret } = await createToken({ actor: { userId: u.id, via: "token" }, name: "load bench", expiresAt: new Date(Date.now() + 3600_000) });
    clients.push({ token: secret, designId: d.id });
  }
  await db().sequelize.close();
  return clients;
}

