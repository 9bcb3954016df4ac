import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from "sequelize";
import type { PlanDocument } from "../lib/chemistry/plan-document";
import type { PlanDerivation } from "../lib/plans/schemas";
import type { PlanState } from "../lib/plans/states";
import type { Study } from "./study";
import type { User } from "./user";

/**
 * A plan of a study: the plan document as validated and defaulted, its content hash
 * (SHA-256 of the RFC 8785 canonical JSON), its state (lib/plans/states.ts) and version.
 */
export class Plan extends Model<InferAttributes<Plan>, InferCreationAttributes<Plan>> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare studyId: string;
  declare name: string;
  declare state: CreationOptional<PlanState>;
  declare version: CreationOptional<number>;
  declare document: PlanDocument;
  declare contentHash: string;
  declare runCount: number | null;
  declare authorId: string;
  declare derivedFromPlanId: string | null;
  declare derivation: PlanDerivation | null;
  /** The signature that applies to the content now (plan_signatures); any edit of the content clears it. */
  declare signatureId: CreationOptional<string | null>;
  /** When the plan was last submitted for review. */
  declare submittedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare author?: NonAttribute<User>;
  declare study?: NonAttribute<Study>;

  static initModel(sequelize: Sequelize): void {
    Plan.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        studyId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.STRING(300), allowNull: false },
        state: { type: DataTypes.STRING(32), allowNull: false, defaultValue: "draft" },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
        document: { type: DataTypes.JSONB, allowNull: false },
        contentHash: { type: DataTypes.CHAR(64), allowNull: false },
        runCount: { type: DataTypes.INTEGER, allowNull: true },
        authorId: { type: DataTypes.UUID, allowNull: false },
        derivedFromPlanId: { type: DataTypes.UUID, allowNull: true },
        derivation: { type: DataTypes.STRING(20), allowNull: true },
        signatureId: { type: DataTypes.UUID, allowNull: true },
        submittedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      // modelName fixed: queries name the model ("Plan"."name"), and minified builds rename classes.
      { sequelize, modelName: "Plan", tableName: "plans", underscored: true },
    );
  }
}
