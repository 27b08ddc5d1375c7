// The stamp of each print (the printed line, the live band) over a kept sealed body: its fonts start
// from a fixed set of glyphs whose program is encoded once, and take in any other character a name needs.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { buildSealedBody, stampPrint } from "~/plans/pdf/build.server";
import { printablePlanFixture } from "../../../tests/support/printable-plan";

function text(bytes: Uint8Array) {
  const file = path.join(os.tmpdir(), `plumbline-stamp-${process.pid}-${Date.now()}-${Math.random()}.pdf`);
  fs.writeFileSync(file, bytes);
  try {
    const r = spawnSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" });
    if (r.status !== 0) throw new Error(r.stderr);
    return r.stdout.replace(/\s+/g, " ");
  } finally {
    fs.rmSync(file, { force: true });
  }
}

describe("stamping a kept sealed body", () => {
  it("prints each reader's name, in any letters the font has, on the same kept body", async () => {
    const plan = printablePlanFixture();
    const body = await buildSealedBody(plan);
    const names = ["Robin Rigger", "Łucja Wróbel-Öztürk", "Pat Planner"];
    for (const printedBy of names) {
      const printedAt = "2026-11-30T08:05:00.000Z";
      const printed = text(await stampPrint(body, { ...plan, printedBy, printedAt }));
      expect(printed).toContain(`Printed 2026-11-30 08:05 UTC by ${printedBy}`);
      for (const other of names.filter((n) => n !== printedBy)) expect(printed).not.toContain(other);
      expect(printed).toContain(plan.title);
    }
  });
});
