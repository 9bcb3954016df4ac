"use strict";
/**
 * The next design (issue 13): what a derived plan was derived with.
 *
 * - plans.derivation_details: for a confirmation plan, the analysis it confirms (response,
 *   model, pruning α, hierarchy, transform), the optimum, the settable point and steps, the
 *   prediction with its intervals and the replicates; for an augmentation, the α chosen
 *   (asked for, rotatable, orthogonal), what limited it and the notes the chemist was given.
 *   JSONB written by lib/results/confirmation-plan.ts and lib/plans/augmentation.ts; only on
 *   a derived plan.
 * - plans_derived_same_lab: the plan a plan derives from is one of the same lab (composite
 *   foreign key on the (lab_id, id) key the results and review migrations add); deleting the
 *   source (a draft) clears the link only.
 */
module.exports = {
  async up(queryInterface, Sequelize) {
    const { DataTypes } = Sequelize;
    const q = (sql) => queryInterface.sequelize.query(sql);
    await queryInterface.addColumn("plans", "derivation_details", { type: DataTypes.JSONB, allowNull: true });
    await q(`ALTER TABLE plans
      ADD CONSTRAINT plans_derivation_details_object CHECK (derivation_details IS NULL OR (jsonb_typeof(derivation_details) = 'object' AND derivation IS NOT NULL)),
      ADD CONSTRAINT plans_derived_same_lab FOREIGN KEY (lab_id, derived_from_plan_id) REFERENCES plans (lab_id, id) ON DELETE SET NULL (derived_from_plan_id)`);
  },

  async down(queryInterface) {
    const q = (sql) => queryInterface.sequelize.query(sql);
    await q("ALTER TABLE plans DROP CONSTRAINT plans_derived_same_lab, DROP CONSTRAINT plans_derivation_details_object");
    await queryInterface.removeColumn("plans", "derivation_details");
  },
};
