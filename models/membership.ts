import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from "sequelize";
import type { Role } from "../lib/auth/roles";
import type { Lab } from "./lab";
import type { User } from "./user";

/** One person's role in one lab. */
export class Membership extends Model<InferAttributes<Membership>, InferCreationAttributes<Membership>> {
  declare id: CreationOptional<string>;
  declare labId: ForeignKey<Lab["id"]>;
  declare userId: ForeignKey<User["id"]>;
  declare role: Role;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare lab?: NonAttribute<Lab>;
  declare user?: NonAttribute<User>;

  static initModel(sequelize: Sequelize): void {
    Membership.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        role: { type: DataTypes.ENUM("chemist", "safety_officer", "stockkeeper", "lab_admin", "viewer"), allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "memberships", underscored: true },
    );
  }
}
