import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from "sequelize";
import type { User } from "./user";

/**
 * A run left out of a plan's analysis, for one response (or every response when
 * `response` is null), with the reason; restored runs keep their row (`restoredAt`).
 */
export class AnalysisExclusion extends Model<InferAttributes<AnalysisExclusion>, InferCreationAttributes<AnalysisExclusion>> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare planId: string;
  declare run: number;
  declare response: string | null;
  declare reason: string;
  declare excludedBy: string;
  declare restoredBy: string | null;
  declare restoredAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare excludedByUser?: NonAttribute<User>;

  static initModel(sequelize: Sequelize): void {
    AnalysisExclusion.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        planId: { type: DataTypes.UUID, allowNull: false },
        run: { type: DataTypes.INTEGER, allowNull: false },
        response: { type: DataTypes.STRING(64), allowNull: true },
        reason: { type: DataTypes.TEXT, allowNull: false },
        excludedBy: { type: DataTypes.UUID, allowNull: false },
        restoredBy: { type: DataTypes.UUID, allowNull: true },
        restoredAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: "AnalysisExclusion", tableName: "analysis_exclusions", underscored: true },
    );
  }
}
