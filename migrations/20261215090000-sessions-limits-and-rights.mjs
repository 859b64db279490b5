// Ending sessions, shared rate limits, address verification, and what the
// app's database role may do:
// - users.session_version: every session's JWT carries the version it was
//   signed in with; sign-out, a password reset and "sign out everywhere" raise
//   it, and a JWT with an older version no longer authenticates;
// - email_tokens may carry 'verify' (the mail sent at sign-up);
// - rate_limits: the counters of rate-limiter-flexible's PostgreSQL store,
//   shared by every server process (the app role may not create tables);
// - revisions cannot be emptied with TRUNCATE either (a statement trigger),
//   and no role but the owner may UPDATE, DELETE or TRUNCATE them; the
//   migration history is the owner's alone.
/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function up({ context: qi }) {
  const { DataTypes: T } = await import("sequelize");
  await qi.sequelize.transaction(async (transaction) => {
    const o = { transaction };
    await qi.addColumn("users", "session_version", { type: T.INTEGER, allowNull: false, defaultValue: 0 }, o);

    await qi.sequelize.query("ALTER TABLE email_tokens DROP CONSTRAINT email_tokens_purpose", o);
    await qi.sequelize.query(
      "ALTER TABLE email_tokens ADD CONSTRAINT email_tokens_purpose CHECK (purpose IN ('signin', 'reset', 'verify'))", o);

    // The shape rate-limiter-flexible's RateLimiterPostgres expects (its own CREATE TABLE, made here once).
    await qi.sequelize.query(`
      CREATE TABLE rate_limits (
        key varchar(255) PRIMARY KEY,
        points integer NOT NULL DEFAULT 0,
        expire bigint
      )`, o);
    await qi.sequelize.query("CREATE INDEX rate_limits_expire ON rate_limits (expire)", o);

    await qi.sequelize.query(`
      CREATE FUNCTION refuse_truncate() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION '% is immutable: TRUNCATE refused', TG_TABLE_NAME
          USING ERRCODE = 'restrict_violation';
      END $$`, o);
    await qi.sequelize.query(`
      CREATE TRIGGER revisions_no_truncate BEFORE TRUNCATE ON revisions
      FOR EACH STATEMENT EXECUTE FUNCTION refuse_truncate()`, o);

    // Whoever holds these rights besides the owner (the app role, through the
    // default privileges, or PUBLIC) loses them.
    await qi.sequelize.query(`
      DO $$
      DECLARE r record;
      BEGIN
        FOR r IN SELECT DISTINCT grantee, table_name FROM information_schema.role_table_grants
                  WHERE table_schema = 'public' AND grantee <> current_user
                    AND ((table_name = 'revisions' AND privilege_type IN ('UPDATE', 'DELETE', 'TRUNCATE'))
                      OR table_name = 'SequelizeMeta')
        LOOP
          EXECUTE format('REVOKE %s ON TABLE %I FROM %s',
            CASE WHEN r.table_name = 'revisions' THEN 'UPDATE, DELETE, TRUNCATE' ELSE 'ALL' END,
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
    await qi.sequelize.query("DROP TRIGGER IF EXISTS revisions_no_truncate ON revisions", o);
    await qi.sequelize.query("DROP FUNCTION IF EXISTS refuse_truncate()", o);
    await qi.dropTable("rate_limits", o);
    await qi.sequelize.query("DELETE FROM email_tokens WHERE purpose = 'verify'", o);
    await qi.sequelize.query("ALTER TABLE email_tokens DROP CONSTRAINT email_tokens_purpose", o);
    await qi.sequelize.query(
      "ALTER TABLE email_tokens ADD CONSTRAINT email_tokens_purpose CHECK (purpose IN ('signin', 'reset'))", o);
    await qi.removeColumn("users", "session_version", o);
  });
}
