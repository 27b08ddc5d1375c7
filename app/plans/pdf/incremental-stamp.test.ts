// Each print of a kept sealed body is the body's own bytes followed by an incremental update (ISO 32000-1
// §7.5.6) holding the stamp: checked against the stamp drawn in full, read back the way a person or a
// checker would (poppler's pdftotext and pdftoppm, and pdf-lib).
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { PDFDocument } from "pdf-lib";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { LiveGearState } from "~/plans/live-state";
import { buildSealedBody, stampPrint, stampPrintInFull } from "~/plans/pdf/build.server";
import { stampIncrementally } from "~/plans/pdf/incremental-stamp.server";
import type { PrintablePlan } from "~/plans/printable";
import { printablePlanFixture } from "../../../tests/support/printable-plan";

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plumbline-incremental-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

let n = 0;
function tool(cmd: string, bytes: Uint8Array, args: string[]): string {
  const file = path.join(dir, `print-${n++}.pdf`);
  fs.writeFileSync(file, bytes);
  const r = spawnSync(cmd, [...args, file, ...(cmd === "pdftotext" ? ["-"] : [])], { encoding: "utf8" });
  if (r.status !== 0) throw new Error(`${cmd} failed: ${r.stderr}`);
  return r.stdout;
}
const layoutText = (bytes: Uint8Array) => tool("pdftotext", bytes, ["-layout"]);
const pages = (bytes: Uint8Array) => Number(/Pages:\s+(\d+)/.exec(tool("pdfinfo", bytes, []))![1]);
const count = (text: string, phrase: string) => text.replace(/\s+/g, " ").split(phrase).length - 1;

/** Page 1 rendered at 50 dpi by poppler, as PPM bytes. */
function rendered(bytes: Uint8Array): Buffer {
  const file = path.join(dir, `render-${n++}.pdf`);
  fs.writeFileSync(file, bytes);
  const r = spawnSync("pdftoppm", ["-r", "50", "-f", "1", "-l", "1", file]);
  if (r.status !== 0) throw new Error(`pdftoppm failed: ${r.stderr}`);
  return r.stdout;
}

const fit: LiveGearState = { fit: true, checkedAt: "2026-11-30T07:58:00.000Z", liftDate: "2026-12-01", problems: [] };
const quarantined: LiveGearState = {
  fit: false,
  checkedAt: "2026-11-30T09:12:00.000Z",
  liftDate: "2026-12-01",
  problems: [
    {
      itemId: 7,
      itemCode: "EB-M20-03",
      position: "Lug A",
      kind: "quarantined",
      since: "2026-11-30T09:00:00.000Z",
      message: "EB-M20-03 (Lug A) is quarantined since 2026-11-30 09:00 UTC.",
      detail: "Thread damaged",
    },
  ],
};

describe("a print of a kept body as an incremental update", () => {
  const plan = printablePlanFixture({ live: fit, printedAt: "2026-11-30T08:05:00.000Z", printedBy: "Robin Rigger" });
  let body: Uint8Array;

  beforeAll(async () => {
    body = await buildSealedBody(plan);
  });

  it("is the body's bytes unchanged, then an update whose trailer points back to the body's xref table", async () => {
    const printed = (await stampIncrementally(body, plan))!;
    expect(printed).not.toBeNull();
    expect(Buffer.from(printed.subarray(0, body.length)).equals(Buffer.from(body))).toBe(true);
    const update = Buffer.from(printed.subarray(body.length)).toString("latin1");
    const bodyXref = /startxref\s+(\d+)\s+%%EOF\s*$/.exec(Buffer.from(body).toString("latin1"))![1];
    expect(update).toMatch(new RegExp(`/Prev ${bodyXref}\\n`));
    // Only the stamp stream and the information dictionary: a few hundred bytes, not the document again.
    expect(update.length).toBeLessThan(4000);
    expect(update.match(/ 0 obj\n/g)).toHaveLength(2);
  });

  it("shows the same text on every page as the stamp drawn in full, and renders the same", async () => {
    for (const live of [fit, quarantined]) {
      const p = { ...plan, live };
      const incremental = (await stampIncrementally(body, p))!;
      const full = await stampPrintInFull(body, p);
      expect(layoutText(incremental)).toBe(layoutText(full));
      expect(rendered(incremental).equals(rendered(full))).toBe(true);
    }
  });

  it("says FIT TO LIFT, or NOT FIT TO LIFT naming the quarantined item on a reprint, on every page", async () => {
    const first = await stampPrint(body, plan);
    const n = pages(first);
    expect(n).toBeGreaterThan(1);
    const firstText = layoutText(first);
    expect(count(firstText, "FIT TO LIFT as checked 2026-11-30 07:58 UTC")).toBe(n);
    expect(firstText).not.toContain("NOT FIT TO LIFT");

    const reprint = await stampPrint(body, { ...plan, live: quarantined, printedBy: "Pat Planner" });
    expect(Buffer.from(reprint.subarray(0, body.length)).equals(Buffer.from(body))).toBe(true);
    const text = layoutText(reprint);
    expect(count(text, "NOT FIT TO LIFT as checked 2026-11-30 09:12 UTC: do not lift to this plan")).toBe(n);
    expect(count(text, "EB-M20-03 (Lug A) is quarantined")).toBe(n);
    expect(count(text, "Printed 2026-11-30 08:05 UTC by Pat Planner")).toBe(n);
    expect(text).not.toContain("Robin Rigger");
  });

  it("carries the print's dates and keeps the title, and pdf-lib reads it with every page", async () => {
    const printed = await stampPrint(body, plan);
    const doc = await PDFDocument.load(printed, { updateMetadata: false });
    expect(doc.getPageCount()).toBe(pages(printed));
    expect(doc.getCreationDate()?.toISOString()).toBe("2026-11-30T08:05:00.000Z");
    expect(doc.getModificationDate()?.toISOString()).toBe("2026-11-30T08:05:00.000Z");
    expect(doc.getTitle()).toBe(`${plan.title} (revision ${plan.revision})`);
  });

  it("prints a name with letters beyond the base subset in full, correctly", async () => {
    const p: PrintablePlan = { ...plan, printedBy: "Łucja Wróbel-Öztürk" };
    expect(await stampIncrementally(body, p)).toBeNull();
    const printed = await stampPrint(body, p);
    expect(count(layoutText(printed), "Printed 2026-11-30 08:05 UTC by Łucja Wróbel-Öztürk")).toBe(pages(printed));
  });

  it("leaves a body kept by a build without room for the stamp (an xref stream, no marked stream) to the full stamp", async () => {
    const compressed = await (await PDFDocument.load(body, { updateMetadata: false })).save();
    expect(await stampIncrementally(compressed, plan)).toBeNull();
    expect(count(layoutText(await stampPrint(compressed, plan)), "by Robin Rigger")).toBe(pages(compressed));
    const unmarked = Buffer.from(
      Buffer.from(body).toString("latin1").replace("/PlumblineStamp true", "/PlumblineStamp null"),
      "latin1",
    );
    expect(await stampIncrementally(unmarked, plan)).toBeNull();
    expect(await stampIncrementally(new TextEncoder().encode("%PDF-1.7 not a body"), plan)).toBeNull();
  });
});
