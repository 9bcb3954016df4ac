import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** A person who signs in. Roles are per lab, on Membership. */
export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare name: string;
  declare passwordHash: string | null;
  declare passwordChangedAt: Date | null;
  /** Carried in session tokens; a password change raises it, ending the user's other sessions. */
  declare sessionVersion: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    User.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        email: { type: DataTypes.STRING(320), allowNull: false, unique: true },
        name: { type: DataTypes.STRING(200), allowNull: false },
        passwordHash: { type: DataTypes.STRING(100), allowNull: true },
        passwordChangedAt: { type: DataTypes.DATE, allowNull: true },
        sessionVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "users", underscored: true },
    );
  }
}
