import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/**
 * A step of the demo scenario applied to this database (lib/demo): its file name, its title,
 * and the ids of what it created under the names later steps look them up by.
 */
export class DemoStep extends Model<InferAttributes<DemoStep>, InferCreationAttributes<DemoStep>> {
  declare name: string;
  declare title: string;
  declare records: Record<string, string>;
  declare appliedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    DemoStep.init(
      {
        name: { type: DataTypes.STRING(120), primaryKey: true },
        title: { type: DataTypes.STRING(300), allowNull: false },
        records: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        appliedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: "demo_steps", underscored: true, timestamps: false },
    );
  }
}
