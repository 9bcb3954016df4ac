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
import { Location } from "./location";
import { Chemical } from "./chemical";
import { SafetyDataSheet } from "./safety-data-sheet";
import { Container } from "./container";
import { Reservation } from "./reservation";
import { StockLedgerEntry } from "./stock-ledger-entry";
import { ApiToken } from "./api-token";
import { Study } from "./study";
import { Plan } from "./plan";
import { PlanSignature } from "./plan-signature";
import { DemoStep } from "./demo-step";
import { PlanResult } from "./plan-result";
import { AnalysisExclusion } from "./analysis-exclusion";

export { Lab, User, Membership, AuditEntry, SignInAttempt, Invitation };
export { Location, Chemical, SafetyDataSheet, Container, Reservation, StockLedgerEntry };
export { ApiToken };
export { Study, Plan, PlanSignature };
export { DemoStep };
export { PlanResult, AnalysisExclusion };

export function initModels(sequelize: Sequelize): void {
  Lab.initModel(sequelize);
  User.initModel(sequelize);
  Membership.initModel(sequelize);
  AuditEntry.initModel(sequelize);
  SignInAttempt.initModel(sequelize);
  Invitation.initModel(sequelize);
  Location.initModel(sequelize);
  Chemical.initModel(sequelize);
  SafetyDataSheet.initModel(sequelize);
  Container.initModel(sequelize);
  Reservation.initModel(sequelize);
  StockLedgerEntry.initModel(sequelize);
  ApiToken.initModel(sequelize);
  Study.initModel(sequelize);
  Plan.initModel(sequelize);
  PlanSignature.initModel(sequelize);
  DemoStep.initModel(sequelize);
  PlanResult.initModel(sequelize);
  AnalysisExclusion.initModel(sequelize);

  Membership.belongsTo(Lab, { foreignKey: "labId", as: "lab" });
  Membership.belongsTo(User, { foreignKey: "userId", as: "user" });
  Lab.hasMany(Membership, { foreignKey: "labId", as: "memberships" });
  User.hasMany(Membership, { foreignKey: "userId", as: "memberships" });
  Invitation.belongsTo(Lab, { foreignKey: "labId", as: "lab" });
  Container.belongsTo(Chemical, { foreignKey: "chemicalId", as: "chemical" });
  Container.belongsTo(Location, { foreignKey: "locationId", as: "location" });
  Chemical.hasMany(Container, { foreignKey: "chemicalId", as: "containers" });
  Reservation.belongsTo(Container, { foreignKey: "containerId", as: "container" });
  ApiToken.belongsTo(Lab, { foreignKey: "labId", as: "lab" });
  Study.belongsTo(User, { foreignKey: "authorId", as: "author" });
  Plan.belongsTo(User, { foreignKey: "authorId", as: "author" });
  Plan.belongsTo(Study, { foreignKey: "studyId", as: "study" });
  Study.hasMany(Plan, { foreignKey: "studyId", as: "plans" });
  PlanSignature.belongsTo(Plan, { foreignKey: "planId", as: "plan" });
  Reservation.belongsTo(Plan, { foreignKey: "planId", as: "plan" });
  PlanResult.belongsTo(User, { foreignKey: "enteredBy", as: "enteredByUser" });
  AnalysisExclusion.belongsTo(User, { foreignKey: "excludedBy", as: "excludedByUser" });
}
