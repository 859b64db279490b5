// A revision keeps the netlist it was saved with, so every later download of
// its files is the netlist that was reviewed, whatever the pipeline does since.
/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function up({ context: qi }) {
  const { DataTypes: T } = await import("sequelize");
  await qi.sequelize.transaction(async (transaction) => {
    await qi.addColumn("revisions", "netlist", { type: T.JSONB, allowNull: true }, { transaction });
  });
}

/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function down({ context: qi }) {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.removeColumn("revisions", "netlist", { transaction });
  });
}
