// Sections 1 and 2 of the printed plan: the plan and its approval (with the fingerprint and the QR
// code), and the load.
import { COG_SOURCE_LABELS, MASS_SOURCE_LABELS } from "~/loads/component-definition";
import { overrideSentences } from "~/plans/load-override";
import { loadText, statusWords, utcText } from "~/plans/pdf/format";
import { drawQrCode, type QrCode } from "~/plans/pdf/qr.server";
import {
  BRASS,
  CONTENT_W,
  hex,
  INK,
  INK_SOFT,
  LEFT,
  RIGHT,
  RULE,
  STEEL,
  STEEL_WASH,
  TONE,
  WHITE,
  type Flow,
} from "~/plans/pdf/layout.server";
import { facts, heading, type Fact } from "~/plans/pdf/tables.server";
import type { PrintablePlan } from "~/plans/printable";
import { formatLength, formatMass } from "~/utils/format";

export function titleBlock(flow: Flow, plan: PrintablePlan, qr: QrCode) {
  const { regular, semibold } = flow.fonts;
  heading(flow, 1, "Plan and approval", 200);
  const colW = (CONTENT_W - 16) / 2;
  const left: Fact[] = [
    ["Plan", plan.title],
    ["Site", [plan.site.name, plan.site.customer, plan.site.address].filter((s) => s.trim() !== "").join("\n")],
  ];
  const right: Fact[] = [
    ["Job", `${plan.job.workOrder}: ${plan.job.title}`],
    ["Revision", `Revision ${plan.revision}`],
    ["Status", statusWords(plan.status)],
    ["Planner", plan.planner.name],
  ];
  const h = Math.max(
    facts(flow, left, LEFT, colW, flow.y, false),
    facts(flow, right, LEFT + colW + 16, colW, flow.y, false),
  );
  flow.ensure(h + 4);
  facts(flow, left, LEFT, colW, flow.y, true);
  facts(flow, right, LEFT + colW + 16, colW, flow.y, true);
  flow.y -= h + 6;

  // The approval block: who approved, as what, when; the fingerprint and the QR code to check it.
  const qrSize = 92;
  const qrColW = 136;
  const fieldsW = CONTENT_W - qrColW - 20;
  const approval: Fact[] = [
    ["Approved by", plan.approval.name],
    ["Role", plan.approval.role],
    ["When", utcText(plan.approval.approvedAt)],
    ["Comment", plan.approval.comment.trim() || "No comment."],
  ];
  const selfText = plan.approval.selfApproved
    ? `${plan.approval.name} planned this lift and approved it themselves, under ${plan.organisationName}'s setting for one-person firms (no second person checked it).`
    : "";
  const statusNote =
    plan.status === "superseded"
      ? "A later revision has replaced this one: do not use this print for the lift."
      : plan.status === "cancelled"
        ? "This plan has been cancelled: do not use this print for the lift."
        : "";
  const fpStyle = { font: regular, size: 7.5, color: INK };
  const fingerprintLines = flow.ts.wrap(plan.fingerprint, fpStyle.font, fpStyle.size, fieldsW - 8);
  const noteStyle = { font: semibold, size: 8, color: TONE.warn };
  const selfLines = selfText ? flow.ts.wrap(selfText, noteStyle.font, noteStyle.size, fieldsW - 12) : [];
  const statusLines = statusNote ? flow.ts.wrap(statusNote, noteStyle.font, noteStyle.size, fieldsW - 12) : [];
  const fieldsH = facts(flow, approval, 0, fieldsW - 8, 0, false, 70);
  const notesH =
    (selfLines.length + statusLines.length) * 10.5 + (selfLines.length ? 6 : 0) + (statusLines.length ? 6 : 0);
  const fpH = 10 + fingerprintLines.length * 9.5;
  const captionStyle = { font: semibold, size: 7, color: INK };
  const urlStyle = { font: regular, size: 5.5, color: INK_SOFT };
  const caption = flow.ts.wrap(
    "Scan to check this is the current approved revision",
    captionStyle.font,
    captionStyle.size,
    qrColW - 8,
  );
  const urlLines = flow.ts.wrap(plan.verifyUrl, urlStyle.font, urlStyle.size, qrColW - 8);
  const qrColH = qrSize + 4 + caption.length * 8.5 + urlLines.length * 7 + 2;
  const boxH = Math.max(18 + fieldsH + notesH + fpH, qrColH + 12) + 6;
  flow.ensure(boxH + 4);
  const top = flow.y;
  const page = flow.page;
  page.drawRectangle({
    x: LEFT,
    y: top - boxH,
    width: CONTENT_W,
    height: boxH,
    borderColor: STEEL,
    borderWidth: 1,
    color: WHITE,
  });
  page.drawRectangle({ x: LEFT, y: top - 14, width: CONTENT_W - qrColW - 6, height: 14, color: STEEL_WASH });
  flow.text("APPROVAL", LEFT + 6, top - 10, { font: semibold, size: 7.5, color: BRASS });
  let y = top - 18;
  y -= facts(flow, approval, LEFT + 6, fieldsW - 8, y, true, 70);
  const note = (lines: string[]) => {
    if (lines.length === 0) return;
    const h = lines.length * 10.5 + 3;
    page.drawRectangle({
      x: LEFT + 6,
      y: y - h,
      width: fieldsW - 6,
      height: h,
      color: hex("#fbefd9"),
      borderColor: TONE.warn,
      borderWidth: 0.8,
    });
    lines.forEach((l, i) =>
      page.drawText(l, { x: LEFT + 11, y: y - 9.5 - i * 10.5, size: 8, font: semibold, color: TONE.warn }),
    );
    y -= h + 3;
  };
  note(selfLines);
  note(statusLines);
  y = Math.min(y - 2, top - boxH + fpH + 4);
  flow.text("FINGERPRINT (SHA-256) OF THIS REVISION", LEFT + 6, y - 7, { font: semibold, size: 6.5, color: STEEL });
  fingerprintLines.forEach((l, i) =>
    page.drawText(l, { x: LEFT + 6, y: y - 16.5 - i * 9.5, size: fpStyle.size, font: fpStyle.font, color: INK }),
  );

  const qrX = RIGHT - qrColW + (qrColW - qrSize) / 2 - 2;
  page.drawLine({
    start: { x: RIGHT - qrColW - 6, y: top - 4 },
    end: { x: RIGHT - qrColW - 6, y: top - boxH + 4 },
    thickness: 0.5,
    color: RULE,
  });
  drawQrCode(page, qr, qrX, top - 6 - qrSize, qrSize);
  let cy = top - 6 - qrSize - 2;
  for (const l of caption) {
    cy -= 8.5;
    flow.text(l, RIGHT - qrColW / 2 - 2, cy, captionStyle, "center");
  }
  for (const l of urlLines) {
    cy -= 7;
    flow.text(l, RIGHT - qrColW / 2 - 2, cy, urlStyle, "center");
  }
  flow.y = top - boxH - 4;
}

