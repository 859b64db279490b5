// Access: one-time tokens sent by e-mail (sign-in links, password resets),
// invitations to a workspace, and personal API tokens. Only hashes of the
// secrets are stored.
/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function up({ context: qi }) {
  const { DataTypes: T } = await import("sequelize");
  const now = { type: T.DATE, allowNull: false, defaultValue: T.NOW };
  await qi.sequelize.transaction(async (transaction) => {
    const o = { transaction };
    await qi.createTable("email_tokens", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      purpose: { type: T.STRING(16), allowNull: false },
      email: { type: T.STRING(254), allowNull: false },
      token_hash: { type: T.STRING(64), allowNull: false, unique: true },
      expires_at: { type: T.DATE, allowNull: false },
      used_at: { type: T.DATE, allowNull: true },
      created_at: now,
    }, o);
    await qi.sequelize.query(
      "ALTER TABLE email_tokens ADD CONSTRAINT email_tokens_purpose CHECK (purpose IN ('signin', 'reset'))", o);
    await qi.addIndex("email_tokens", ["email", "purpose"], o);

    await qi.createTable("invitations", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      workspace_id: { type: T.UUID, allowNull: false, references: { model: "workspaces", key: "id" }, onDelete: "CASCADE" },
      email: { type: T.STRING(254), allowNull: false },
      role: { type: "membership_role", allowNull: false },
      token_hash: { type: T.STRING(64), allowNull: false, unique: true },
      invited_by: { type: T.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "CASCADE" },
      expires_at: { type: T.DATE, allowNull: false },
      accepted_at: { type: T.DATE, allowNull: true },
      revoked_at: { type: T.DATE, allowNull: true },
      created_at: now,
      updated_at: now,
    }, o);
    await qi.addIndex("invitations", ["workspace_id"], o);

    await qi.createTable("api_tokens", {
      id: { type: T.UUID, primaryKey: true, defaultValue: T.UUIDV4 },
      user_id: { type: T.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "CASCADE" },
      name: { type: T.STRING(80), allowNull: false },
      prefix: { type: T.STRING(16), allowNull: false },
      token_hash: { type: T.STRING(64), allowNull: false, unique: true },
      expires_at: { type: T.DATE, allowNull: false },
      last_used_at: { type: T.DATE, allowNull: true },
      revoked_at: { type: T.DATE, allowNull: true },
      created_at: now,
    }, o);
    await qi.addIndex("api_tokens", ["user_id"], o);
  });
}

/** @param {{ context: import("sequelize").QueryInterface }} p */
export async function down({ context: qi }) {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.dropTable("api_tokens", { transaction });
    await qi.dropTable("invitations", { transaction });
    await qi.dropTable("email_tokens", { transaction });
  });
}
