import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from "sequelize";
import type { Chemical } from "./chemical";
import type { Location } from "./location";

export type ContainerStatus = "available" | "quarantined" | "empty" | "disposed";

/**
 * One physical container. `amountBase` is what is in it now, in integer base units of
 * `dimension` (µg for mass, nL for volume; BIGINT, read as a string); `displayUnit` is the
 * unit people see it in. Solutions have a concentration (mol/L "M" or "mg/mL").
 */
export class Container extends Model<InferAttributes<Container>, InferCreationAttributes<Container>> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare chemicalId: string;
  declare locationId: string | null;
  declare barcode: string;
  declare lot: string | null;
  declare dimension: "mass" | "volume";
  declare amountBase: string;
  declare initialBase: string;
  declare displayUnit: string;
  declare concentration: string | null;
  declare concentrationUnit: "M" | "mg/mL" | null;
  declare solvent: string | null;
  declare purityPercent: string | null;
  declare receivedOn: string | null;
  declare openedOn: string | null;
  declare expiresOn: string | null;
  declare peroxideTestedOn: string | null;
  declare status: CreationOptional<ContainerStatus>;
  /** Raised by every save (Sequelize optimistic locking); edits send the version they read. */
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare chemical?: NonAttribute<Chemical>;
  declare location?: NonAttribute<Location | null>;

  static initModel(sequelize: Sequelize): void {
    Container.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        chemicalId: { type: DataTypes.UUID, allowNull: false },
        locationId: { type: DataTypes.UUID, allowNull: true },
        barcode: { type: DataTypes.STRING(64), allowNull: false },
        lot: { type: DataTypes.STRING(64), allowNull: true },
        dimension: { type: DataTypes.STRING(6), allowNull: false },
        amountBase: { type: DataTypes.BIGINT, allowNull: false },
        initialBase: { type: DataTypes.BIGINT, allowNull: false },
        displayUnit: { type: DataTypes.STRING(4), allowNull: false },
        concentration: { type: DataTypes.DECIMAL(14, 6), allowNull: true },
        concentrationUnit: { type: DataTypes.STRING(6), allowNull: true },
        solvent: { type: DataTypes.STRING(120), allowNull: true },
        purityPercent: { type: DataTypes.DECIMAL(6, 3), allowNull: true },
        receivedOn: { type: DataTypes.DATEONLY, allowNull: true },
        openedOn: { type: DataTypes.DATEONLY, allowNull: true },
        expiresOn: { type: DataTypes.DATEONLY, allowNull: true },
        peroxideTestedOn: { type: DataTypes.DATEONLY, allowNull: true },
        status: { type: DataTypes.ENUM("available", "quarantined", "empty", "disposed"), allowNull: false, defaultValue: "available" },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "containers", underscored: true, version: true },
    );
  }
}
