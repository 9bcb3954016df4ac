import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export type PhysicalState = "solid" | "liquid" | "gas" | "solution";

/**
 * One chemical of a lab's catalogue. Molar mass (g/mol) and density (g/mL) are exact
 * decimals (PostgreSQL NUMERIC, read as strings). The low-stock mark is in base units
 * (µg or nL) of `lowStockDimension`.
 */
export class Chemical extends Model<InferAttributes<Chemical>, InferCreationAttributes<Chemical>> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare name: string;
  declare synonyms: CreationOptional<string[]>;
  declare cas: string | null;
  declare formula: string | null;
  declare molarMass: string | null;
  declare density: string | null;
  declare physicalState: CreationOptional<PhysicalState>;
  declare ghsStatements: CreationOptional<string[]>;
  declare pyrophoric: CreationOptional<boolean>;
  declare waterReactive: CreationOptional<boolean>;
  declare peroxideClass: "A" | "B" | "C" | "D" | null;
  declare storageNotes: string | null;
  declare lowStockBase: string | null;
  declare lowStockDimension: "mass" | "volume" | null;
  /** Raised by every save (Sequelize optimistic locking); edits send the version they read. */
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Chemical.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.STRING(200), allowNull: false },
        synonyms: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        cas: { type: DataTypes.STRING(12), allowNull: true },
        formula: { type: DataTypes.STRING(100), allowNull: true },
        molarMass: { type: DataTypes.DECIMAL(12, 4), allowNull: true },
        density: { type: DataTypes.DECIMAL(10, 4), allowNull: true },
        physicalState: { type: DataTypes.ENUM("solid", "liquid", "gas", "solution"), allowNull: false, defaultValue: "solid" },
        ghsStatements: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        pyrophoric: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        waterReactive: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        peroxideClass: { type: DataTypes.STRING(1), allowNull: true },
        storageNotes: { type: DataTypes.TEXT, allowNull: true },
        lowStockBase: { type: DataTypes.BIGINT, allowNull: true },
        lowStockDimension: { type: DataTypes.STRING(6), allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "chemicals", underscored: true, version: true },
    );
  }
}
