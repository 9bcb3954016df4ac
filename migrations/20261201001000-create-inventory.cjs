"use strict";
/**
 * Inventory: locations, chemicals, containers, safety data sheets, reservations and the
 * append-only stock ledger. Amounts are BIGINT base units: micrograms (µg) for mass,
 * nanolitres (nL) for volume (see docs/inventory.md). Every table carries lab_id.
 *
 * reservations.plan_ref is a plain text reference to the plan (the plans table does not
 * exist yet; the plans migration adds the foreign key).
 */
module.exports = {
  async up(queryInterface, Sequelize) {
    const { DataTypes } = Sequelize;
    const uuid = { type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal("gen_random_uuid()") };
    const lab = { type: DataTypes.UUID, allowNull: false, references: { model: "labs", key: "id" }, onDelete: "CASCADE" };
    const stamps = {
      created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
      updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
    };
    const q = (sql) => queryInterface.sequelize.query(sql);

    await queryInterface.createTable("locations", {
      id: uuid,
      lab_id: lab,
      name: { type: DataTypes.STRING(120), allowNull: false },
      notes: { type: DataTypes.TEXT, allowNull: true },
      ...stamps,
    });
    await queryInterface.addIndex("locations", ["lab_id", "name"], { unique: true, name: "locations_lab_name" });

    await q("CREATE TYPE physical_state AS ENUM ('solid', 'liquid', 'gas', 'solution')");
    await queryInterface.createTable("chemicals", {
      id: uuid,
      lab_id: lab,
      name: { type: DataTypes.STRING(200), allowNull: false },
      synonyms: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
      cas: { type: DataTypes.STRING(12), allowNull: true },
      formula: { type: DataTypes.STRING(100), allowNull: true },
      molar_mass: { type: DataTypes.DECIMAL(12, 4), allowNull: true },
      density: { type: DataTypes.DECIMAL(10, 4), allowNull: true },
      physical_state: { type: "physical_state", allowNull: false, defaultValue: "solid" },
      ghs_statements: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
      pyrophoric: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      water_reactive: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      peroxide_class: { type: DataTypes.STRING(1), allowNull: true },
      storage_notes: { type: DataTypes.TEXT, allowNull: true },
      low_stock_base: { type: DataTypes.BIGINT, allowNull: true },
      low_stock_dimension: { type: DataTypes.STRING(6), allowNull: true },
      ...stamps,
    });
    await q(`ALTER TABLE chemicals
      ADD CONSTRAINT chemicals_cas_format CHECK (cas IS NULL OR cas ~ '^[0-9]{2,7}-[0-9]{2}-[0-9]$'),
      ADD CONSTRAINT chemicals_peroxide_class CHECK (peroxide_class IS NULL OR peroxide_class IN ('A','B','C','D')),
      ADD CONSTRAINT chemicals_positive CHECK ((molar_mass IS NULL OR molar_mass > 0) AND (density IS NULL OR density > 0)),
      ADD CONSTRAINT chemicals_low_stock CHECK ((low_stock_base IS NULL) = (low_stock_dimension IS NULL) AND (low_stock_base IS NULL OR low_stock_base >= 0) AND (low_stock_dimension IS NULL OR low_stock_dimension IN ('mass','volume')))`);
    await q("CREATE UNIQUE INDEX chemicals_lab_cas ON chemicals (lab_id, cas) WHERE cas IS NOT NULL");
    await queryInterface.addIndex("chemicals", ["lab_id", "name"], { name: "chemicals_lab_name" });

    await queryInterface.createTable("safety_data_sheets", {
      id: uuid,
      lab_id: lab,
      chemical_id: { type: DataTypes.UUID, allowNull: false, unique: true, references: { model: "chemicals", key: "id" }, onDelete: "CASCADE" },
      filename: { type: DataTypes.STRING(255), allowNull: false },
      content_type: { type: DataTypes.STRING(60), allowNull: false },
      size_bytes: { type: DataTypes.INTEGER, allowNull: false },
      sha256: { type: DataTypes.STRING(64), allowNull: false },
      data: { type: DataTypes.BLOB, allowNull: false },
      uploaded_by: { type: DataTypes.UUID, allowNull: false, references: { model: "users", key: "id" } },
      ...stamps,
    });
    await q("ALTER TABLE safety_data_sheets ADD CONSTRAINT sds_size CHECK (size_bytes > 0 AND size_bytes <= 10485760 AND octet_length(data) = size_bytes)");

    await q("CREATE TYPE container_status AS ENUM ('available', 'quarantined', 'empty', 'disposed')");
    await queryInterface.createTable("containers", {
      id: uuid,
      lab_id: lab,
      chemical_id: { type: DataTypes.UUID, allowNull: false, references: { model: "chemicals", key: "id" }, onDelete: "RESTRICT" },
      location_id: { type: DataTypes.UUID, allowNull: true, references: { model: "locations", key: "id" }, onDelete: "SET NULL" },
      barcode: { type: DataTypes.STRING(64), allowNull: false },
      lot: { type: DataTypes.STRING(64), allowNull: true },
      dimension: { type: DataTypes.STRING(6), allowNull: false },
      amount_base: { type: DataTypes.BIGINT, allowNull: false },
      initial_base: { type: DataTypes.BIGINT, allowNull: false },
      display_unit: { type: DataTypes.STRING(4), allowNull: false },
      concentration: { type: DataTypes.DECIMAL(14, 6), allowNull: true },
      concentration_unit: { type: DataTypes.STRING(6), allowNull: true },
      solvent: { type: DataTypes.STRING(120), allowNull: true },
      purity_percent: { type: DataTypes.DECIMAL(6, 3), allowNull: true },
      received_on: { type: DataTypes.DATEONLY, allowNull: true },
      opened_on: { type: DataTypes.DATEONLY, allowNull: true },
      expires_on: { type: DataTypes.DATEONLY, allowNull: true },
      peroxide_tested_on: { type: DataTypes.DATEONLY, allowNull: true },
      status: { type: "container_status", allowNull: false, defaultValue: "available" },
      ...stamps,
    });
    await q(`ALTER TABLE containers
      ADD CONSTRAINT containers_amount CHECK (amount_base >= 0 AND initial_base >= 0),
      ADD CONSTRAINT containers_dimension CHECK (dimension IN ('mass','volume')),
      ADD CONSTRAINT containers_solution CHECK ((concentration IS NULL) = (concentration_unit IS NULL) AND (concentration IS NULL OR (concentration > 0 AND concentration_unit IN ('M','mg/mL') AND dimension = 'volume'))),
      ADD CONSTRAINT containers_purity CHECK (purity_percent IS NULL OR (purity_percent > 0 AND purity_percent <= 100))`);
    await q("CREATE UNIQUE INDEX containers_lab_barcode ON containers (lab_id, lower(barcode))");
    await queryInterface.addIndex("containers", ["lab_id", "chemical_id"], { name: "containers_lab_chemical" });

    await q("CREATE TYPE reservation_status AS ENUM ('held', 'consumed', 'released')");
    await queryInterface.createTable("reservations", {
      id: uuid,
      lab_id: lab,
      container_id: { type: DataTypes.UUID, allowNull: false, references: { model: "containers", key: "id" }, onDelete: "RESTRICT" },
      plan_ref: { type: DataTypes.STRING(100), allowNull: false },
      amount_base: { type: DataTypes.BIGINT, allowNull: false },
      consumed_base: { type: DataTypes.BIGINT, allowNull: true },
      status: { type: "reservation_status", allowNull: false, defaultValue: "held" },
      note: { type: DataTypes.TEXT, allowNull: true },
      reserved_by: { type: DataTypes.UUID, allowNull: false, references: { model: "users", key: "id" } },
      closed_by: { type: DataTypes.UUID, allowNull: true, references: { model: "users", key: "id" } },
      closed_at: { type: DataTypes.DATE, allowNull: true },
      ...stamps,
    });
    await q(`ALTER TABLE reservations
      ADD CONSTRAINT reservations_amount CHECK (amount_base > 0 AND (consumed_base IS NULL OR consumed_base >= 0)),
      ADD CONSTRAINT reservations_closed CHECK ((status = 'held') = (closed_at IS NULL))`);
    await queryInterface.addIndex("reservations", ["container_id", "status"], { name: "reservations_container_status" });
    await queryInterface.addIndex("reservations", ["lab_id", "plan_ref"], { name: "reservations_lab_plan" });

    await queryInterface.createTable("stock_ledger", {
      id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
      lab_id: { type: DataTypes.UUID, allowNull: false, references: { model: "labs", key: "id" }, onDelete: "RESTRICT" },
      container_id: { type: DataTypes.UUID, allowNull: false, references: { model: "containers", key: "id" }, onDelete: "RESTRICT" },
      reservation_id: { type: DataTypes.UUID, allowNull: true, references: { model: "reservations", key: "id" }, onDelete: "RESTRICT" },
      kind: { type: DataTypes.STRING(20), allowNull: false },
      delta_base: { type: DataTypes.BIGINT, allowNull: false },
      held_delta_base: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
      balance_base: { type: DataTypes.BIGINT, allowNull: false },
      reason: { type: DataTypes.TEXT, allowNull: false },
      actor_user_id: { type: DataTypes.UUID, allowNull: true, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
      created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
    });
    await queryInterface.addIndex("stock_ledger", ["container_id", "id"], { name: "stock_ledger_container" });
    await q(`
      ALTER TABLE stock_ledger ADD CONSTRAINT stock_ledger_kind CHECK (kind IN ('received','imported','adjusted','reserved','consumed','released','status'));
      ALTER TABLE stock_ledger ADD CONSTRAINT stock_ledger_balance CHECK (balance_base >= 0);
      -- refuse_append_only_change() comes from the audit-log migration.
      CREATE TRIGGER stock_ledger_no_update BEFORE UPDATE OR DELETE ON stock_ledger
        FOR EACH ROW EXECUTE FUNCTION refuse_append_only_change();
      CREATE TRIGGER stock_ledger_no_truncate BEFORE TRUNCATE ON stock_ledger
        FOR EACH STATEMENT EXECUTE FUNCTION refuse_append_only_change();
    `);
  },
  async down(queryInterface) {
    await queryInterface.dropTable("stock_ledger");
    await queryInterface.dropTable("reservations");
    await queryInterface.dropTable("containers");
    await queryInterface.dropTable("safety_data_sheets");
    await queryInterface.dropTable("chemicals");
    await queryInterface.dropTable("locations");
    for (const t of ["reservation_status", "container_status", "physical_state"]) await queryInterface.sequelize.query(`DROP TYPE IF EXISTS ${t}`);
  },
};
