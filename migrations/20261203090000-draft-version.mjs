// A design's draft carries a version number, bumped by every write, so two
// tabs or two people writing the same draft cannot silently overwrite each
// other: a write names the version it was based on and is refused (409) when
// the draft has moved on since. Who wrote it last, and when, is kept beside it.
/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function up({ context: qi }) {
  const { DataTypes: T } = await import("sequelize");
  await qi.sequelize.transaction(async (transaction) => {
    const o = { transaction };
    await qi.addColumn("designs", "draft_version", { type: T.INTEGER, allowNull: false, defaultValue: 1 }, o);
    await qi.addColumn("designs", "draft_updated_at", { type: T.DATE, allowNull: true }, o);
    await qi.addColumn("designs", "draft_updated_by", {
      type: T.UUID, allowNull: true, references: { model: "users", key: "id" }, onDelete: "SET NULL",
    }, o);
  });
}

/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function down({ context: qi }) {
  await qi.sequelize.transaction(async (transaction) => {
    for (const c of ["draft_updated_by", "draft_updated_at", "draft_version"]) await qi.removeColumn("designs", c, { transaction });
  });
}
