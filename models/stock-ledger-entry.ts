import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export type LedgerKind = "received" | "imported" | "adjusted" | "reserved" | "consumed" | "released" | "status";

/**
 * One line of the append-only stock ledger (the database refuses updates and deletes):
 * `deltaBase` changes the amount in the container, `heldDeltaBase` the amount held by
 * reservations; `balanceBase` is the container's amount after the line. All in the
 * container's base units (BIGINT, read as strings).
 */
export class StockLedgerEntry extends Model<InferAttributes<StockLedgerEntry>, InferCreationAttributes<StockLedgerEntry>> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare containerId: string;
  declare reservationId: string | null;
  declare kind: LedgerKind;
  declare deltaBase: string;
  declare heldDeltaBase: string;
  declare balanceBase: string;
  declare reason: string;
  declare actorUserId: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    StockLedgerEntry.init(
      {
        id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
        labId: { type: DataTypes.UUID, allowNull: false },
        containerId: { type: DataTypes.UUID, allowNull: false },
        reservationId: { type: DataTypes.UUID, allowNull: true },
        kind: { type: DataTypes.STRING(20), allowNull: false },
        deltaBase: { type: DataTypes.BIGINT, allowNull: false },
        heldDeltaBase: { type: DataTypes.BIGINT, allowNull: false },
        balanceBase: { type: DataTypes.BIGINT, allowNull: false },
        reason: { type: DataTypes.TEXT, allowNull: false },
        actorUserId: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: "stock_ledger", underscored: true, updatedAt: false },
    );
  }
}
