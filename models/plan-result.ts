import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from "sequelize";
import type { User } from "./user";

/**
 * One result of a plan: for a run (the run sheet's run number) and a response of the
 * study, the value — or failed, with the reason — and who entered it when.
 */
export class PlanResult extends Model<InferAttributes<PlanResult>, InferCreationAttributes<PlanResult>> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare planId: string;
  declare run: number;
  declare response: string;
  declare value: number | null;
  declare failed: boolean;
  declare failureReason: string | null;
  declare enteredBy: string;
  declare enteredAt: Date;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare enteredByUser?: NonAttribute<User>;

  static initModel(sequelize: Sequelize): void {
    PlanResult.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        planId: { type: DataTypes.UUID, allowNull: false },
        run: { type: DataTypes.INTEGER, allowNull: false },
        response: { type: DataTypes.STRING(64), allowNull: false },
        value: { type: DataTypes.DOUBLE, allowNull: true },
        failed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        failureReason: { type: DataTypes.TEXT, allowNull: true },
        enteredBy: { type: DataTypes.UUID, allowNull: false },
        enteredAt: { type: DataTypes.DATE, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: "PlanResult", tableName: "plan_results", underscored: true },
    );
  }
}
