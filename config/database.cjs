// sequelize-cli configuration: every environment reads DATABASE_URL (set by npm start / npm test,
// or by you; see .env.example). Seeders are recorded so a second run does not duplicate data.
const url = process.env.DATABASE_URL;
if (!url) {
  throw new Error("DATABASE_URL is not set. Run `npm start` (it sets up a local database) or export DATABASE_URL.");
}
const common = {
  url,
  dialect: "postgres",
  logging: false,
  seederStorage: "sequelize",
  seederStorageTableName: "SequelizeSeeds",
  migrationStorageTableName: "SequelizeMeta",
};
module.exports = { development: common, test: common, production: common };
