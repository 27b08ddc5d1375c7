// The record of a lift as its own A4 PDF: the plan it was made to (from the sealed record), when the
// load was landed in the site's time, who ticked each check and released each hold point and when, the
// gear confirmed on the hook, who was there, notes, a near miss and the photos taken.
import { PDFDocument, type PDFImage } from "pdf-lib";
import { PERSON_ROLE_LABELS, type PersonRole } from "~/plans/document";
import { chromeFor, headerAndFooter } from "~/plans/pdf/chrome.server";
import { embedBarlow } from "~/plans/pdf/fonts.server";
import { utcText } from "~/plans/pdf/format";
import {
  A4_HEIGHT_PT,
  CONTENT_W,
  Flow,
  INK,
  LEFT,
  MARGIN_BOTTOM,
  MARGIN_TOP,
  RULE,
  STEEL,
  TONE,
  Typesetter,
} from "~/plans/pdf/layout.server";
import { overrideSentences } from "~/plans/load-override";
import { cell, facts, heading, table, type Column, type Fact } from "~/plans/pdf/tables.server";
import { siteTimeText, type LiftRecordDocument } from "~/plans/lift-record";
import type { PrintablePlan } from "~/plans/printable";

export type PrintableLiftRecord = {
  /** The plan the lift was made to (status completed, with `liftRecord` set). */
  plan: PrintablePlan;
  liftedAt: string;
  recordedBy: string;
  notes: string;
  nearMiss: boolean;
  nearMissDetails: string;
  /** Null for a record made before documents were kept. */
  document: LiftRecordDocument | null;
  photos: Array<{ bytes: Uint8Array; type: "png" | "jpeg" }>;
};

const PHOTO_W = (CONTENT_W - 12) / 2;

