// Workspace administration: a stored, append-only activity list of who
// changed which membership, invitation, family, design or library and when,
// and families an owner can archive (kept for the revisions that used them,
// no longer offered for new designs).
/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function up({ context: qi }) {
  const { DataTypes: T } = await import("sequelize");
  await qi.sequelize.transaction(async (transaction) => {
    const o = { transaction };
    await qi.addColumn("logic_families", "archived_at", { type: T.DATE, allowNull: true }, o);

    await qi.createTable("activity", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      // RESTRICT, not CASCADE: a cascade would delete rows this table refuses to lose.
      workspace_id: { type: T.UUID, allowNull: false, references: { model: "workspaces", key: "id" }, onDelete: "RESTRICT" },
      actor_id: { type: T.UUID, allowNull: true, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
      action: { type: T.STRING(40), allowNull: false },
      subject_kind: { type: T.STRING(16), allowNull: false },
      subject_id: { type: T.STRING(64), allowNull: true },
      subject_label: { type: T.STRING(254), allowNull: false, defaultValue: "" },
      details: { type: T.JSONB, allowNull: false, defaultValue: {} },
      created_at: { type: T.DATE, allowNull: false, defaultValue: T.NOW },
    }, o);
    await qi.sequelize.query(
      "ALTER TABLE activity ADD CONSTRAINT activity_subject_kind CHECK (subject_kind IN ('membership', 'invitation', 'family', 'design', 'library'))", o);
    await qi.sequelize.query("CREATE INDEX activity_workspace_time ON activity (workspace_id, created_at DESC, id DESC)", o);

    // The list is a record of what happened: like revisions, the database itself refuses to change or remove an entry.
    await qi.sequelize.query(`
      CREATE FUNCTION activity_is_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'activity is append-only: % refused', TG_OP
          USING ERRCODE = 'restrict_violation';
      END $$`, o);
    await qi.sequelize.query(`
      CREATE TRIGGER activity_append_only BEFORE UPDATE OR DELETE ON activity
      FOR EACH ROW EXECUTE FUNCTION activity_is_append_only()`, o);
    await qi.sequelize.query(`
      CREATE TRIGGER activity_no_truncate BEFORE TRUNCATE ON activity
      FOR EACH STATEMENT EXECUTE FUNCTION activity_is_append_only()`, o);

    // As for revisions: no role but the owner may UPDATE, DELETE or TRUNCATE the list (the app role keeps SELECT and INSERT).
    await qi.sequelize.query(`
      DO $$
      DECLARE r record;
      BEGIN
        FOR r IN SELECT DISTINCT grantee FROM information_schema.role_table_grants
                  WHERE table_schema = 'public' AND table_name = 'activity' AND grantee <> current_user
                    AND privilege_type IN ('UPDATE', 'DELETE', 'TRUNCATE')
        LOOP
          EXECUTE format('REVOKE UPDATE, DELETE, TRUNCATE ON TABLE activity FROM %s',
            CASE WHEN r.grantee = 'PUBLIC' THEN 'PUBLIC' ELSE quote_ident(r.grantee) END);
        END LOOP;
      END $$`, o);
  });
}

/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function down({ context: qi }) {
  await qi.sequelize.transaction(async (transaction) => {
    const o = { transaction };
    await qi.dropTable("activity", o);
    await qi.sequelize.query("DROP FUNCTION IF EXISTS activity_is_append_only()", o);
    await qi.removeColumn("logic_families", "archived_at", o);
  });
}
