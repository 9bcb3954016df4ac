"use strict";
/**
 * Results and the runs left out of an analysis (issue 12).
 *
 * - plan_results: one row per plan, run (the run sheet's run number) and response (a key of
 *   the study's responses): the value, or failed with a reason; who entered it and when.
 *   A value is a finite double (NaN and ±Infinity refused by a check), or NULL exactly when
 *   the result is marked failed. Every change is in the audit log (lib/results/server).
 * - analysis_exclusions: a run left out of a plan's analysis (for one response or for all),
 *   with the reason, who and when; restoring it records who and when (the row stays, so the
 *   history is kept). At most one active exclusion per plan, run and response.
 *
 * Both belong to a plan of the same lab (composite foreign key (lab_id, plan_id)).
 */
module.exports = {
  async up(queryInterface, Sequelize) {
    const { DataTypes } = Sequelize;
    const q = (sql) => queryInterface.sequelize.query(sql);
    const uuid = { type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal("gen_random_uuid()") };
    const stamps = {
      created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
      updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
    };
    // The composite key the foreign keys below refer to; the review migration
    // (20261202050000) adds the same one when it is there, so only add it when missing.
    await q(`DO $$ BEGIN
      IF NOT EXISTS (SELECT 1 FROM pg_constraint WHERE conname = 'plans_lab_id_unique') THEN
        ALTER TABLE plans ADD CONSTRAINT plans_lab_id_unique UNIQUE (lab_id, id);
      END IF;
    END $$`);

    await queryInterface.createTable("plan_results", {
      id: uuid,
      lab_id: { type: DataTypes.UUID, allowNull: false, references: { model: "labs", key: "id" }, onDelete: "CASCADE" },
      plan_id: { type: DataTypes.UUID, allowNull: false },
      run: { type: DataTypes.INTEGER, allowNull: false },
      response: { type: DataTypes.STRING(64), allowNull: false },
      value: { type: DataTypes.DOUBLE, allowNull: true },
      failed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      failure_reason: { type: DataTypes.TEXT, allowNull: true },
      entered_by: { type: DataTypes.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
      entered_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
      ...stamps,
    });
    await q(`ALTER TABLE plan_results
      ADD CONSTRAINT plan_results_plan_same_lab FOREIGN KEY (lab_id, plan_id) REFERENCES plans (lab_id, id) ON DELETE CASCADE,
      ADD CONSTRAINT plan_results_one_per_cell UNIQUE (plan_id, run, response),
      ADD CONSTRAINT plan_results_run_positive CHECK (run >= 1),
      ADD CONSTRAINT plan_results_value_or_failed CHECK ((failed AND value IS NULL) OR (NOT failed AND value IS NOT NULL)),
      ADD CONSTRAINT plan_results_value_finite CHECK (value IS NULL OR (value <> 'NaN'::float8 AND value <> 'Infinity'::float8 AND value <> '-Infinity'::float8)),
      ADD CONSTRAINT plan_results_reason_only_failed CHECK (failed OR failure_reason IS NULL)`);
    await queryInterface.addIndex("plan_results", ["lab_id", "plan_id", "run"], { name: "plan_results_lab_plan_run" });

    await queryInterface.createTable("analysis_exclusions", {
      id: uuid,
      lab_id: { type: DataTypes.UUID, allowNull: false, references: { model: "labs", key: "id" }, onDelete: "CASCADE" },
      plan_id: { type: DataTypes.UUID, allowNull: false },
      run: { type: DataTypes.INTEGER, allowNull: false },
      response: { type: DataTypes.STRING(64), allowNull: true },
      reason: { type: DataTypes.TEXT, allowNull: false },
      excluded_by: { type: DataTypes.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
      restored_by: { type: DataTypes.UUID, allowNull: true, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
      restored_at: { type: DataTypes.DATE, allowNull: true },
      ...stamps,
    });
    await q(`ALTER TABLE analysis_exclusions
      ADD CONSTRAINT analysis_exclusions_plan_same_lab FOREIGN KEY (lab_id, plan_id) REFERENCES plans (lab_id, id) ON DELETE CASCADE,
      ADD CONSTRAINT analysis_exclusions_run_positive CHECK (run >= 1),
      ADD CONSTRAINT analysis_exclusions_reason_not_blank CHECK (btrim(reason) <> ''),
      ADD CONSTRAINT analysis_exclusions_restored_pair CHECK ((restored_at IS NULL) = (restored_by IS NULL))`);
    await q("CREATE UNIQUE INDEX analysis_exclusions_one_active ON analysis_exclusions (plan_id, run, coalesce(response, '')) WHERE restored_at IS NULL");
    await queryInterface.addIndex("analysis_exclusions", ["lab_id", "plan_id"], { name: "analysis_exclusions_lab_plan" });
  },

  async down(queryInterface) {
    await queryInterface.dropTable("analysis_exclusions");
    await queryInterface.dropTable("plan_results");
    // plans_lab_id_unique stays: other tables (reservations, signatures) may refer to it.
  },
};
