import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from "sequelize";
import type { Role } from "../lib/auth/roles";
import type { Lab } from "./lab";

/**
 * A lab API token for scripts and pipelines. Only the SHA-256 of the secret is stored;
 * `selector` (the secret's first characters) finds the row and identifies it to people.
 */
export class ApiToken extends Model<InferAttributes<ApiToken>, InferCreationAttributes<ApiToken>> {
  declare id: CreationOptional<string>;
  declare labId: ForeignKey<Lab["id"]>;
  declare name: string;
  declare role: Role;
  declare selector: string;
  declare secretHash: string;
  declare createdBy: string;
  declare expiresAt: Date;
  declare revokedAt: Date | null;
  declare revokedBy: string | null;
  declare lastUsedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare lab?: NonAttribute<Lab>;

  static initModel(sequelize: Sequelize): void {
    ApiToken.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.STRING(80), allowNull: false },
        role: { type: DataTypes.ENUM("chemist", "safety_officer", "stockkeeper", "lab_admin", "viewer"), allowNull: false },
        selector: { type: DataTypes.STRING(16), allowNull: false, unique: true },
        secretHash: { type: DataTypes.STRING(64), allowNull: false },
        createdBy: { type: DataTypes.UUID, allowNull: false },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        revokedAt: { type: DataTypes.DATE, allowNull: true },
        revokedBy: { type: DataTypes.UUID, allowNull: true },
        lastUsedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "api_tokens", underscored: true },
    );
  }
}
