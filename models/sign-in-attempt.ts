import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** One sign-in attempt for an e-mail address, kept for the lockout rule. */
export class SignInAttempt extends Model<InferAttributes<SignInAttempt>, InferCreationAttributes<SignInAttempt>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare succeeded: boolean;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    SignInAttempt.init(
      {
        id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
        email: { type: DataTypes.STRING(320), allowNull: false },
        succeeded: { type: DataTypes.BOOLEAN, allowNull: false },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: "sign_in_attempts", underscored: true, updatedAt: false },
    );
  }
}
