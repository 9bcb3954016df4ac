"use strict";
/** Sign-in attempts (for the lockout rule) and invitations to a lab. */
module.exports = {
  async up(queryInterface, Sequelize) {
    const { DataTypes } = Sequelize;
    await queryInterface.createTable("sign_in_attempts", {
      id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
      email: { type: DataTypes.STRING(320), allowNull: false },
      succeeded: { type: DataTypes.BOOLEAN, allowNull: false },
      created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
    });
    await queryInterface.addIndex("sign_in_attempts", ["email", "created_at"], { name: "sign_in_attempts_email_time" });
    await queryInterface.createTable("invitations", {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal("gen_random_uuid()") },
      lab_id: { type: DataTypes.UUID, allowNull: false, references: { model: "labs", key: "id" }, onDelete: "CASCADE" },
      email: { type: DataTypes.STRING(320), allowNull: false },
      role: { type: "lab_role", allowNull: false },
      token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
      invited_by: { type: DataTypes.UUID, allowNull: false, references: { model: "users", key: "id" } },
      expires_at: { type: DataTypes.DATE, allowNull: false },
      accepted_at: { type: DataTypes.DATE, allowNull: true },
      created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
      updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
    });
  },
  async down(queryInterface) {
    await queryInterface.dropTable("invitations");
    await queryInterface.dropTable("sign_in_attempts");
  },
};
