// Applies the migrations in migrations/ with umzug, recording them in the
// SequelizeMeta table. `node lib/db/migrate.mjs [up|down]` runs as the role of
// DATABASE_OWNER_URL (the one that owns the tables), else of DATABASE_URL.
import { Sequelize } from "sequelize";
import { Umzug, SequelizeStorage } from "umzug";
import path from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");

export function migrator(sequelize) {
  return new Umzug({
    migrations: {
      glob: ["migrations/*.mjs", { cwd: root }],
      resolve: ({ name, path: file, context }) => ({
        name,
        up: async () => (await import(pathToFileURL(file).href)).up({ context }),
        down: async () => (await import(pathToFileURL(file).href)).down({ context }),
      }),
    },
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize }),
    logger: undefined,
  });
}

export async function migrate(url, direction = "up") {
  const sequelize = new Sequelize(url, { logging: false, dialect: "postgres" });
  try {
    const umzug = migrator(sequelize);
    const done = direction === "down" ? await umzug.down() : await umzug.up();
    return done.map((m) => m.name);
  } finally {
    await sequelize.close();
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href) {
  const url = process.env.DATABASE_OWNER_URL || process.env.DATABASE_URL;
  if (!url) {
    console.error("DATABASE_OWNER_URL or DATABASE_URL must be set");
    process.exit(2);
  }
  const names = await migrate(url, process.argv[2] ?? "up");
  console.log(names.length ? `migrations applied: ${names.join(", ")}` : "migrations: up to date");
}
