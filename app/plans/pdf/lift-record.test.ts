// The lift record of a load lifted on figures the planner overrode names the override, as the plan did.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import type { LoadOverrideMark } from "~/plans/load-override";
import { buildLiftRecordPdf } from "~/plans/pdf/lift-record.server";
import { printablePlanFixture } from "../../../tests/support/printable-plan";

function pdfText(bytes: Uint8Array) {
  const file = path.join(os.tmpdir(), `plumbline-record-unit-${process.pid}-${Date.now()}.pdf`);
  fs.writeFileSync(file, bytes);
  try {
    return spawnSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" }).stdout.replace(/\s+/g, " ");
  } finally {
    fs.rmSync(file, { force: true });
  }
}

const record = (loadOverride: LoadOverrideMark | null) => ({
  plan: printablePlanFixture({ loadOverride }),
  liftedAt: "2025-06-02T13:05:00.000Z",
  recordedBy: "Robin Rigger",
  notes: "",
  nearMiss: false,
  nearMissDetails: "",
  document: null,
  photos: [],
});

describe("the lift record's load line", () => {
  it("names the planner's override of the mass, with both figures and the reason", async () => {
    const text = pdfText(
      await buildLiftRecordPdf(
        record({ mass: { plannedKg: 2400, componentKg: 2000 }, cog: null, reason: "Weighed on the crane's load cell" }),
      ),
    );
    expect(text).toContain("Mass differs from the component: 2,400 kg as planned, 2,000 kg on the component.");
    expect(text).toContain("Reason for the override: Weighed on the crane's load cell");
  });

  it("says nothing of an override when the load is the component's", async () => {
    expect(pdfText(await buildLiftRecordPdf(record(null)))).not.toContain("differs from the component");
  });
});
