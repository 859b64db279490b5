// Shared block libraries. A workspace has named libraries; a library holds
// blocks; publishing a block makes a library revision that keeps its source,
// the figures it compiled to under the family chosen, and its verification.
// Library revisions are records like design revisions: the database refuses
// to change or delete one, as it refuses the approvals that let a revision
// count when the workspace asks for a review first, and the list of library
// revisions a saved design revision used. Shares (read-only use by another
// workspace) can be taken back, so they may be deleted.
/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function up({ context: qi }) {
  const { DataTypes: T } = await import("sequelize");
  const now = { type: T.DATE, allowNull: false, defaultValue: T.NOW };
  const ref = (model, onDelete = "RESTRICT") => ({ type: T.UUID, allowNull: false, references: { model, key: "id" }, onDelete });
  await qi.sequelize.transaction(async (transaction) => {
    const o = { transaction };
    await qi.createTable("libraries", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      workspace_id: ref("workspaces"),
      // What use lines write: "key" in the workspace, "slug/key" from a workspace it is shared with.
      key: { type: T.STRING(64), allowNull: false },
      name: { type: T.STRING(120), allowNull: false },
      description: { type: T.TEXT, allowNull: false, defaultValue: "" },
      created_by: ref("users"),
      created_at: now,
      updated_at: now,
    }, o);
    await qi.addIndex("libraries", ["workspace_id", "key"], { unique: true, transaction });

    await qi.createTable("library_blocks", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      library_id: ref("libraries"),
      name: { type: T.STRING(64), allowNull: false },
      created_at: now,
    }, o);
    await qi.addIndex("library_blocks", ["library_id", "name"], { unique: true, transaction });

    await qi.createTable("library_revisions", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      block_id: ref("library_blocks"),
      number: { type: T.INTEGER, allowNull: false },
      source: { type: T.TEXT, allowNull: false },
      message: { type: T.TEXT, allowNull: false },
      // The block's ports as callers see them: its inputs and outputs in declared order.
      inputs: { type: T.JSONB, allowNull: false },
      outputs: { type: T.JSONB, allowNull: false },
      family_id: ref("logic_families"),
      family_snapshot: { type: T.JSONB, allowNull: false },
      settings: { type: T.JSONB, allowNull: false },
      stats: { type: T.JSONB, allowNull: false },
      verification: { type: T.JSONB, allowNull: true },
      author_id: ref("users"),
      // Published while the workspace asked for an approved review first: it counts once approved.
      needs_review: { type: T.BOOLEAN, allowNull: false, defaultValue: false },
      created_at: now,
    }, o);
    await qi.addIndex("library_revisions", ["block_id", "number"], { unique: true, transaction });
    await qi.sequelize.query("ALTER TABLE library_revisions ADD CONSTRAINT library_revisions_number_positive CHECK (number > 0)", o);

    await qi.createTable("library_approvals", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      library_revision_id: ref("library_revisions"),
      // The review whose approval this records; reviews live elsewhere, so no foreign key here.
      review_id: { type: T.UUID, allowNull: true },
      approved_by: ref("users"),
      note: { type: T.TEXT, allowNull: false, defaultValue: "" },
      created_at: now,
    }, o);
    await qi.addIndex("library_approvals", ["library_revision_id"], { unique: true, transaction });

    await qi.createTable("library_shares", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      library_id: ref("libraries", "CASCADE"),
      workspace_id: ref("workspaces", "CASCADE"),
      created_by: ref("users"),
      created_at: now,
    }, o);
    await qi.addIndex("library_shares", ["library_id", "workspace_id"], { unique: true, transaction });
    await qi.addIndex("library_shares", ["workspace_id"], o);

    await qi.createTable("revision_libraries", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      revision_id: ref("revisions"),
      library_revision_id: ref("library_revisions"),
      // The use line as written: the library's name and the block's.
      library: { type: T.STRING(200), allowNull: false },
      block: { type: T.STRING(64), allowNull: false },
      created_at: now,
    }, o);
    await qi.addIndex("revision_libraries", ["revision_id", "library_revision_id"], { unique: true, transaction });
    await qi.addIndex("revision_libraries", ["library_revision_id"], o);

    await qi.sequelize.query(`
      CREATE FUNCTION library_records_are_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION '% are records: % refused on %', TG_TABLE_NAME, TG_OP, OLD.id
          USING ERRCODE = 'restrict_violation';
      END $$`, o);
    for (const table of ["library_revisions", "library_approvals", "revision_libraries"]) {
      await qi.sequelize.query(`
        CREATE TRIGGER ${table}_immutable BEFORE UPDATE OR DELETE ON ${table}
        FOR EACH ROW EXECUTE FUNCTION library_records_are_immutable()`, o);
      await qi.sequelize.query(`
        CREATE TRIGGER ${table}_no_truncate BEFORE TRUNCATE ON ${table}
        FOR EACH STATEMENT EXECUTE FUNCTION refuse_truncate()`, o);
    }
    // The app role got every right on the new tables by the owner's default
    // privileges; on the records it keeps SELECT and INSERT only.
    await qi.sequelize.query(`
      DO $$
      DECLARE r record;
      BEGIN
        FOR r IN SELECT DISTINCT grantee, table_name FROM information_schema.role_table_grants
                  WHERE table_schema = 'public' AND grantee <> current_user
                    AND table_name IN ('library_revisions', 'library_approvals', 'revision_libraries')
                    AND privilege_type IN ('UPDATE', 'DELETE', 'TRUNCATE')
        LOOP
          EXECUTE format('REVOKE UPDATE, DELETE, TRUNCATE ON TABLE %I FROM %s', r.table_name,
            CASE WHEN r.grantee = 'PUBLIC' THEN 'PUBLIC' ELSE quote_ident(r.grantee) END);
        END LOOP;
      END $$`, o);
  });
}

/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function down({ context: qi }) {
  await qi.sequelize.transaction(async (transaction) => {
    const o = { transaction };
    for (const table of ["revision_libraries", "library_shares", "library_approvals", "library_revisions", "library_blocks", "libraries"]) {
      await qi.dropTable(table, o);
    }
    await qi.sequelize.query("DROP FUNCTION IF EXISTS library_records_are_immutable()", o);
  });
}
