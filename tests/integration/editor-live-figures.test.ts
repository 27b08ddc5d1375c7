// The editor's live figures and the server's stored results for the same plan come from one core with one set
// of tables: for every plan of the demo scenario, the input the editor builds in the browser from the picks
// (plans/editor-input.ts) solves to exactly what computePlanResults stores, checks, warnings and leg loads alike.
import { beforeAll, describe, expect, it } from "vitest";
import { createDemoSeeder } from "../../db/seeders";
import { gearPicksByIds } from "~/gear/picks.server";
import { getOrganisationRuleSet, getOrganisationToday } from "~/models/organisation.server";
import { getPlan, Plan } from "~/models/plan.server";
import { getReferenceTables } from "~/models/reference-row.server";
import type { RiggingAllocation } from "~/plans/document";
import { editorArrangementInput } from "~/plans/editor-input";
import { computePlanResults } from "~/plans/results.server";
import { solveArrangement } from "~/statics/arrangement";
import { sequelize } from "~/utils/db.server";

function allocatedIds(rigging: RiggingAllocation) {
  const ids: number[] = [];
  for (const leg of Object.values(rigging.legs))
    for (const id of [leg.eyeboltItemId, leg.shackleItemId, leg.slingItemId]) if (id !== undefined) ids.push(id);
  for (const id of [rigging.masterLinkItemId, rigging.craneItemId, rigging.beamItemId])
    if (id !== undefined) ids.push(id);
  return ids;
}

/** JSON as it travels: the stored results are read back from JSON, so undefined members are gone. */
const asJson = (value: unknown) => JSON.parse(JSON.stringify(value)) as unknown;

let plans: Plan[] = [];
beforeAll(async () => {
  await createDemoSeeder(sequelize).up();
  plans = await Plan.findAll({ order: [["id", "ASC"]] });
});

describe("the editor's input gives the server's results", () => {
  it("for every demo plan, bridle and beam, level and given lengths", async () => {
    expect(plans.length).toBeGreaterThan(2);
    const tables = await getReferenceTables();
    const kinds = new Set<string>();
    let withGear = 0;
    for (const row of plans) {
      const found = (await getPlan(row.organisationId, row.id))!;
      const { revision } = found;
      const ruleSet = await getOrganisationRuleSet(row.organisationId);
      const todayIso = await getOrganisationToday(row.organisationId);
      const picks = await gearPicksByIds(row.organisationId, allocatedIds(revision.rigging), tables, ruleSet);
      const server = await computePlanResults(
        revision.snapshot,
        revision.arrangement,
        revision.rigging,
        row.organisationId,
        todayIso,
        { details: revision.details, tables, ruleSet },
      );
      if (server.status === 400) continue; // an allocation the server refuses has no figures to compare
      const edit = {
        cog: revision.snapshot.cog,
        override: revision.loadOverride,
        liftPoints: revision.snapshot.liftPoints,
        arrangement: revision.arrangement,
        rigging: revision.rigging,
      };
      const input = editorArrangementInput(edit, revision.snapshot, {
        picks: new Map(picks.map((p) => [p.id, p])),
        details: revision.details,
        ruleSet,
        todayIso,
        tables,
      });
      const live = solveArrangement(input, tables);
      kinds.add(revision.arrangement.kind === "beam" ? "beam" : `bridle ${revision.arrangement.mode ?? "level"}`);
      if (allocatedIds(revision.rigging).length > 0) withGear++;
      expect(asJson({ status: live.status, body: live.body }), `plan ${row.id} ${row.title}`).toEqual(
        asJson({ status: server.status, body: server.body }),
      );
    }
    expect(withGear).toBeGreaterThan(0);
    expect(kinds.size).toBeGreaterThan(1);
  });
});
