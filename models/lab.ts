import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** A lab: the tenant. Every record of the lab's carries its lab_id. */
export class Lab extends Model<InferAttributes<Lab>, InferCreationAttributes<Lab>> {
  declare id: CreationOptional<string>;
  declare slug: string;
  declare name: string;
  declare settings: CreationOptional<Record<string, unknown>>;
  /** Optimistic lock of `settings` (lib/lab-settings): every saved change adds one. */
  declare settingsVersion: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Lab.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        slug: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        name: { type: DataTypes.STRING(200), allowNull: false },
        settings: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        settingsVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "labs", underscored: true },
    );
  }
}
