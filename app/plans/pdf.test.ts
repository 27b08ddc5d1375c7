// The printed plan, read back the way a person or a checker would: text with poppler's pdftotext,
// fonts with pdffonts, the QR code decoded from a rendered page.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import jsQR from "jsqr";
import { PNG } from "pngjs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { PLAN_CAUTION } from "~/plans/document";
import { buildPlanPdf } from "~/plans/pdf/build.server";
import { drawingScale } from "~/plans/pdf/drawing.server";
import fontkit from "@pdf-lib/fontkit";
import { cachingFontkit, loadFontFiles, PLAIN_GLYPHS, printableText } from "~/plans/pdf/fonts.server";
import { PT_MM } from "~/plans/pdf/layout.server";
import type { PrintablePlan } from "~/plans/printable";
import { longPrintablePlan, printablePlanFixture } from "../../tests/support/printable-plan";

type Layout = (text: string, features?: unknown) => { glyphs: Array<{ id: number }> };

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plumbline-pdf-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function run(cmd: string, args: string[]): string {
  const r = spawnSync(cmd, args, { encoding: "utf8" });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(" ")} failed: ${r.stderr}`);
  return r.stdout;
}

async function writePdf(name: string, plan: PrintablePlan) {
  const bytes = await buildPlanPdf(plan);
  const file = path.join(dir, `${name}.pdf`);
  fs.writeFileSync(file, bytes);
  return { file, bytes };
}

const pageCount = (file: string) => Number(/Pages:\s+(\d+)/.exec(run("pdfinfo", [file]))![1]);
const pageText = (file: string, page: number) =>
  run("pdftotext", ["-layout", "-f", String(page), "-l", String(page), file, "-"]);
const allText = (file: string) => run("pdftotext", ["-layout", file, "-"]);
/** Text with every run of white space made one space, so wrapped sentences can be matched whole. */
const flat = (text: string) => text.replace(/\s+/g, " ");

/** Every word's box on every page, in pt (pdftotext -bbox). */
function wordBoxes(file: string) {
  const html = run("pdftotext", ["-bbox", file, "-"]);
  const pages = [...html.matchAll(/<page width="([\d.]+)" height="([\d.]+)">([\s\S]*?)<\/page>/g)];
  return pages.map(([, w, h, body]) => ({
    width: Number(w),
    height: Number(h),
    words: [...body!.matchAll(/xMin="([\d.-]+)" yMin="([\d.-]+)" xMax="([\d.-]+)" yMax="([\d.-]+)">([^<]*)</g)].map(
      (m) => ({
        xMin: Number(m[1]),
        yMin: Number(m[2]),
        xMax: Number(m[3]),
        yMax: Number(m[4]),
        text: m[5]!,
      }),
    ),
  }));
}

const CHECKLIST = [
  "Gear on the hook matches the schedule by id",
  "Every item in date for thorough examination and in service",
  "Briefing held with everyone on the lift",
  "Exclusion zone set and kept",
  "Trial lift made a short way off the floor: load level and steady",
  "Communication checked between signaller and operator",
];

describe("the printed plan of a typical lift (two legs, Furley Engineering 'Sling Load' geometry)", () => {
  const plan = printablePlanFixture();
  let file = "";
  let bytes: Uint8Array = new Uint8Array();
  let text = "";
  let pages = 0;

  beforeAll(async () => {
    ({ file, bytes } = await writePdf("typical", plan));
    text = allText(file);
    pages = pageCount(file);
  });

  it("is an A4 portrait document of a few pages, under 300 KB", () => {
    const info = run("pdfinfo", [file]);
    expect(info).toMatch(/Page size:\s+595\.2\d? x 841\.8\d? pts \(A4\)/);
    expect(pages).toBeGreaterThanOrEqual(2);
    expect(pages).toBeLessThanOrEqual(6);
    expect(bytes.length).toBeLessThan(300 * 1024);
  });

  it("prints the caution, the header and the page number on every page", () => {
    for (let i = 1; i <= pages; i++) {
      const page = flat(pageText(file, i));
      expect(page, `page ${i}`).toContain(flat(PLAN_CAUTION));
      expect(page, `page ${i}`).toContain("Northwold Mechanical Services Ltd");
      expect(page, `page ${i}`).toContain(plan.title);
      expect(page, `page ${i}`).toContain("Job WO-24117");
      expect(page, `page ${i}`).toContain("Revision 3");
      expect(page, `page ${i}`).toContain("APPROVED");
      expect(page, `page ${i}`).toContain(`Page ${i} of ${pages}`);
      expect(page, `page ${i}`).toContain("Fingerprint 3f9a1c0e7b2d4458…");
      expect(page, `page ${i}`).toContain("Printed 2025-05-13 06:55 UTC by Sam Okafor");
    }
  });

  it("names the approver, their role and when, and carries the full fingerprint", () => {
    const t = flat(text);
    expect(t).toMatch(/APPROVED BY Gareth Olumide/);
    expect(t).toMatch(/ROLE Appointed person/);
    expect(t).toContain("2025-05-12 08:40 UTC");
    expect(t).toContain("Keep the skid chocked while landing.");
    expect(t).toContain(plan.fingerprint);
    expect(t).toContain("Scan to check this is the current approved revision");
    expect(t).not.toContain("approved it themselves");
  });

  it("prints the near leg's tension: 1,649.2 kg rounded up to 1,650 (Furley Engineering publishes 1650 kg) and 16.18 kN", () => {
    // 1649.24 kg x 9.80665 m/s2 = 16.1735 kN, rounded up to 16.18 kN; the far leg 565.7 kg -> 566 kg at 45 deg.
    const legA = text.split("\n").find((l) => /^\s*Leg A\s+825 mm/.test(l));
    expect(legA).toBeDefined();
    expect(flat(legA!)).toBe(" Leg A 825 mm 16.18 kN 1,650 14.0° 80.0 %");
    const legB = text.split("\n").find((l) => /^\s*Leg B\s+1,131 mm/.test(l));
    expect(flat(legB!)).toBe(" Leg B 1,131 mm 5.55 kN 566 45.0° 20.0 %");
    // The drawing labels each leg with the same figures.
    expect(flat(text)).toContain("Leg A: 16.18 kN · 1,650 kg");
    expect(flat(text)).toContain("14.0° from vertical");
  });

  it("states one drawing scale for both views (1 pt = 0.3528 mm: 1/72 in, the PostScript point)", () => {
    expect(flat(text)).toMatch(/Both views to one scale: 1:\d+ on A4 printed at actual size/);
    expect(text).toContain("Elevation, looking along y");
    expect(text).toContain("Plan, looking down");
    expect(text).toMatch(/\b500 mm\b/);
  });

  it("prints the load, the schedule with utilisations rounded up, and the checks in words", () => {
    const t = flat(text);
    expect(t).toContain("MASS 2,000 kg, nameplate or manufacturer's");
    expect(t).toContain("WITH CONTINGENCY 2,060 kg");
    expect(t).toContain("1,450 mm × 700 mm × 900 mm");
    // Shackle A: 1,698.7 kg / 2,000 kg = 0.8494 -> 85 %.
    const shackle = text.split("\n").find((l) => l.includes("NW-SH2-11"));
    expect(flat(shackle!)).toContain("2,000 kg 1,699 kg 85 % 2025-09-15");
    expect(t).toMatch(/19 checks: 18 pass, 1 warn, 0 fail/);
    expect(t).toMatch(/WARN Eyebolt at A \(NW-EB30-03\)/);
    expect(t).toContain("Source: DIN 580 annex table");
    expect(t).toContain("Warnings acknowledged before approval");
    expect(t).toContain("Eyebolt is booked in for examination on 28 May");
  });

  it("marks the hold points, lists hazards, the exclusion zone, communication and people", () => {
    const t = flat(text);
    expect(text.match(/HOLD POINT/g)?.length).toBe(2);
    expect(t).toContain("Trial lift a short way off the floor and hold");
    expect(t).toContain("Released by (name, time)");
    expect(t).toContain("Fingers trapped at the eyebolts");
    expect(t).toContain("Barrier 3 m all round the test bed");
    expect(t).toContain("radio channel 3 as back-up");
    expect(t).toMatch(/Tomasz Wren\s+Slinger\/signaller/);
  });

  it("ends with the pre-lift checklist and signature lines for the supervisor, slinger/signaller and operator", () => {
    const last = flat(pageText(file, pages));
    for (const line of CHECKLIST) expect(last).toContain(line);
    expect(last).toMatch(/Role Name Signature Date and time Lift supervisor Slinger\/signaller Crane operator/);
  });

  it("embeds Barlow as subsets (a six-letter tag and '+' before the name)", () => {
    const rows = run("pdffonts", [file])
      .split("\n")
      .slice(2)
      .filter((l) => l.trim() !== "");
    // The sealed body's two weights, and the stamp's two (the printed line and the live band), which the
    // body holds ready for every print's stamp.
    expect(rows.length).toBe(4);
    const names = rows.map((row) => {
      const [name, , , , emb, sub] = row.split(/\s+/);
      expect(name).toMatch(/^[A-Z]{6}\+Barlow-(Regular|SemiBold)$/);
      expect(emb).toBe("yes");
      expect(sub).toBe("yes");
      return name!.slice(7);
    });
    expect(names.sort()).toEqual(["Barlow-Regular", "Barlow-Regular", "Barlow-SemiBold", "Barlow-SemiBold"]);
  });

  it("carries a QR code on page 1 that decodes to the verify URL", () => {
    const prefix = path.join(dir, "page");
    run("pdftoppm", ["-r", "150", "-png", "-f", "1", "-l", "1", file, prefix]);
    const png = PNG.sync.read(fs.readFileSync(`${prefix}-1.png`));
    const code = jsQR(
      new Uint8ClampedArray(png.data.buffer, png.data.byteOffset, png.data.length),
      png.width,
      png.height,
    );
    expect(code?.data).toBe(plan.verifyUrl);
  });

  it("keeps each text's layout per font, with the glyphs a fresh layout of the font gives", () => {
    const files = loadFontFiles();
    for (const bytes of [files.regular, files.semibold]) {
      const font = cachingFontkit.create(bytes);
      const fresh = fontkit.create(bytes) as ReturnType<typeof fontkit.create> & { layout: Layout };
      for (const text of ["Leg A 1,650 kg 16.18 kN", "FIT TO LIFT", "Straße 45° ×"]) {
        const kept = (font as unknown as { layout: Layout }).layout(text, PLAIN_GLYPHS);
        expect((font as unknown as { layout: Layout }).layout(text, PLAIN_GLYPHS)).toBe(kept);
        expect(kept.glyphs.map((g) => g.id)).toEqual(fresh.layout(text, PLAIN_GLYPHS).glyphs.map((g) => g.id));
      }
    }
  });

  it("is the same file every time it is built from the same revision", async () => {
    const again = await buildPlanPdf(printablePlanFixture());
    expect(Buffer.from(again).equals(Buffer.from(bytes))).toBe(true);
  });
});

describe("a long plan (40 steps, 30 hazards, 25 schedule rows)", () => {
  const plan = longPrintablePlan();
  let file = "";
  let pages = 0;

  beforeAll(async () => {
    ({ file } = await writePdf("long", plan));
    pages = pageCount(file);
  });

  it("flows onto more pages, each with the header, caution and page number", () => {
    expect(pages).toBeGreaterThanOrEqual(6);
    for (let i = 1; i <= pages; i++) {
      const page = flat(pageText(file, i));
      expect(page, `page ${i}`).toContain(flat(PLAN_CAUTION));
      expect(page, `page ${i}`).toContain("Northwold Mechanical Services Ltd");
      expect(page, `page ${i}`).toContain("Revision 3");
      expect(page, `page ${i}`).toContain(`Page ${i} of ${pages}`);
    }
  });

  it("prints every step, hazard and schedule row, repeating the table heading on continued pages", () => {
    const t = flat(allText(file));
    for (let i = 1; i <= 40; i++) expect(t).toContain(`Step ${i}:`);
    for (let i = 1; i <= 30; i++) expect(t).toContain(`Hazard ${i}:`);
    for (let i = 1; i <= 25; i++) expect(t).toContain(`NW-LONG-${String(i).padStart(3, "0")}`);
    expect(t.match(/HOLD POINT/g)?.length).toBe(plan.details.sequence.filter((s) => s.holdPoint).length);
    expect(t).toContain("Lift sequence (continued) Step What to do");
    expect(t).toContain("Hazards and controls (continued)");
  });

  it("keeps every word inside the page margins", () => {
    for (const [i, page] of wordBoxes(file).entries()) {
      expect(page.words.length, `page ${i + 1}`).toBeGreaterThan(50);
      for (const w of page.words) {
        expect(w.xMin, `"${w.text}" on page ${i + 1}`).toBeGreaterThanOrEqual(30);
        expect(w.xMax, `"${w.text}" on page ${i + 1}`).toBeLessThanOrEqual(page.width - 30);
        expect(w.yMin, `"${w.text}" on page ${i + 1}`).toBeGreaterThanOrEqual(20);
        expect(w.yMax, `"${w.text}" on page ${i + 1}`).toBeLessThanOrEqual(page.height - 15);
      }
    }
  });
});

describe("what the print says in particular cases", () => {
  it("says so when the planner approved their own plan", async () => {
    const plan = printablePlanFixture({
      approval: {
        name: "Priya Nandakumar",
        role: "Appointed person",
        approvedAt: "2025-05-12T08:40:00.000Z",
        comment: "",
        selfApproved: true,
      },
    });
    const { file } = await writePdf("self", plan);
    const t = flat(allText(file));
    expect(t).toContain(
      "Priya Nandakumar planned this lift and approved it themselves, under Northwold Mechanical Services Ltd's setting for one-person firms",
    );
    expect(t).toContain("COMMENT No comment.");
  });

  it("rounds a utilisation of 0.8701 up to 88 %, never down", async () => {
    const base = printablePlanFixture();
    const plan = printablePlanFixture({
      schedule: [
        ...base.schedule,
        {
          position: "Spare leg",
          itemCode: "NW-ROUND-01",
          description: "Bow shackle 2 t",
          wllKg: 2000,
          loadKg: 1740.2,
          utilisation: 0.8701,
          nextDueOn: "2025-09-15",
        },
      ],
    });
    const { file } = await writePdf("rounding", plan);
    const row = allText(file)
      .split("\n")
      .find((l) => l.includes("NW-ROUND-01"));
    expect(flat(row!)).toContain("2,000 kg 1,741 kg 88 % 2025-09-15");
  });

  it("prints characters the font lacks as plain stand-ins and keeps ° and ×", async () => {
    const odd = "Angle 12° · 2 × M20 → skid ≤ ½ t Σ loads 🙂";
    expect(printableText(odd)).toBe("Angle 12° · 2 × M20 -> skid ≤ ½ t sum  loads ?");
    const plan = printablePlanFixture({
      title: odd,
      details: { ...printablePlanFixture().details, exclusionZone: odd },
    });
    const { file } = await writePdf("glyphs", plan);
    const t = flat(allText(file));
    expect(t).toContain("Angle 12° · 2 × M20 -> skid ≤ ½ t sum loads ?");
  });

  it("says plainly what a bare plan leaves out instead of printing empty tables", async () => {
    const base = printablePlanFixture();
    const plan = printablePlanFixture({
      schedule: [],
      acknowledgements: [],
      results: { ...base.results, checks: undefined },
      details: { ...base.details, hazards: [], people: [], exclusionZone: " ", communication: "" },
    });
    const { file } = await writePdf("bare", plan);
    const t = flat(allText(file));
    expect(t).toContain("No gear is allocated in this plan.");
    expect(t).toContain("No gear was allocated, so no item was checked.");
    expect(t).toContain("No hazards recorded in this plan.");
    expect(t).toContain("No people are named in this plan: name them at the briefing.");
    expect(t.match(/Not stated: agree it at the briefing and write it here\./g)?.length).toBe(2);
  });

  it("warns on every page when the revision has been superseded", async () => {
    const { file } = await writePdf("superseded", printablePlanFixture({ status: "superseded" }));
    const pages = pageCount(file);
    for (let i = 1; i <= pages; i++) expect(flat(pageText(file, i)), `page ${i}`).toContain("SUPERSEDED: NOT FOR USE");
    expect(flat(allText(file))).toContain(
      "A later revision has replaced this one: do not use this print for the lift.",
    );
  });

  it("prints imperial units for an imperial user", async () => {
    const { file } = await writePdf("imperial", printablePlanFixture({ units: "imperial" }));
    const t = flat(allText(file));
    // 2,000 kg / 0.45359237 kg per lb = 4,409.2 lb; 1,649.24 kg = 3,635.9 lb, rounded up to 3,636.
    expect(t).toContain("4,409 lb");
    // 16.18 kN / 4.4482216152605 N per lbf (NIST SP 811) = 3,635.9 lbf, rounded up: the tension in lbf, never kN.
    expect(t).toMatch(/Leg A 32\.\d\d in 3,636 lbf 3,636 14\.0°/);
    expect(t).toContain("Tension (lbf)");
    expect(t).not.toMatch(/\d kN/);
  });

  it("draws a beam lift: vertical drops, the beam and its top leg", async () => {
    const base = printablePlanFixture();
    const drop = (id: string, kg: number, share: number) => ({
      liftPointId: id,
      lengthM: 0.6,
      tensionKn: (kg * 9.80665) / 1000,
      tensionKg: kg,
      angleFromVerticalDeg: 0,
      axisAngleDeg: 0,
      verticalShare: share,
      slack: false,
    });
    // Lever rule for vertical drops (common practice): A is 200 mm and B 800 mm from the CoG, so A takes 800/1000 of 2,000 kg.
    const plan = printablePlanFixture({
      arrangement: {
        kind: "beam",
        mode: "level",
        hookHeightM: 2.6,
        legLengthsM: {},
        liftPointLabels: ["A", "B"],
        beam: { massKg: 120, wllKg: 5000, lengthM: 1.5, dropLengthM: 0.6 },
      },
      results: {
        ...base.results,
        hook: { x: 0, y: 0, z: 2.6 },
        legs: [drop("A", 1600, 0.8), drop("B", 400, 0.2)],
        beam: { massKg: 120, wllKg: 5000, hookMassKg: 2120, topLegs: [{ ...drop("lug", 2120, 1), lengthM: 1.1 }] },
      },
    });
    const { file } = await writePdf("beam", plan);
    const t = flat(allText(file));
    expect(t).toContain("Rigging arrangement: lifting beam with vertical drops");
    expect(t).toContain("Drop A: 15.70 kN · 1,600 kg");
    expect(t).toContain("Top leg: 20.80 kN · 2,120 kg");
    expect(t).toContain("the hook carries 2,120 kg");
  });

  it("draws a register spreader: two top legs from its top lugs, the beam named as the register item", async () => {
    const base = printablePlanFixture();
    const leg = (id: string, kg: number, deg: number) => ({
      liftPointId: id,
      lengthM: 0.6,
      tensionKn: (kg * 9.80665) / 1000,
      tensionKg: kg,
      angleFromVerticalDeg: deg,
      axisAngleDeg: 0,
      verticalShare: 0.5,
      slack: false,
    });
    const lug = (x: number) => ({ x, y: 0, z: 1.5 });
    const plan = printablePlanFixture({
      arrangement: {
        kind: "beam",
        mode: "level",
        hookHeightM: 2.6,
        legLengthsM: {},
        liftPointLabels: ["A", "B"],
        beam: { dropLengthM: 0.6 },
      },
      results: {
        ...base.results,
        hook: { x: 0, y: 0, z: 2.6 },
        legs: [leg("A", 1000, 0), leg("B", 1000, 0)],
        beam: {
          massKg: 85,
          wllKg: 3000,
          hookMassKg: 2085,
          itemCode: "SB-TEST-1",
          topLegs: [leg("lug 1", 1100, 40), leg("lug 2", 1100, 40)],
          placement: {
            axis: { x: 1, y: 0, z: 0 },
            endA: lug(-1),
            endB: lug(1),
            drops: [
              { liftPointId: "A", lugIndex: 0, lug: lug(-0.8), lengthM: 0.6, angleFromVerticalDeg: 0 },
              { liftPointId: "B", lugIndex: 1, lug: lug(0.8), lengthM: 0.6, angleFromVerticalDeg: 0 },
            ],
            topLugs: [lug(-0.9), lug(0.9)],
            cog: lug(0),
            beamZM: 1.5,
          },
        },
      },
    });
    const { file } = await writePdf("spreader", plan);
    const t = flat(allText(file));
    expect(t).toContain("Top leg 1: 10.79 kN · 1,100 kg");
    expect(t).toContain("Top leg 2: 10.79 kN · 1,100 kg");
    expect(t).toContain("Beam: SB-TEST-1 from the register: own mass 85 kg, marked WLL 3,000 kg");
  });
});

describe("drawingScale", () => {
  // 1 pt = 25.4 / 72 mm (PostScript point), so full size is 2834.6 pt per metre.
  it("picks the largest common scale that fits", () => {
    expect(PT_MM).toBeCloseTo(0.3528, 4);
    expect(drawingScale(1000 / PT_MM).denominator).toBe(1);
    expect(drawingScale(120).denominator).toBe(25);
    expect(drawingScale(113.38).denominator).toBe(30);
    expect(drawingScale(10).denominator).toBe(300);
    expect(drawingScale(120).ptPerM).toBeCloseTo(1000 / PT_MM / 25, 9);
  });
});
