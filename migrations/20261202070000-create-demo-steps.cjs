"use strict";
/**
 * The demo's steps (lib/demo): each step of the demo scenario that has been applied to this
 * database, once, with the ids of what it created under names later steps look up
 * (`records`). The bootstrap runs the steps not listed here, in order, after the seeders.
 */
module.exports = {
  async up(queryInterface, Sequelize) {
    const { DataTypes } = Sequelize;
    await queryInterface.createTable("demo_steps", {
      name: { type: DataTypes.STRING(120), primaryKey: true },
      title: { type: DataTypes.STRING(300), allowNull: false },
      records: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      applied_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
    });
    await queryInterface.sequelize.query("ALTER TABLE demo_steps ADD CONSTRAINT demo_steps_name_form CHECK (name ~ '^[0-9]{2,}-[a-z0-9-]+$')");
  },
  async down(queryInterface) {
    await queryInterface.dropTable("demo_steps");
  },
};
