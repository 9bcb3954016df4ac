import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from "sequelize";
import type { Container } from "./container";

export type ReservationStatus = "held" | "consumed" | "released";

/**
 * An amount of one container held for a plan. `planId` is the plan a release reserved it
 * for (foreign key, same lab; null for a reservation made by hand); `planRef` is the plan
 * as readable text. Amounts in the container's base units (BIGINT, read as strings).
 */
export class Reservation extends Model<InferAttributes<Reservation>, InferCreationAttributes<Reservation>> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare containerId: string;
  declare planRef: string;
  declare planId: CreationOptional<string | null>;
  declare amountBase: string;
  declare consumedBase: string | null;
  declare status: CreationOptional<ReservationStatus>;
  declare note: string | null;
  declare reservedBy: string;
  declare closedBy: string | null;
  declare closedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare container?: NonAttribute<Container>;

  static initModel(sequelize: Sequelize): void {
    Reservation.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        containerId: { type: DataTypes.UUID, allowNull: false },
        planRef: { type: DataTypes.STRING(100), allowNull: false },
        planId: { type: DataTypes.UUID, allowNull: true },
        amountBase: { type: DataTypes.BIGINT, allowNull: false },
        consumedBase: { type: DataTypes.BIGINT, allowNull: true },
        status: { type: DataTypes.ENUM("held", "consumed", "released"), allowNull: false, defaultValue: "held" },
        note: { type: DataTypes.TEXT, allowNull: true },
        reservedBy: { type: DataTypes.UUID, allowNull: false },
        closedBy: { type: DataTypes.UUID, allowNull: true },
        closedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "reservations", underscored: true },
    );
  }
}
