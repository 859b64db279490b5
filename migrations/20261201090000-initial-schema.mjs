// First schema: people, workspaces and their members, logic families,
// designs and their immutable revisions.
/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function up({ context: qi }) {
  const { DataTypes: T } = await import("sequelize");
  const now = { type: T.DATE, allowNull: false, defaultValue: T.NOW };
  await qi.sequelize.transaction(async (transaction) => {
    const o = { transaction };
    await qi.createTable("users", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      email: { type: T.STRING(254), allowNull: false },
      name: { type: T.STRING(120), allowNull: false },
      password_hash: { type: T.STRING(200), allowNull: true },
      email_verified_at: { type: T.DATE, allowNull: true },
      created_at: now,
      updated_at: now,
    }, o);
    await qi.sequelize.query('CREATE UNIQUE INDEX users_email_lower ON users (lower(email))', o);

    await qi.createTable("workspaces", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      name: { type: T.STRING(120), allowNull: false },
      slug: { type: T.STRING(64), allowNull: false, unique: true },
      settings: { type: T.JSONB, allowNull: false, defaultValue: {} },
      created_at: now,
      updated_at: now,
    }, o);

    await qi.sequelize.query(
      "CREATE TYPE membership_role AS ENUM ('owner', 'designer', 'reviewer', 'viewer')", o);
    await qi.createTable("memberships", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      workspace_id: { type: T.UUID, allowNull: false, references: { model: "workspaces", key: "id" }, onDelete: "CASCADE" },
      user_id: { type: T.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "CASCADE" },
      role: { type: "membership_role", allowNull: false },
      created_at: now,
      updated_at: now,
    }, o);
    await qi.addIndex("memberships", ["workspace_id", "user_id"], { unique: true, transaction });
    await qi.addIndex("memberships", ["user_id"], o);

    // Built-in families have no workspace; a workspace's own families carry its id.
    await qi.createTable("logic_families", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      workspace_id: { type: T.UUID, allowNull: true, references: { model: "workspaces", key: "id" }, onDelete: "CASCADE" },
      key: { type: T.STRING(64), allowNull: false },
      name: { type: T.STRING(120), allowNull: false },
      builtin: { type: T.BOOLEAN, allowNull: false, defaultValue: false },
      data: { type: T.JSONB, allowNull: false },
      created_at: now,
      updated_at: now,
    }, o);
    await qi.sequelize.query(
      "CREATE UNIQUE INDEX logic_families_builtin_key ON logic_families (key) WHERE workspace_id IS NULL", o);
    await qi.sequelize.query(
      "CREATE UNIQUE INDEX logic_families_workspace_key ON logic_families (workspace_id, key) WHERE workspace_id IS NOT NULL", o);

    await qi.createTable("designs", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      workspace_id: { type: T.UUID, allowNull: false, references: { model: "workspaces", key: "id" }, onDelete: "RESTRICT" },
      name: { type: T.STRING(120), allowNull: false },
      description: { type: T.TEXT, allowNull: false, defaultValue: "" },
      family_id: { type: T.UUID, allowNull: false, references: { model: "logic_families", key: "id" }, onDelete: "RESTRICT" },
      settings: { type: T.JSONB, allowNull: false, defaultValue: {} },
      draft_source: { type: T.TEXT, allowNull: false, defaultValue: "" },
      created_by: { type: T.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
      archived_at: { type: T.DATE, allowNull: true },
      created_at: now,
      updated_at: now,
    }, o);
    await qi.addIndex("designs", ["workspace_id", "name"], { unique: true, transaction });
    await qi.addIndex("designs", ["workspace_id", "updated_at"], o);

    await qi.createTable("revisions", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      design_id: { type: T.UUID, allowNull: false, references: { model: "designs", key: "id" }, onDelete: "RESTRICT" },
      number: { type: T.INTEGER, allowNull: false },
      source: { type: T.TEXT, allowNull: false },
      family_id: { type: T.UUID, allowNull: false, references: { model: "logic_families", key: "id" }, onDelete: "RESTRICT" },
      family_snapshot: { type: T.JSONB, allowNull: false },
      settings: { type: T.JSONB, allowNull: false },
      stats: { type: T.JSONB, allowNull: false },
      author_id: { type: T.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
      message: { type: T.TEXT, allowNull: false },
      created_at: now,
    }, o);
    await qi.addIndex("revisions", ["design_id", "number"], { unique: true, transaction });
    await qi.addIndex("revisions", ["author_id"], o);
    await qi.sequelize.query(`ALTER TABLE revisions ADD CONSTRAINT revisions_number_positive CHECK (number > 0)`, o);

    // A revision is a record of what was signed off: the database itself refuses to change one.
    await qi.sequelize.query(`
      CREATE FUNCTION revisions_are_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'revisions are immutable: % refused on revision %', TG_OP, OLD.id
          USING ERRCODE = 'restrict_violation';
      END $$`, o);
    await qi.sequelize.query(`
      CREATE TRIGGER revisions_immutable BEFORE UPDATE OR DELETE ON revisions
      FOR EACH ROW EXECUTE FUNCTION revisions_are_immutable()`, o);
  });
}

/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function down({ context: qi }) {
  await qi.sequelize.transaction(async (transaction) => {
    const o = { transaction };
    await qi.dropTable("revisions", o);
    await qi.sequelize.query("DROP FUNCTION IF EXISTS revisions_are_immutable()", o);
    await qi.dropTable("designs", o);
    await qi.dropTable("logic_families", o);
    await qi.dropTable("memberships", o);
    await qi.sequelize.query("DROP TYPE IF EXISTS membership_role", o);
    await qi.dropTable("workspaces", o);
    await qi.dropTable("users", o);
  });
}
