"use strict";
/** The append-only audit log: who did what, when, with the record before and after. */
module.exports = {
  async up(queryInterface, Sequelize) {
    const { DataTypes } = Sequelize;
    await queryInterface.createTable("audit_log", {
      id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
      lab_id: { type: DataTypes.UUID, allowNull: true, references: { model: "labs", key: "id" }, onDelete: "RESTRICT" },
      actor_user_id: { type: DataTypes.UUID, allowNull: true, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
      action: { type: DataTypes.STRING(100), allowNull: false },
      entity_type: { type: DataTypes.STRING(60), allowNull: false },
      entity_id: { type: DataTypes.STRING(100), allowNull: true },
      before: { type: DataTypes.JSONB, allowNull: true },
      after: { type: DataTypes.JSONB, allowNull: true },
      created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
    });
    await queryInterface.addIndex("audit_log", ["lab_id", "created_at"], { name: "audit_log_lab_time" });
    // Append-only: the database itself refuses to change or delete an entry. The function is
    // generic (it names the table), so every append-only table uses it with two triggers.
    await queryInterface.sequelize.query(`
      CREATE FUNCTION refuse_append_only_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION '% is append-only (% refused)', TG_TABLE_NAME, TG_OP;
      END $$;
      CREATE TRIGGER audit_log_no_update BEFORE UPDATE OR DELETE ON audit_log
        FOR EACH ROW EXECUTE FUNCTION refuse_append_only_change();
      CREATE TRIGGER audit_log_no_truncate BEFORE TRUNCATE ON audit_log
        FOR EACH STATEMENT EXECUTE FUNCTION refuse_append_only_change();
    `);
  },
  async down(queryInterface) {
    await queryInterface.dropTable("audit_log");
    await queryInterface.sequelize.query("DROP FUNCTION IF EXISTS refuse_append_only_change()");
  },
};
