import { QueryTypes } from "sequelize";
import type { Migration } from "../umzug";

/**
 * Plans lift the component's mass and CoG unless the planner overrides them with a reason, kept under
 * `override` in the plan's copy of the load. Before, the editor moved the copy's CoG with no record. A draft,
 * returned or in-review revision still on its component's current version whose CoG differs from the
 * component's gets that CoG as an override saying so (the planner confirms or removes it); the copy goes back
 * to the component's CoG. Approved and older revisions keep their copies as sealed. No schema change.
 */
const EDITABLE = "'draft', 'returned', 'in_review'";
const TOL_M = 5e-4;
const REASON =
  "Moved in the plan editor before an override needed a reason: confirm it with the reason, or use the component's CoG.";

type Row = {
  id: number;
  load_snapshot: string;
  cog_x_m: number;
  cog_y_m: number;
  cog_z_m: number;
};

export const up: Migration = async ({ context: qi }) => {
  const rows = await qi.sequelize.query<Row>(
    `SELECT r.id, r.load_snapshot, c.cog_x_m, c.cog_y_m, c.cog_z_m
       FROM plan_revisions r JOIN components c ON c.id = r.component_id AND c.version = r.component_version
      WHERE r.status IN (${EDITABLE})`,
    { type: QueryTypes.SELECT },
  );
  for (const row of rows) {
    const load = JSON.parse(row.load_snapshot) as { cog?: { x: number; y: number; z: number }; override?: unknown };
    if (!load.cog || load.override !== undefined) continue;
    const component = { x: row.cog_x_m, y: row.cog_y_m, z: row.cog_z_m };
    const moved = Math.hypot(load.cog.x - component.x, load.cog.y - component.y, load.cog.z - component.z);
    if (!(moved > TOL_M)) continue;
    const next = { ...load, cog: component, override: { massKg: null, cog: load.cog, reason: REASON } };
    await qi.sequelize.query("UPDATE plan_revisions SET load_snapshot = $json WHERE id = $id", {
      bind: { json: JSON.stringify(next), id: row.id },
    });
  }
};

/** Folds every override back into the copy of the load (the figures the plan lifts), as before overrides. */
export const down: Migration = async ({ context: qi }) => {
  const rows = await qi.sequelize.query<{ id: number; load_snapshot: string }>(
    "SELECT id, load_snapshot FROM plan_revisions WHERE load_snapshot LIKE '%\"override\"%'",
    { type: QueryTypes.SELECT },
  );
  for (const row of rows) {
    const { override, ...load } = JSON.parse(row.load_snapshot) as {
      override?: { massKg?: number | null; cog?: unknown };
      massKg?: number;
      cog?: unknown;
    };
    if (!override) continue;
    const next = { ...load, massKg: override.massKg ?? load.massKg, cog: override.cog ?? load.cog };
    await qi.sequelize.query("UPDATE plan_revisions SET load_snapshot = $json WHERE id = $id", {
      bind: { json: JSON.stringify(next), id: row.id },
    });
  }
};
