/**
 * Seeds what every Fanbound database needs — the built-in logic families —
 * and, unless FANBOUND_SEED=base, the demo workspace of Ferrow Lock & Weir
 * with an account per role. Safe to run again: it only adds what is missing.
 * Run with DATABASE_URL set: `tsx lib/db/seed.ts`.
 */
import { Sequelize, Op } from "sequelize";
import pg from "pg";
import { initModels, type Role } from "../../models";
import { hashPassword } from "../auth/password";
import { BUILT_IN_FAMILIES } from "../families";
import { DEMO_PASSWORD, DEMO_USERS, DEMO_WORKSPACE } from "../scripts/demo.mjs";
import { seedDemoDesigns } from "./seed-designs";
import { seedDemoReviews } from "./seed-reviews";
import { seedDemoAdministration, seedDemoFamily, teamJoined } from "./seed-admin";
import { seedDemoLibraries } from "./seed-libraries";

async function main() {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set");
  const sequelize = new Sequelize(url, { dialect: "postgres", dialectModule: pg, logging: false });
  const models = initModels(sequelize);
  const { User, Workspace, Membership, LogicFamilyRecord } = models;
  try {
    for (const family of BUILT_IN_FAMILIES) {
      const [row, created] = await LogicFamilyRecord.findOrCreate({
        where: { key: family.id, workspaceId: { [Op.is]: null } },
        defaults: { key: family.id, name: family.name, builtin: true, data: { ...family }, workspaceId: null },
      });
      // Built-in figures follow the code: a corrected figure reaches existing databases.
      if (!created) await row.update({ name: family.name, data: { ...family } });
    }
    if (process.env.FANBOUND_SEED === "base") return;

    const [workspace] = await Workspace.findOrCreate({
      where: { slug: DEMO_WORKSPACE.slug },
      defaults: { name: DEMO_WORKSPACE.name, slug: DEMO_WORKSPACE.slug, settings: {} },
    });
    const hash = await hashPassword(DEMO_PASSWORD);
    const users: Record<string, InstanceType<typeof User>> = {};
    for (const [role, email, name] of DEMO_USERS as Array<[Role, string, string]>) {
      const [user] = await User.findOrCreate({
        where: { email },
        defaults: { email, name, passwordHash: hash, emailVerifiedAt: new Date() },
      });
      users[role] = user;
      await Membership.findOrCreate({
        where: { workspaceId: workspace.id, userId: user.id },
        defaults: { workspaceId: workspace.id, userId: user.id, role, createdAt: teamJoined(role) },
      });
    }
    const bench = await seedDemoFamily(models, workspace);
    await seedDemoDesigns(models, workspace, users);
    await seedDemoReviews(models, workspace, users);
    await seedDemoLibraries(models, workspace, users);
    await seedDemoAdministration(models, workspace, users, bench);
    console.log(`seeded: ${BUILT_IN_FAMILIES.length} built-in families, workspace "${workspace.name}"`);
  } finally {
    await sequelize.close();
  }
}

main().catch((e: unknown) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
