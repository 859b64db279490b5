// Long compiles as jobs. pg-boss keeps the queue in its own schema "pgboss",
// created here by the migration role (the app and the workers only use it);
// compile_jobs holds what the workbench shows of each job: who asked, where
// it stands (stage, best cost, proven lower bound), which worker holds it and
// when that worker last said it was alive. The result itself is kept in
// compile_results under the job's key.
/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function up({ context: qi }) {
  const { DataTypes: T } = await import("sequelize");
  const { default: PgBoss } = await import("pg-boss");
  const [rows] = await qi.sequelize.query("SELECT 1 FROM information_schema.schemata WHERE schema_name = 'pgboss'");
  if (rows.length === 0) await qi.sequelize.query(PgBoss.getConstructionPlans("pgboss"));
  const now = qi.sequelize.literal("now()");
  await qi.sequelize.transaction(async (transaction) => {
    const o = { transaction };
    await qi.sequelize.query(
      "SELECT pgboss.create_queue('compile', '{\"policy\": \"standard\", \"retryLimit\": 0, \"expireInSeconds\": 14400, \"retentionMinutes\": 10080}'::json)",
      o,
    );
    await qi.createTable("compile_jobs", {
      id: { type: T.UUID, primaryKey: true, defaultValue: qi.sequelize.literal("gen_random_uuid()") },
      workspace_id: { type: T.UUID, allowNull: false, references: { model: "workspaces", key: "id" }, onDelete: "CASCADE" },
      design_id: { type: T.UUID, allowNull: true, references: { model: "designs", key: "id" }, onDelete: "SET NULL" },
      user_id: { type: T.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "CASCADE" },
      key: { type: T.STRING(64), allowNull: false },
      input: { type: T.JSONB, allowNull: false },
      status: { type: T.STRING(16), allowNull: false },
      stage: { type: T.STRING(16), allowNull: true },
      cost: { type: T.INTEGER, allowNull: true },
      lower_bound: { type: T.INTEGER, allowNull: true },
      error: { type: T.JSONB, allowNull: true },
      attempt: { type: T.INTEGER, allowNull: false, defaultValue: 0 },
      worker: { type: T.STRING(120), allowNull: true },
      heartbeat_at: { type: T.DATE, allowNull: true },
      cancel_requested: { type: T.BOOLEAN, allowNull: false, defaultValue: false },
      created_at: { type: T.DATE, allowNull: false, defaultValue: now },
      updated_at: { type: T.DATE, allowNull: false, defaultValue: now },
      finished_at: { type: T.DATE, allowNull: true },
    }, o);
    await qi.sequelize.query(
      "ALTER TABLE compile_jobs ADD CONSTRAINT compile_jobs_status CHECK (status IN ('queued', 'running', 'done', 'failed', 'cancelled'))", o);
    await qi.addIndex("compile_jobs", ["workspace_id", "created_at"], o);
    await qi.addIndex("compile_jobs", ["status", "heartbeat_at"], o);
    // The app role (lib/db/roles.mjs) uses the queue but may not change its schema.
    await qi.sequelize.query(`DO $$ BEGIN
      IF EXISTS (SELECT 1 FROM pg_roles WHERE rolname = 'fanbound_app') THEN
        GRANT USAGE ON SCHEMA pgboss TO fanbound_app;
        GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA pgboss TO fanbound_app;
        GRANT EXECUTE ON ALL FUNCTIONS IN SCHEMA pgboss TO fanbound_app;
      END IF;
    END $$`, o);
  });
}

/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function down({ context: qi }) {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.dropTable("compile_jobs", { transaction });
    await qi.sequelize.query("DROP SCHEMA IF EXISTS pgboss CASCADE", { transaction });
  });
}
