"use strict";
/** Labs (tenants), users, and memberships: one role per person per lab. */
module.exports = {
  async up(queryInterface, Sequelize) {
    const { DataTypes } = Sequelize;
    const uuid = { type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal("gen_random_uuid()") };
    const stamps = {
      created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
      updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
    };
    await queryInterface.sequelize.query(
      "CREATE TYPE lab_role AS ENUM ('chemist', 'safety_officer', 'stockkeeper', 'lab_admin', 'viewer')",
    );
    await queryInterface.createTable("labs", {
      id: uuid,
      slug: { type: DataTypes.STRING(64), allowNull: false, unique: true },
      name: { type: DataTypes.STRING(200), allowNull: false },
      settings: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      ...stamps,
    });
    await queryInterface.createTable("users", {
      id: uuid,
      email: { type: DataTypes.STRING(320), allowNull: false, unique: true },
      name: { type: DataTypes.STRING(200), allowNull: false },
      password_hash: { type: DataTypes.STRING(100), allowNull: true },
      password_changed_at: { type: DataTypes.DATE, allowNull: true },
      ...stamps,
    });
    await queryInterface.sequelize.query("ALTER TABLE users ADD CONSTRAINT users_email_lower CHECK (email = lower(email))");
    await queryInterface.createTable("memberships", {
      id: uuid,
      lab_id: { type: DataTypes.UUID, allowNull: false, references: { model: "labs", key: "id" }, onDelete: "CASCADE" },
      user_id: { type: DataTypes.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "CASCADE" },
      role: { type: "lab_role", allowNull: false },
      ...stamps,
    });
    await queryInterface.addIndex("memberships", ["lab_id", "user_id"], { unique: true, name: "memberships_lab_user" });
    await queryInterface.addIndex("memberships", ["user_id"], { name: "memberships_user" });
  },
  async down(queryInterface) {
    await queryInterface.dropTable("memberships");
    await queryInterface.dropTable("users");
    await queryInterface.dropTable("labs");
    await queryInterface.sequelize.query("DROP TYPE IF EXISTS lab_role");
  },
};
