import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from "sequelize";
import type { StudyResponse } from "../lib/studies/schemas";
import type { User } from "./user";

/** A study: the goal of a line of experiments and the responses measured; its plans refer to it. */
export class Study extends Model<InferAttributes<Study>, InferCreationAttributes<Study>> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare name: string;
  declare goal: string | null;
  declare targetProduct: string | null;
  declare responses: StudyResponse[];
  declare authorId: string;
  declare version: CreationOptional<number>;
  declare archivedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare author?: NonAttribute<User>;

  static initModel(sequelize: Sequelize): void {
    Study.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.STRING(200), allowNull: false },
        goal: { type: DataTypes.TEXT, allowNull: true },
        targetProduct: { type: DataTypes.STRING(300), allowNull: true },
        responses: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        authorId: { type: DataTypes.UUID, allowNull: false },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
        archivedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      // modelName fixed: queries name the model ("Study"."id"), and minified builds rename classes.
      { sequelize, modelName: "Study", tableName: "studies", underscored: true },
    );
  }
}