/** The lift record as an A4 PDF (every page: header, the caution, page numbers, the plan's fingerprint). */
export async function buildLiftRecordPdf(record: PrintableLiftRecord): Promise<Uint8Array> {
  const { plan, document: doc } = record;
  const pdf = await PDFDocument.create();
  const { fonts, codePoints, files } = await embedBarlow(pdf, `${plan.fingerprint}/lift-record`);
  const ts = new Typesetter(codePoints, files);
  pdf.setTitle(ts.clean(`Lift record: ${plan.title} (revision ${plan.revision})`));
  pdf.setAuthor(ts.clean(plan.organisationName));
  pdf.setCreator("Plumbline");
  pdf.setProducer("Plumbline");
  const printedAt = new Date(plan.printedAt);
  if (!Number.isNaN(printedAt.getTime())) {
    pdf.setCreationDate(printedAt);
    pdf.setModificationDate(printedAt);
  }
  const chrome = chromeFor(plan, fonts, ts, "LIFT RECORD");
  const flow = new Flow(
    pdf,
    fonts,
    ts,
    A4_HEIGHT_PT - MARGIN_TOP - chrome.headerH - 4,
    MARGIN_BOTTOM + chrome.footerH + 8,
  );
  const zone = doc?.timeZone ?? "UTC";
  const site = (iso: string) => siteTimeText(iso, zone);
  const body = { font: fonts.regular, size: 8.5, color: INK };
  const strong = { font: fonts.semibold, size: 8.5, color: INK };

  heading(flow, 1, "The lift", 80);
  const about: Fact[] = [
    ["Plan", `${plan.title}, revision ${plan.revision}`],
    ["Approved by", `${plan.approval.name} (${plan.approval.role}), ${utcText(plan.approval.approvedAt)}`],
    ["Landed", `${site(record.liftedAt)}; ${utcText(record.liftedAt)}`],
    ["Recorded by", record.recordedBy],
    ["Site", [plan.site.name, plan.site.customer].filter((s) => s.trim() !== "").join(", ")],
    // A load lifted on figures the planner overrode carries the approved mark here too.
    ...(plan.loadOverride ? [["Load", overrideSentences(plan.loadOverride, plan.units).join(" ")] satisfies Fact] : []),
  ];
  flow.ensure(facts(flow, about, LEFT, CONTENT_W, flow.y, false, 80));
  flow.y -= facts(flow, about, LEFT, CONTENT_W, flow.y, true, 80) + 4;
  if (record.nearMiss)
    flow.paragraph(`Near miss: ${record.nearMissDetails}`, { font: fonts.semibold, size: 9, color: TONE.fail });
  if (!doc)
    flow.paragraph(
      "This lift was recorded before records kept who ticked and released what: only the checklist as a whole was recorded.",
      body,
    );

  if (doc) {
    heading(flow, 2, "Pre-lift checks", 60);
    const checkCols: Column[] = [
      { title: "Check", width: CONTENT_W - 250 },
      { title: "Ticked by", width: 100 },
      { title: "When (site time)", width: 150 },
    ];
    table(
      flow,
      checkCols,
      doc.ticks.map((t) => ({
        cells: [
          cell(flow, checkCols[0]!.width, [{ text: t.text, style: body }]),
          cell(flow, checkCols[1]!.width, [{ text: t.by, style: body }]),
          cell(flow, checkCols[2]!.width, [{ text: site(t.at), style: body }]),
        ],
      })),
      "Pre-lift checks",
    );

    heading(flow, 3, "Hold points", 50);
    if (doc.holdPoints.length === 0) flow.paragraph("The plan's sequence has no hold points.", body);
    else {
      const holdCols: Column[] = [
        { title: "Step", width: 34, align: "right" },
        { title: "Hold point", width: CONTENT_W - 284 },
        { title: "Released by", width: 100 },
        { title: "When (site time)", width: 150 },
      ];
      table(
        flow,
        holdCols,
        doc.holdPoints.map((h) => ({
          cells: [
            cell(flow, holdCols[0]!.width, [{ text: String(h.step), style: strong }]),
            cell(flow, holdCols[1]!.width, [{ text: h.title, style: body }]),
            cell(flow, holdCols[2]!.width, [{ text: h.releasedBy, style: body }]),
            cell(flow, holdCols[3]!.width, [{ text: site(h.at), style: body }]),
          ],
        })),
        "Hold points",
      );
    }

    heading(flow, 4, "Gear on the hook, checked by its id", 50);
    const gearCols: Column[] = [
      { title: "Position", width: 110 },
      { title: "Item id", width: 90 },
      { title: "As sealed in the plan", width: CONTENT_W - 200 },
    ];
    table(
      flow,
      gearCols,
      doc.gear.map((g) => {
        const sealed = plan.schedule.find((s) => s.itemCode === g.itemCode);
        return {
          cells: [
            cell(flow, gearCols[0]!.width, [{ text: g.position, style: body }]),
            cell(flow, gearCols[1]!.width, [{ text: g.itemCode, style: strong }]),
            cell(flow, gearCols[2]!.width, [{ text: sealed?.description ?? "", style: body }]),
          ],
        };
      }),
      "Gear on the hook",
    );

    heading(flow, 5, "People", 40);
    if (doc.people.length === 0) flow.paragraph("The plan named nobody.", body);
    else
      for (const p of doc.people)
        flow.paragraph(
          `${p.name}, ${PERSON_ROLE_LABELS[p.role as PersonRole] ?? p.role}: ${p.present ? "there" : "not there"}`,
          body,
          { gapAfter: 1 },
        );
  }

  heading(flow, doc ? 6 : 2, "Notes and photos", 40);
  flow.paragraph(record.notes.trim() || "No notes.", body, { gapAfter: 6 });
  const images: PDFImage[] = [];
  const unreadable: number[] = [];
  for (const [i, photo] of record.photos.entries()) {
    try {
      images.push(photo.type === "png" ? await pdf.embedPng(photo.bytes) : await pdf.embedJpg(photo.bytes));
    } catch {
      // A file that starts like an image but is not a whole one is named, never allowed to stop the record.
      unreadable.push(i + 1);
    }
  }
  for (let i = 0; i < images.length; i += 2) {
    const row = images.slice(i, i + 2).map((img) => img.scaleToFit(PHOTO_W, 220));
    const h = Math.max(...row.map((r) => r.height));
    flow.ensure(h + 8);
    row.forEach((size, k) => {
      const x = LEFT + k * (PHOTO_W + 12);
      flow.page.drawImage(images[i + k]!, { x, y: flow.y - size.height, width: size.width, height: size.height });
      flow.page.drawRectangle({
        x,
        y: flow.y - size.height,
        width: size.width,
        height: size.height,
        borderColor: RULE,
        borderWidth: 0.6,
      });
    });
    flow.y -= h + 8;
  }
  if (record.photos.length === 0) flow.paragraph("No photos were taken.", { ...body, color: STEEL });
  if (unreadable.length)
    flow.paragraph(
      `Photo ${unreadable.join(", ")} could not be read as an image; the file is kept with the record on the plan page.`,
      { ...body, color: STEEL },
    );

  headerAndFooter(pdf, flow.pages, fonts, ts, plan, chrome);
  return pdf.save();
}
