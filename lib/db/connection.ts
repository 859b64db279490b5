import "server-only";
/**
 * The one Sequelize connection of a server process, made on first use from
 * DATABASE_URL. Route handlers and pages reach it only through lib/data/.
 */
import { Sequelize } from "sequelize";
import pg from "pg";
import { initModels } from "../../models";

type Db = { sequelize: Sequelize; models: ReturnType<typeof initModels> };
const globalForDb = globalThis as unknown as { fanboundDb?: Db };

export function db(): Db {
  if (globalForDb.fanboundDb) return globalForDb.fanboundDb;
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set: start the app with `npm start`");
  const sequelize = new Sequelize(url, {
    dialect: "postgres",
    dialectModule: pg,
    logging: false,
    pool: { max: 5, idle: 10_000 },
  });
  const models = initModels(sequelize);
  globalForDb.fanboundDb = { sequelize, models };
  return globalForDb.fanboundDb;
}
