// Reviews of revisions: who was asked to review which revision, the thread of
// comments (general or on a line of that revision's source), and the decisions.
// Decisions are history: the database refuses to change, delete or truncate
// them, as it does for revisions, and the app's role has no right to try. A
// review's state moves only out of "open", and only together with the
// decision that says so.
/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function up({ context: qi }) {
  const { DataTypes: T } = await import("sequelize");
  const now = { type: T.DATE, allowNull: false, defaultValue: T.NOW };
  const ref = (model, onDelete = "RESTRICT") => ({ type: T.UUID, allowNull: false, references: { model, key: "id" }, onDelete });
  await qi.sequelize.transaction(async (transaction) => {
    const o = { transaction };
    await qi.sequelize.query(
      "CREATE TYPE review_state AS ENUM ('open', 'approved', 'changes-asked', 'withdrawn', 'superseded')", o);
    await qi.sequelize.query(
      "CREATE TYPE review_verdict AS ENUM ('approved', 'changes-asked', 'withdrawn', 'superseded')", o);

    await qi.createTable("reviews", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      design_id: ref("designs"),
      revision_id: ref("revisions"),
      requested_by: ref("users"),
      message: { type: T.TEXT, allowNull: false, defaultValue: "" },
      state: { type: "review_state", allowNull: false, defaultValue: "open" },
      created_at: now,
      updated_at: now,
    }, o);
    await qi.addIndex("reviews", ["design_id", "created_at"], o);
    await qi.addIndex("reviews", ["revision_id"], o);
    await qi.addIndex("reviews", ["requested_by"], o);
    // One open review per revision: asking again adds to it or waits for its decision.
    await qi.sequelize.query("CREATE UNIQUE INDEX reviews_one_open_per_revision ON reviews (revision_id) WHERE state = 'open'", o);

    await qi.createTable("review_reviewers", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      review_id: ref("reviews"),
      user_id: ref("users"),
      created_at: now,
    }, o);
    await qi.addIndex("review_reviewers", ["review_id", "user_id"], { unique: true, transaction });
    await qi.addIndex("review_reviewers", ["user_id"], o);

    await qi.createTable("review_comments", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      review_id: ref("reviews"),
      author_id: ref("users"),
      body: { type: T.TEXT, allowNull: false },
      // A line of the reviewed revision's source, 1-based; null for a general comment.
      line: { type: T.INTEGER, allowNull: true },
      created_at: now,
    }, o);
    await qi.addIndex("review_comments", ["review_id", "created_at"], o);
    await qi.sequelize.query("ALTER TABLE review_comments ADD CONSTRAINT review_comments_line_positive CHECK (line IS NULL OR line > 0)", o);

    await qi.createTable("review_decisions", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      review_id: ref("reviews"),
      // Which revision the decision was on, kept beside the review for the history's sake.
      revision_id: ref("revisions"),
      user_id: ref("users"),
      verdict: { type: "review_verdict", allowNull: false },
      note: { type: T.TEXT, allowNull: false, defaultValue: "" },
      created_at: now,
    }, o);
    await qi.addIndex("review_decisions", ["review_id", "created_at"], o);
    await qi.addIndex("review_decisions", ["created_at"], o);

    // History, comments and the list of those asked are records: no UPDATE, no DELETE.
    await qi.sequelize.query(`
      CREATE FUNCTION review_records_are_history() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION '% are history: % refused on %', TG_TABLE_NAME, TG_OP, OLD.id
          USING ERRCODE = 'restrict_violation';
      END $$`, o);
    for (const table of ["review_decisions", "review_comments", "review_reviewers"]) {
      await qi.sequelize.query(`
        CREATE TRIGGER ${table}_history BEFORE UPDATE OR DELETE ON ${table}
        FOR EACH ROW EXECUTE FUNCTION review_records_are_history()`, o);
    }

    // A review is never deleted; only its state changes, once, out of "open", with its decision on record.
    await qi.sequelize.query(`
      CREATE FUNCTION reviews_guard() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF TG_OP = 'DELETE' THEN
          RAISE EXCEPTION 'reviews are history: DELETE refused on review %', OLD.id USING ERRCODE = 'restrict_violation';
        END IF;
        IF NEW.id <> OLD.id OR NEW.design_id <> OLD.design_id OR NEW.revision_id <> OLD.revision_id
           OR NEW.requested_by <> OLD.requested_by OR NEW.message <> OLD.message OR NEW.created_at <> OLD.created_at THEN
          RAISE EXCEPTION 'reviews are history: only the state of review % may change', OLD.id USING ERRCODE = 'restrict_violation';
        END IF;
        IF NEW.state <> OLD.state THEN
          IF OLD.state <> 'open' THEN
            RAISE EXCEPTION 'review % is % already: a closed review does not reopen', OLD.id, OLD.state USING ERRCODE = 'restrict_violation';
          END IF;
          IF NOT EXISTS (SELECT 1 FROM review_decisions d WHERE d.review_id = NEW.id AND d.verdict::text = NEW.state::text) THEN
            RAISE EXCEPTION 'review % cannot become % without a decision saying so', OLD.id, NEW.state USING ERRCODE = 'restrict_violation';
          END IF;
        END IF;
        RETURN NEW;
      END $$`, o);
    await qi.sequelize.query(`
      CREATE TRIGGER reviews_guarded BEFORE UPDATE OR DELETE ON reviews
      FOR EACH ROW EXECUTE FUNCTION reviews_guard()`, o);
    for (const table of ["reviews", "review_reviewers", "review_comments", "review_decisions"]) {
      await qi.sequelize.query(`
        CREATE TRIGGER ${table}_no_truncate BEFORE TRUNCATE ON ${table}
        FOR EACH STATEMENT EXECUTE FUNCTION refuse_truncate()`, o);
    }

    // Beyond the triggers, no role but the owner may change the history: the
    // app role (given every right on new tables by the default privileges)
    // keeps INSERT and SELECT, and UPDATE on reviews for the state.
    await qi.sequelize.query(`
      DO $$
      DECLARE r record;
      BEGIN
        FOR r IN SELECT DISTINCT grantee, table_name FROM information_schema.role_table_grants
                  WHERE table_schema = 'public' AND grantee <> current_user
                    AND table_name IN ('reviews', 'review_reviewers', 'review_comments', 'review_decisions')
        LOOP
          EXECUTE format('REVOKE %s ON TABLE %I FROM %s',
            CASE WHEN r.table_name = 'reviews' THEN 'DELETE, TRUNCATE' ELSE 'UPDATE, DELETE, TRUNCATE' END,
            r.table_name,
            CASE WHEN r.grantee = 'PUBLIC' THEN 'PUBLIC' ELSE quote_ident(r.grantee) END);
        END LOOP;
      END $$`, o);
  });
}

/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function down({ context: qi }) {
  await qi.sequelize.transaction(async (transaction) => {
    const o = { transaction };
    await qi.dropTable("review_decisions", o);
    await qi.dropTable("review_comments", o);
    await qi.dropTable("review_reviewers", o);
    await qi.dropTable("reviews", o);
    await qi.sequelize.query("DROP FUNCTION IF EXISTS reviews_guard()", o);
    await qi.sequelize.query("DROP FUNCTION IF EXISTS review_records_are_history()", o);
    await qi.sequelize.query("DROP TYPE IF EXISTS review_verdict", o);
    await qi.sequelize.query("DROP TYPE IF EXISTS review_state", o);
  });
}
