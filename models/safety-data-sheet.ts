import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** A chemical's safety data sheet: one PDF (≤ 10 MB) stored in the database as BYTEA. */
export class SafetyDataSheet extends Model<InferAttributes<SafetyDataSheet>, InferCreationAttributes<SafetyDataSheet>> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare chemicalId: string;
  declare filename: string;
  declare contentType: string;
  declare sizeBytes: number;
  declare sha256: string;
  declare data: Buffer;
  declare uploadedBy: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    SafetyDataSheet.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        chemicalId: { type: DataTypes.UUID, allowNull: false },
        filename: { type: DataTypes.STRING(255), allowNull: false },
        contentType: { type: DataTypes.STRING(60), allowNull: false },
        sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
        sha256: { type: DataTypes.STRING(64), allowNull: false },
        data: { type: DataTypes.BLOB, allowNull: false },
        uploadedBy: { type: DataTypes.UUID, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "safety_data_sheets", underscored: true },
    );
  }
}
