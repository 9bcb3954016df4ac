/**
 * Every Sequelize model, initialised on one connection with its associations.
 * Schema changes are made only by migrations (migrations/*.cjs); these classes describe them.
 */
import type { Sequelize } from "sequelize";
import { Lab } from "./lab";
import { User } from "./user";
import { Membership } from "./membership";
import { AuditEntry } from "./audit-entry";
import { SignInAttempt } from "./sign-in-attempt";
import { Invitation } from "./invitation";

export { Lab, User, Membership, AuditEntry, SignInAttempt, Invitation };

export function initModels(sequelize: Sequelize): void {
  Lab.initModel(sequelize);
  User.initModel(sequelize);
  Membership.initModel(sequelize);
  AuditEntry.initModel(sequelize);
  SignInAttempt.initModel(sequelize);
  Invitation.initModel(sequelize);

  Membership.belongsTo(Lab, { foreignKey: "labId", as: "lab" });
  Membership.belongsTo(User, { foreignKey: "userId", as: "user" });
  Lab.hasMany(Membership, { foreignKey: "labId", as: "memberships" });
  User.hasMany(Membership, { foreignKey: "userId", as: "memberships" });
  Invitation.belongsTo(Lab, { foreignKey: "labId", as: "lab" });
}
