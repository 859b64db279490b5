// A compile job reports, beside its best cost and proven lower bound, how
// many prime implicants the minimizer has found (null until known, and for
// runs on the heuristic alone, which lists none).
/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function up({ context: qi }) {
  const { DataTypes: T } = await import("sequelize");
  await qi.sequelize.transaction(async (transaction) => {
    await qi.addColumn("compile_jobs", "primes", { type: T.INTEGER, allowNull: true }, { transaction });
  });
}

/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function down({ context: qi }) {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.removeColumn("compile_jobs", "primes", { transaction });
  });
}
