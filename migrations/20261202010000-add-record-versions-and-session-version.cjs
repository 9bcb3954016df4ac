"use strict";
/**
 * Optimistic locking and session invalidation.
 *
 * chemicals.version and containers.version count the changes of a record (Sequelize's
 * `version: true` raises it on every save). An edit sends the version it read; a stale
 * one is refused as a conflict naming `version`, so two people editing the same record
 * never overwrite each other unseen.
 *
 * users.session_version is carried in every session token; changing the password raises
 * it, so every other session of that user stops working at its next request.
 */
module.exports = {
  async up(queryInterface, Sequelize) {
    const { DataTypes } = Sequelize;
    const version = { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 };
    await queryInterface.addColumn("chemicals", "version", version);
    await queryInterface.addColumn("containers", "version", version);
    await queryInterface.addColumn("users", "session_version", version);
  },
  async down(queryInterface) {
    await queryInterface.removeColumn("users", "session_version");
    await queryInterface.removeColumn("containers", "version");
    await queryInterface.removeColumn("chemicals", "version");
  },
};
