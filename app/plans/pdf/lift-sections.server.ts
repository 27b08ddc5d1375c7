// Sections 6 to 9 of the printed plan: the sequence with its hold points, hazards and controls, the
// exclusion zone, communication and people, and the pre-lift checklist with its sign-off.
import { PERSON_ROLE_LABELS } from "~/plans/document";
import {
  BRASS,
  CONTENT_W,
  INK,
  INK_SOFT,
  LEFT,
  RIGHT,
  RULE,
  STEEL,
  STEEL_WASH,
  type Flow,
} from "~/plans/pdf/layout.server";
import { cell, heading, table, type Column } from "~/plans/pdf/tables.server";
import type { PrintablePlan } from "~/plans/printable";
import { PRE_LIFT_CHECKLIST } from "~/plans/workflow";
import { formatLength } from "~/utils/format";

export function sequenceSection(flow: Flow, plan: PrintablePlan) {
  heading(flow, 6, "Lift sequence", 60);
  const holds = plan.details.sequence.filter((s) => s.holdPoint).length;
  flow.paragraph(
    holds > 0
      ? `${holds} hold point${holds === 1 ? "" : "s"}: stop at each, check, and carry on only when the lift supervisor releases it.`
      : "This sequence has no hold points.",
    { font: flow.fonts.regular, size: 8, color: INK },
    { gapAfter: 3 },
  );
  const cols: Column[] = [
    { title: "Step", width: 30, align: "right" },
    { title: "What to do", width: CONTENT_W - 30 },
  ];
  const title = { font: flow.fonts.semibold, size: 8.5, color: INK };
  const notes = { font: flow.fonts.regular, size: 8, color: INK };
  const rows = plan.details.sequence.map((s, i) => ({
    accent: s.holdPoint ? BRASS : undefined,
    cells: [
      cell(flow, cols[0]!.width, [{ text: `${i + 1}`, style: title }]),
      cell(
        flow,
        cols[1]!.width,
        [
          { text: s.title, style: title },
          { text: s.notes, style: notes },
        ],
        s.holdPoint ? { tag: { text: "HOLD POINT", tone: "hold" }, signoff: "Released by (name, time)" } : {},
      ),
    ],
  }));
  table(flow, cols, rows, "Lift sequence");
}

export function hazardsSection(flow: Flow, plan: PrintablePlan) {
  heading(flow, 7, "Hazards and controls", 40);
  const body = { font: flow.fonts.regular, size: 8, color: INK };
  if (plan.details.hazards.length === 0) {
    flow.paragraph("No hazards recorded in this plan.", body);
    return;
  }
  const cols: Column[] = [
    { title: "#", width: 22, align: "right" },
    { title: "Hazard", width: 190 },
    { title: "Control", width: CONTENT_W - 212 },
  ];
  const rows = plan.details.hazards.map((h, i) => ({
    cells: [
      cell(flow, cols[0]!.width, [{ text: `${i + 1}`, style: body }]),
      cell(flow, cols[1]!.width, [{ text: h.hazard, style: { ...body, font: flow.fonts.semibold } }]),
      cell(flow, cols[2]!.width, [{ text: h.control, style: body }]),
    ],
  }));
  table(flow, cols, rows, "Hazards and controls");
}

