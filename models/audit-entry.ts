import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** One entry of the append-only audit log (the database refuses updates and deletes). */
export class AuditEntry extends Model<InferAttributes<AuditEntry>, InferCreationAttributes<AuditEntry>> {
  declare id: CreationOptional<string>;
  declare labId: string | null;
  declare actorUserId: string | null;
  /** The lab API token that made the change (its creator is actorUserId), or null. */
  declare actorTokenId: string | null;
  declare action: string;
  declare entityType: string;
  declare entityId: string | null;
  declare before: unknown;
  declare after: unknown;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    AuditEntry.init(
      {
        id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
        labId: { type: DataTypes.UUID, allowNull: true },
        actorUserId: { type: DataTypes.UUID, allowNull: true },
        actorTokenId: { type: DataTypes.UUID, allowNull: true },
        action: { type: DataTypes.STRING(100), allowNull: false },
        entityType: { type: DataTypes.STRING(60), allowNull: false },
        entityId: { type: DataTypes.STRING(100), allowNull: true },
        before: { type: DataTypes.JSONB, allowNull: true },
        after: { type: DataTypes.JSONB, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: "audit_log", underscored: true, updatedAt: false },
    );
  }
}