export function loadSection(flow: Flow, plan: PrintablePlan) {
  const s = plan.snapshot;
  const units = plan.units;
  const mark = plan.loadOverride ?? null;
  heading(flow, 2, "The load", 70);
  const withContingency = s.massKg * (1 + s.contingencyPct / 100);
  const colW = (CONTENT_W - 16) / 2;
  const left: Fact[] = [
    ["Component", s.name],
    [
      "Mass",
      mark?.mass
        ? `${formatMass(s.massKg, units)}, planner's override (differs from the component)`
        : `${formatMass(s.massKg, units)}, ${MASS_SOURCE_LABELS[s.massSource].toLowerCase()}${s.massNote.trim() ? ` (${s.massNote.trim()})` : ""}`,
    ],
    ["Contingency", `${s.contingencyPct.toLocaleString("en-GB")} %`],
    ["With contingency", loadText(withContingency, units)],
  ];
  const right: Fact[] = [
    [
      "CoG (x, y, z)",
      `${formatLength(s.cog.x, units)}, ${formatLength(s.cog.y, units)}, ${formatLength(s.cog.z, units)}`,
    ],
    [
      "CoG source",
      mark?.cog
        ? "Planner's override (differs from the component)"
        : `${COG_SOURCE_LABELS[s.cogSource]}${s.cogNote.trim() ? ` (${s.cogNote.trim()})` : ""}`,
    ],
    [
      "Size (L × W × H)",
      `${formatLength(s.lengthM, units)} × ${formatLength(s.widthM, units)} × ${formatLength(s.heightM, units)}`,
    ],
  ];
  const h = Math.max(
    facts(flow, left, LEFT, colW, flow.y, false, 82),
    facts(flow, right, LEFT + colW + 16, colW, flow.y, false, 82),
  );
  flow.ensure(h);
  facts(flow, left, LEFT, colW, flow.y, true, 82);
  facts(flow, right, LEFT + colW + 16, colW, flow.y, true, 82);
  flow.y -= h + 2;
  if (mark) {
    flow.paragraph(
      "Differs from the component:",
      { font: flow.fonts.semibold, size: 8.5, color: INK },
      { gapAfter: 1 },
    );
    for (const line of overrideSentences(mark, units))
      flow.paragraph(line, { font: flow.fonts.regular, size: 8.5, color: INK }, { gapAfter: 1 });
    flow.y -= 2;
  }
}