export function siteSection(flow: Flow, plan: PrintablePlan) {
  heading(flow, 8, "Exclusion zone, communication and people", 60);
  const body = { font: flow.fonts.regular, size: 8.5, color: INK };
  const label = { font: flow.fonts.semibold, size: 8, color: STEEL };
  flow.paragraph("Exclusion zone", label, { gapAfter: 0 });
  flow.paragraph(plan.details.exclusionZone.trim() || "Not stated: agree it at the briefing and write it here.", body, {
    gapAfter: 5,
  });
  flow.paragraph("Communication", label, { gapAfter: 0 });
  flow.paragraph(plan.details.communication.trim() || "Not stated: agree it at the briefing and write it here.", body, {
    gapAfter: 5,
  });
  flow.paragraph(
    `Floor clearance for the lift: ${formatLength(plan.details.floorClearanceM, plan.units)} under the load.`,
    body,
    { gapAfter: 6 },
  );
  const cols: Column[] = [
    { title: "Name", width: 200 },
    { title: "Role on the lift", width: CONTENT_W - 200 },
  ];
  if (plan.details.people.length === 0) {
    flow.paragraph("No people are named in this plan: name them at the briefing.", body);
    return;
  }
  table(
    flow,
    cols,
    plan.details.people.map((p) => ({
      cells: [
        cell(flow, 200, [{ text: p.name, style: { ...body, font: flow.fonts.semibold } }]),
        cell(flow, CONTENT_W - 200, [{ text: PERSON_ROLE_LABELS[p.role], style: body }]),
      ],
    })),
    "People",
    { keepTogether: true },
  );
}

const SIGNATORIES = ["Lift supervisor", "Slinger/signaller", "Crane operator"] as const;

export function checklistSection(flow: Flow) {
  const rowH = 20;
  const signH = 30;
  heading(
    flow,
    9,
    "Pre-lift checklist and sign-off",
    PRE_LIFT_CHECKLIST.length * rowH + 40 + SIGNATORIES.length * signH,
  );
  const page = flow.page;
  const body = { font: flow.fonts.regular, size: 9, color: INK };
  const small = { font: flow.fonts.regular, size: 6.5, color: INK_SOFT };
  flow.text(
    "Tick each box on the day, before the lift. Do not lift until every box is ticked.",
    LEFT,
    flow.y - 9,
    small,
  );
  flow.text("Initials", RIGHT - 60, flow.y - 9, small);
  flow.y -= 12;
  // The same list the rigger ticks on the lift page, so the paper and the screen agree.
  for (const { text: item } of PRE_LIFT_CHECKLIST) {
    const y = flow.y - rowH;
    page.drawRectangle({ x: LEFT + 2, y: y + 5, width: 10, height: 10, borderColor: INK, borderWidth: 1 });
    flow.text(item, LEFT + 20, y + 7, body);
    const end = LEFT + 20 + flow.ts.width(flow.ts.clean(item), body.font, body.size) + 8;
    page.drawLine({
      start: { x: end, y: y + 6 },
      end: { x: RIGHT - 70, y: y + 6 },
      thickness: 0.3,
      color: RULE,
      dashArray: [1, 2],
    });
    page.drawLine({ start: { x: RIGHT - 60, y: y + 6 }, end: { x: RIGHT, y: y + 6 }, thickness: 0.6, color: INK_SOFT });
    flow.y = y;
  }
  flow.y -= 12;
  const cols = [
    { title: "Role", x: LEFT, w: 100 },
    { title: "Name", x: LEFT + 100, w: 150 },
    { title: "Signature", x: LEFT + 250, w: 160 },
    { title: "Date and time", x: LEFT + 410, w: CONTENT_W - 410 },
  ];
  page.drawRectangle({ x: LEFT, y: flow.y - 14, width: CONTENT_W, height: 14, color: STEEL_WASH });
  for (const c of cols) flow.text(c.title, c.x + 4, flow.y - 9.5, { font: flow.fonts.semibold, size: 7, color: STEEL });
  flow.y -= 14;
  for (const who of SIGNATORIES) {
    const y = flow.y - signH;
    flow.text(who, LEFT + 4, y + 10, { font: flow.fonts.semibold, size: 8.5, color: INK });
    for (const c of cols.slice(1))
      page.drawLine({
        start: { x: c.x + 4, y: y + 8 },
        end: { x: c.x + c.w - 6, y: y + 8 },
        thickness: 0.7,
        color: INK,
      });
    page.drawLine({ start: { x: LEFT, y }, end: { x: RIGHT, y }, thickness: 0.4, color: RULE });
    flow.y = y;
  }
}
