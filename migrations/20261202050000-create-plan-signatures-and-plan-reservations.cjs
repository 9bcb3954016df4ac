"use strict";
/**
 * Safety review and release (issue 11).
 *
 * - plan_signatures: the e-signatures of plan reviews (approve, request changes, reject):
 *   signer id and name, time, meaning, comment, the SHA-256 content hash of the plan at
 *   signing, the plan version and the document as reviewed (the review page diffs against
 *   it). Append-only: refuse_append_only_change() from the audit-log migration refuses any
 *   update, delete or truncate.
 * - plans.signature_id: the signature that applies to the plan's content now; any edit of
 *   the content clears it (the signature is void from then on, even if a later edit brings
 *   the same content back). The composite foreign key keeps it one of the plan's own.
 * - plans.submitted_at: when the plan was last submitted for review (the queue's age).
 * - reservations.plan_id: the plan a reservation holds stock for (same lab, composite
 *   foreign key); plan_ref stays as the readable text.
 */
module.exports = {
  async up(queryInterface, Sequelize) {
    const { DataTypes } = Sequelize;
    const q = (sql) => queryInterface.sequelize.query(sql);

    // The composite key the foreign keys below refer to. The results migration
    // (20261202060000) adds the same one when missing, and a database that took the results
    // migration before this one (both landed on the same day, results first) has it already.
    await q(`DO $$ BEGIN
      IF NOT EXISTS (SELECT 1 FROM pg_constraint WHERE conname = 'plans_lab_id_unique') THEN
        ALTER TABLE plans ADD CONSTRAINT plans_lab_id_unique UNIQUE (lab_id, id);
      END IF;
    END $$`);

    await queryInterface.createTable("plan_signatures", {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal("gen_random_uuid()") },
      lab_id: { type: DataTypes.UUID, allowNull: false },
      plan_id: { type: DataTypes.UUID, allowNull: false },
      signer_id: { type: DataTypes.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
      signer_name: { type: DataTypes.STRING(200), allowNull: false },
      decision: { type: DataTypes.STRING(20), allowNull: false },
      meaning: { type: DataTypes.STRING(200), allowNull: false },
      comment: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
      content_hash: { type: DataTypes.CHAR(64), allowNull: false },
      plan_version: { type: DataTypes.INTEGER, allowNull: false },
      document: { type: DataTypes.JSONB, allowNull: false },
      signed_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
    });
    await q(`ALTER TABLE plan_signatures
      ADD CONSTRAINT plan_signatures_plan_same_lab FOREIGN KEY (lab_id, plan_id) REFERENCES plans (lab_id, id) ON DELETE RESTRICT,
      ADD CONSTRAINT plan_signatures_plan_id_unique UNIQUE (plan_id, id),
      ADD CONSTRAINT plan_signatures_decision CHECK (decision IN ('approve', 'request_changes', 'reject')),
      ADD CONSTRAINT plan_signatures_content_hash_hex CHECK (content_hash ~ '^[0-9a-f]{64}$'),
      ADD CONSTRAINT plan_signatures_meaning_not_blank CHECK (btrim(meaning) <> ''),
      ADD CONSTRAINT plan_signatures_document_object CHECK (jsonb_typeof(document) = 'object'),
      ADD CONSTRAINT plan_signatures_version_positive CHECK (plan_version >= 1)`);
    await queryInterface.addIndex("plan_signatures", ["plan_id", "signed_at"], { name: "plan_signatures_plan_time" });
    await q(`
      CREATE TRIGGER plan_signatures_no_update BEFORE UPDATE OR DELETE ON plan_signatures
        FOR EACH ROW EXECUTE FUNCTION refuse_append_only_change();
      CREATE TRIGGER plan_signatures_no_truncate BEFORE TRUNCATE ON plan_signatures
        FOR EACH STATEMENT EXECUTE FUNCTION refuse_append_only_change();
    `);

    await queryInterface.addColumn("plans", "signature_id", { type: DataTypes.UUID, allowNull: true });
    await queryInterface.addColumn("plans", "submitted_at", { type: DataTypes.DATE, allowNull: true });
    await q("ALTER TABLE plans ADD CONSTRAINT plans_signature_own FOREIGN KEY (id, signature_id) REFERENCES plan_signatures (plan_id, id) ON DELETE RESTRICT");

    await queryInterface.addColumn("reservations", "plan_id", { type: DataTypes.UUID, allowNull: true });
    await q("ALTER TABLE reservations ADD CONSTRAINT reservations_plan_same_lab FOREIGN KEY (lab_id, plan_id) REFERENCES plans (lab_id, id) ON DELETE RESTRICT");
    await queryInterface.addIndex("reservations", ["plan_id", "status"], { name: "reservations_plan_status" });
  },

  async down(queryInterface) {
    const q = (sql) => queryInterface.sequelize.query(sql);
    await queryInterface.removeIndex("reservations", "reservations_plan_status");
    await q("ALTER TABLE reservations DROP CONSTRAINT reservations_plan_same_lab");
    await queryInterface.removeColumn("reservations", "plan_id");
    await q("ALTER TABLE plans DROP CONSTRAINT plans_signature_own");
    await queryInterface.removeColumn("plans", "submitted_at");
    await queryInterface.removeColumn("plans", "signature_id");
    await queryInterface.dropTable("plan_signatures");
    // Kept while the results tables' foreign keys still refer to it.
    await q(`DO $$ BEGIN
      IF NOT EXISTS (SELECT 1 FROM pg_constraint WHERE conname IN ('plan_results_plan_same_lab', 'analysis_exclusions_plan_same_lab')) THEN
        ALTER TABLE plans DROP CONSTRAINT IF EXISTS plans_lab_id_unique;
      END IF;
    END $$`);
  },
};
