import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { PlanDocument } from "../lib/chemistry/plan-document";
import type { ReviewDecision } from "../lib/plans/signature";

/**
 * The e-signature of one plan review (issue 11): who signed, when, what the signature means
 * ("approved for execution as planned", "changes requested", "rejected"), the comment, and
 * the SHA-256 content hash, version and document of the plan as signed. Append-only: the
 * database refuses updates and deletes (migration 20261202050000).
 */
export class PlanSignature extends Model<InferAttributes<PlanSignature>, InferCreationAttributes<PlanSignature>> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare planId: string;
  declare signerId: string;
  declare signerName: string;
  declare decision: ReviewDecision;
  declare meaning: string;
  declare comment: string;
  declare contentHash: string;
  declare planVersion: number;
  declare document: PlanDocument;
  declare signedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    PlanSignature.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        planId: { type: DataTypes.UUID, allowNull: false },
        signerId: { type: DataTypes.UUID, allowNull: false },
        signerName: { type: DataTypes.STRING(200), allowNull: false },
        decision: { type: DataTypes.STRING(20), allowNull: false },
        meaning: { type: DataTypes.STRING(200), allowNull: false },
        comment: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        contentHash: { type: DataTypes.CHAR(64), allowNull: false },
        planVersion: { type: DataTypes.INTEGER, allowNull: false },
        document: { type: DataTypes.JSONB, allowNull: false },
        signedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, modelName: "PlanSignature", tableName: "plan_signatures", underscored: true, timestamps: false },
    );
  }
}
