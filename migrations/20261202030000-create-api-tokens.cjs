"use strict";
/**
 * Lab API tokens for scripts and pipelines (Authorization: Bearer trl_…), and the token as
 * an actor of the audit log. Only a SHA-256 of each secret is stored; `selector` is the
 * secret's first characters, looked up by index and shown so people can recognise a token.
 */
module.exports = {
  async up(queryInterface, Sequelize) {
    const { DataTypes } = Sequelize;
    await queryInterface.createTable("api_tokens", {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal("gen_random_uuid()") },
      lab_id: { type: DataTypes.UUID, allowNull: false, references: { model: "labs", key: "id" }, onDelete: "RESTRICT" },
      name: { type: DataTypes.STRING(80), allowNull: false },
      role: { type: "lab_role", allowNull: false },
      selector: { type: DataTypes.STRING(16), allowNull: false, unique: true },
      secret_hash: { type: DataTypes.STRING(64), allowNull: false },
      created_by: { type: DataTypes.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
      expires_at: { type: DataTypes.DATE, allowNull: false },
      revoked_at: { type: DataTypes.DATE, allowNull: true },
      revoked_by: { type: DataTypes.UUID, allowNull: true, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
      last_used_at: { type: DataTypes.DATE, allowNull: true },
      created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
      updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
    });
    const q = (sql) => queryInterface.sequelize.query(sql);
    await q("ALTER TABLE api_tokens ADD CONSTRAINT api_tokens_name_not_blank CHECK (length(btrim(name)) > 0)");
    await q("ALTER TABLE api_tokens ADD CONSTRAINT api_tokens_hash_hex CHECK (secret_hash ~ '^[0-9a-f]{64}$')");
    // One live token per name in a lab, so the audit log's token names are unambiguous.
    await q("CREATE UNIQUE INDEX api_tokens_lab_live_name ON api_tokens (lab_id, lower(name)) WHERE revoked_at IS NULL");
    await queryInterface.addIndex("api_tokens", ["lab_id", "created_at"], { name: "api_tokens_lab_time" });

    await queryInterface.addColumn("audit_log", "actor_token_id", {
      type: DataTypes.UUID,
      allowNull: true,
      references: { model: "api_tokens", key: "id" },
      onDelete: "RESTRICT",
    });
    // The audit log's filters (entity, person, token) page newest first within a lab.
    await queryInterface.addIndex("audit_log", ["lab_id", "entity_type", "id"], { name: "audit_log_lab_entity" });
    await queryInterface.addIndex("audit_log", ["lab_id", "actor_user_id", "id"], { name: "audit_log_lab_actor" });
    await queryInterface.addIndex("audit_log", ["lab_id", "actor_token_id", "id"], { name: "audit_log_lab_token", where: { actor_token_id: { [Sequelize.Op.ne]: null } } });
  },
  async down(queryInterface) {
    await queryInterface.removeIndex("audit_log", "audit_log_lab_token");
    await queryInterface.removeIndex("audit_log", "audit_log_lab_actor");
    await queryInterface.removeIndex("audit_log", "audit_log_lab_entity");
    await queryInterface.removeColumn("audit_log", "actor_token_id");
    await queryInterface.dropTable("api_tokens");
  },
};
