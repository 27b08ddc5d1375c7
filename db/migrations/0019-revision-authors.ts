import { DataTypes } from "sequelize";
import { sqlDialectOf } from "~/utils/sql-dialect.server";
import type { Migration } from "../umzug";

/** Audit actions that wrote a revision, and the act each one makes its user an author by. */
const ACTS: Array<[action: string, act: string]> = [
  ["created", "created"],
  ["new revision started", "started"],
  ["saved", "saved"],
  ["component version pulled", "pulled"],
  ["submitted for review", "submitted"],
];

/**
 * The revision an audit row names, from its JSON details. A PostgreSQL database is empty when it reaches this
 * migration (data arrives by `db:copy` into a migrated database), so it needs no guard against malformed JSON.
 */
const REVISION_OF_EVENT = {
  sqlite: "CASE WHEN json_valid(e.details) THEN json_extract(e.details, '$.revision') END",
  postgres: "CAST(CAST(e.details AS jsonb) ->> 'revision' AS integer)",
};

/**
 * Everyone who wrote a revision and how (created, started, saved, pulled a component version,
 * submitted), with the first and last time: the authors an appointed person may not be. Filled from
 * the audit trail for revisions written before.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.createTable("plan_revision_authors", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revision_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: "plan_revisions", key: "id" },
      onDelete: "CASCADE",
    },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "users", key: "id" } },
    act: { type: DataTypes.STRING(20), allowNull: false },
    first_at: { type: DataTypes.DATE, allowNull: false },
    last_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("plan_revision_authors", ["revision_id", "user_id", "act"], { unique: true });
  for (const [action, act] of ACTS) {
    await qi.sequelize.query(
      `INSERT INTO plan_revision_authors (revision_id, user_id, act, first_at, last_at)
       SELECT r.id, e.user_id, $act, MIN(e.created_at), MAX(e.created_at)
       FROM audit_events e
       JOIN plan_revisions r ON r.plan_id = e.entity_id AND r.revision = ${REVISION_OF_EVENT[sqlDialectOf(qi.sequelize)]}
       WHERE e.entity = 'plan' AND e.action = $action AND e.user_id IS NOT NULL
       GROUP BY r.id, e.user_id
       ON CONFLICT DO NOTHING`,
      { bind: { act, action } },
    );
  }
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("plan_revision_authors");
};
