// Results of compiles, keyed by a content hash of what determines them (the
// pipeline's build, the source, the settings and the family's figures) within
// one scope (a workspace, or one user for compiles outside a workspace), so
// the same compile is never run twice there. Rows are a cache: they may be
// dropped at any time, and old ones are.
/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function up({ context: qi }) {
  const { DataTypes: T } = await import("sequelize");
  const now = qi.sequelize.literal("now()");
  await qi.sequelize.transaction(async (transaction) => {
    await qi.createTable("compile_results", {
      key: { type: T.STRING(64), primaryKey: true },
      scope: { type: T.STRING(80), allowNull: false },
      result: { type: T.JSONB, allowNull: false },
      bytes: { type: T.INTEGER, allowNull: false },
      created_at: { type: T.DATE, allowNull: false, defaultValue: now },
      used_at: { type: T.DATE, allowNull: false, defaultValue: now },
    }, { transaction });
    await qi.addIndex("compile_results", ["used_at"], { transaction });
  });
}

/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function down({ context: qi }) {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.dropTable("compile_results", { transaction });
  });
}
