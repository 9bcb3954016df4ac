"use strict";
/**
 * Studies and plans (issue 10), and the version of a lab's settings.
 *
 * - studies: a goal, an optional target product and the responses measured (JSONB, validated
 *   by lib/studies/schemas.ts); `version` for optimistic locking; archived, never deleted
 *   while plans refer to them.
 * - plans: belong to a study of the same lab (composite foreign key (lab_id, study_id)), hold
 *   the plan document as validated and defaulted (JSONB) and the SHA-256 of its RFC 8785
 *   canonical JSON; `state` is checked against the states of lib/plans/states.ts; `version`
 *   for optimistic locking; a plan may derive from another (duplicate, confirmation,
 *   augmentation).
 * - labs.settings_version: optimistic locking of labs.settings (lib/lab-settings).
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

    await queryInterface.addColumn("labs", "settings_version", { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 });
    await q("ALTER TABLE labs ADD CONSTRAINT labs_settings_version_positive CHECK (settings_version >= 1)");

    await queryInterface.createTable("studies", {
      id: uuid,
      lab_id: { type: DataTypes.UUID, allowNull: false, references: { model: "labs", key: "id" }, onDelete: "CASCADE" },
      name: { type: DataTypes.STRING(200), allowNull: false },
      goal: { type: DataTypes.TEXT, allowNull: true },
      target_product: { type: DataTypes.STRING(300), allowNull: true },
      responses: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
      author_id: { type: DataTypes.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      archived_at: { type: DataTypes.DATE, allowNull: true },
      ...stamps,
    });
    await q(`ALTER TABLE studies
      ADD CONSTRAINT studies_lab_id_unique UNIQUE (lab_id, id),
      ADD CONSTRAINT studies_name_not_blank CHECK (btrim(name) <> ''),
      ADD CONSTRAINT studies_responses_array CHECK (jsonb_typeof(responses) = 'array'),
      ADD CONSTRAINT studies_version_positive CHECK (version >= 1)`);
    await q("CREATE INDEX studies_lab_name ON studies (lab_id, lower(name))");
    await queryInterface.addIndex("studies", ["lab_id", "updated_at"], { name: "studies_lab_updated" });

    await queryInterface.createTable("plans", {
      id: uuid,
      lab_id: { type: DataTypes.UUID, allowNull: false, references: { model: "labs", key: "id" }, onDelete: "CASCADE" },
      study_id: { type: DataTypes.UUID, allowNull: false },
      name: { type: DataTypes.STRING(300), allowNull: false },
      state: { type: DataTypes.STRING(32), allowNull: false, defaultValue: "draft" },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      document: { type: DataTypes.JSONB, allowNull: false },
      content_hash: { type: DataTypes.CHAR(64), allowNull: false },
      run_count: { type: DataTypes.INTEGER, allowNull: true },
      author_id: { type: DataTypes.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
      derived_from_plan_id: { type: DataTypes.UUID, allowNull: true, references: { model: "plans", key: "id" }, onDelete: "SET NULL" },
      derivation: { type: DataTypes.STRING(20), allowNull: true },
      ...stamps,
    });
    await q(`ALTER TABLE plans
      ADD CONSTRAINT plans_study_same_lab FOREIGN KEY (lab_id, study_id) REFERENCES studies (lab_id, id) ON DELETE RESTRICT,
      ADD CONSTRAINT plans_state CHECK (state IN ('draft', 'in_review', 'changes_requested', 'approved', 'rejected', 'released', 'running', 'results_entered', 'closed', 'cancelled')),
      ADD CONSTRAINT plans_derivation CHECK (derivation IS NULL OR derivation IN ('duplicate', 'confirmation', 'augmentation')),
      ADD CONSTRAINT plans_derived_has_derivation CHECK (derived_from_plan_id IS NULL OR derivation IS NOT NULL),
      ADD CONSTRAINT plans_content_hash_hex CHECK (content_hash ~ '^[0-9a-f]{64}$'),
      ADD CONSTRAINT plans_document_object CHECK (jsonb_typeof(document) = 'object'),
      ADD CONSTRAINT plans_version_positive CHECK (version >= 1),
      ADD CONSTRAINT plans_run_count CHECK (run_count IS NULL OR run_count >= 0)`);
    await queryInterface.addIndex("plans", ["lab_id", "study_id", "updated_at"], { name: "plans_lab_study_updated" });
    await queryInterface.addIndex("plans", ["lab_id", "state", "updated_at"], { name: "plans_lab_state_updated" });
    await queryInterface.addIndex("plans", ["lab_id", "author_id", "updated_at"], { name: "plans_lab_author_updated" });
    await queryInterface.addIndex("plans", ["derived_from_plan_id"], { name: "plans_derived_from" });
  },

  async down(queryInterface) {
    await queryInterface.dropTable("plans");
    await queryInterface.dropTable("studies");
    await queryInterface.removeColumn("labs", "settings_version");
  },
};
