// Sections 3 to 5 of the printed plan: the rigging arrangement with its drawing and leg loads, the
// rigging schedule, and the checks.
import { beamLine } from "~/plans/beam-text";
import type { PlanLeg } from "~/plans/document";
import { riggingDrawing, VIEW_MAX_H } from "~/plans/pdf/drawing.server";
import { degText, knText, loadText, percentUp, tensionMassNumber, utcText, VERDICT } from "~/plans/pdf/format";
import { CONTENT_W, INK, INK_SOFT, LEFT, STEEL, TONE, type Flow } from "~/plans/pdf/layout.server";
import { cell, heading, table, type Column } from "~/plans/pdf/tables.server";
import type { PrintablePlan } from "~/plans/printable";
import { checkSentence, itemText, ruleText, warningSentence } from "~/plans/check-text";
import { DEFAULT_RULE_SET, type RuleSetId } from "~/statics/reference";

/** How the printed plan names each rule set. */
const RULE_SET_TITLES: Record<RuleSetId, string> = {
  "uk-eu": "UK / EU (LOLER 1998, BS 7121, EN 13414-1, EN 818-4, EN 1492, DIN 580, EN 13889)",
  us: "US (OSHA 29 CFR 1910.184, ASME B30.9, B30.26, B30.20, ASME B18.15)",
};
import { ceilTo } from "~/statics/units";
import { formatForce, formatLength, formatMass, massUnitLabel } from "~/utils/format";

function legRows(plan: PrintablePlan): Array<{ name: string; leg: PlanLeg }> {
  const rows = plan.results.legs.map((leg) => ({
    name: `${plan.arrangement.kind === "beam" ? "Drop" : "Leg"} ${leg.liftPointId}`,
    leg,
  }));
  for (const [i, leg] of (plan.results.beam?.topLegs ?? []).entries())
    rows.push({ name: plan.results.beam!.topLegs.length > 1 ? `Top leg ${i + 1}` : "Top leg", leg });
  return rows;
}

export function riggingSection(flow: Flow, plan: PrintablePlan) {
  const kind =
    plan.arrangement.kind === "beam"
      ? "lifting beam with vertical drops"
      : `${plan.results.legs.length}-leg bridle to one hook`;
  // Kept with the whole drawing, so the heading never ends a page on its own.
  heading(flow, 3, `Rigging arrangement: ${kind}`, VIEW_MAX_H + 34);
  riggingDrawing(flow, plan);
  const units = plan.units;
  const body = { font: flow.fonts.regular, size: 8, color: INK };
  const strong = { font: flow.fonts.semibold, size: 8, color: INK };
  const cols: Column[] = [
    { title: "Leg", width: 90 },
    { title: "Length", width: 80, align: "right" },
    { title: `Tension (${units === "metric" ? "kN" : "lbf"})`, width: 80, align: "right" },
    { title: `Tension (${massUnitLabel(units)})`, width: 90, align: "right" },
    { title: "Angle from vertical", width: 95, align: "right" },
    { title: "Vertical share", width: CONTENT_W - 435, align: "right" },
  ];
  const rows = legRows(plan).map(({ name, leg }) => ({
    cells: [
      cell(flow, cols[0]!.width, [{ text: name, style: strong }]),
      cell(flow, cols[1]!.width, [{ text: formatLength(leg.lengthM, units), style: body }]),
      cell(flow, cols[2]!.width, [
        {
          text: leg.slack ? "slack" : units === "metric" ? knText(leg.tensionKn) : formatForce(leg.tensionKn, units),
          style: body,
        },
      ]),
      cell(flow, cols[3]!.width, [
        { text: leg.slack ? "slack" : tensionMassNumber(leg.tensionKg, units), style: body },
      ]),
      cell(flow, cols[4]!.width, [{ text: degText(leg.angleFromVerticalDeg), style: body }]),
      cell(flow, cols[5]!.width, [{ text: `${ceilTo(leg.verticalShare * 100, 1).toFixed(1)} %`, style: body }]),
    ],
  }));
  flow.y -= 4;
  table(flow, cols, rows, "Leg loads", { keepTogether: true });
  const beam = plan.arrangement.kind === "beam" && plan.arrangement.beam;
  const notes = [
    `Leg loads are for the mass as entered (${formatMass(plan.snapshot.massKg, units)}), without contingency, rounded up; the checks below add the ${plan.snapshot.contingencyPct.toLocaleString("en-GB")} % contingency.`,
    plan.arrangement.mode === "level"
      ? `Hook set ${formatLength(plan.results.hook.z, units)} above the load's datum (z = 0), plumb over the CoG.`
      : `Legs of the given lengths; the load hangs ${degText(plan.results.tiltDeg)} from level.`,
    beam
      ? `Beam: ${beamLine(plan.arrangement, plan.results.beam, units)}; the hook carries ${loadText(plan.results.beam?.hookMassKg ?? 0, units)}.`
      : "",
    `Worked out under the ${RULE_SET_TITLES[plan.results.ruleSet ?? DEFAULT_RULE_SET]} rule set: its hitch and multi-leg factors, angle limits, eyebolt and shackle tables and examination intervals. Local lifting regulations and the appointed person decide.`,
    `${plan.results.method === "elastic" ? "Shared between the legs elastically (a rigid load on equal slings)" : "Found by statics alone (the legs' share is fixed by the geometry)"}. ${plan.results.rating.rule}`,
  ].filter((s) => s !== "");
  for (const n of notes) flow.paragraph(n, { font: flow.fonts.regular, size: 7, color: INK_SOFT }, { gapAfter: 1 });
  if (plan.results.warnings.length > 0) {
    flow.y -= 3;
    for (const w of plan.results.warnings)
      flow.paragraph(
        `Note: ${warningSentence(w, units)}`,
        { font: flow.fonts.semibold, size: 7.5, color: TONE.warn },
        { gapAfter: 1 },
      );
  }
}

export function scheduleSection(flow: Flow, plan: PrintablePlan) {
  heading(flow, 4, "Rigging schedule", 50);
  const units = plan.units;
  const body = { font: flow.fonts.regular, size: 8, color: INK };
  const small = { font: flow.fonts.regular, size: 6.5, color: INK_SOFT };
  const strong = { font: flow.fonts.semibold, size: 8, color: INK };
  const cols: Column[] = [
    { title: "Position", width: 78 },
    { title: "Item id", width: 72 },
    { title: "Description", width: 155 },
    { title: "WLL", width: 58, align: "right" },
    { title: "Load", width: 58, align: "right" },
    { title: "Utilisation", width: 50, align: "right" },
    { title: "Exam due", width: CONTENT_W - 471, align: "right" },
  ];
  if (plan.schedule.length === 0) {
    flow.paragraph("No gear is allocated in this plan.", body);
    return;
  }
  const rows = plan.schedule.map((r) => ({
    cells: [
      cell(flow, cols[0]!.width, [{ text: r.position, style: body }]),
      cell(flow, cols[1]!.width, [{ text: r.itemCode, style: strong }]),
      cell(flow, cols[2]!.width, [
        { text: r.description, style: body },
        { text: r.serial ? `Serial ${r.serial}` : "", style: small },
        { text: r.certificate ?? "", style: small },
      ]),
      cell(flow, cols[3]!.width, [{ text: formatMass(r.wllKg, units), style: body }]),
      cell(flow, cols[4]!.width, [{ text: r.loadKg === null ? "–" : loadText(r.loadKg, units), style: body }]),
      cell(flow, cols[5]!.width, [
        {
          text: percentUp(r.utilisation),
          style: r.utilisation !== null && r.utilisation > 1 ? { ...strong, color: TONE.fail } : strong,
        },
      ]),
      cell(flow, cols[6]!.width, [{ text: r.nextDueOn ?? "none on record", style: body }]),
    ],
  }));
  table(flow, cols, rows, "Rigging schedule");
  flow.paragraph(
    "Load: what the item carries in this plan, with contingency where its check applies it, rounded up. Utilisation: load / WLL (derated for angle and hitch where the check says so), rounded up.",
    { font: flow.fonts.regular, size: 7, color: INK_SOFT },
  );
}

export function checksSection(flow: Flow, plan: PrintablePlan) {
  heading(flow, 5, "Checks", 50);
  // Worst first, so a failure or a warning is never buried under passes; otherwise as computed.
  const rank = { fail: 0, warn: 1, pass: 2 };
  const checks = [...(plan.results.checks ?? [])].sort((a, b) => rank[a.status] - rank[b.status]);
  const inUnits = plan.units;
  const body = { font: flow.fonts.regular, size: 8, color: INK };
  const strong = { font: flow.fonts.semibold, size: 8, color: INK };
  const small = { font: flow.fonts.regular, size: 6.5, color: INK_SOFT };
  const counts = { pass: 0, warn: 0, fail: 0 };
  for (const c of checks) counts[c.status]++;
  flow.paragraph(
    checks.length === 0
      ? "No gear was allocated, so no item was checked."
      : `${checks.length} checks: ${counts.pass} pass, ${counts.warn} warn, ${counts.fail} fail. Utilisations are rounded up.`,
    strong,
    { gapAfter: 3 },
  );
  if (checks.length > 0) {
    const cols: Column[] = [
      { title: "Verdict", width: 44 },
      { title: "Item", width: 130 },
      { title: "Utilisation", width: 50, align: "right" },
      { title: "Finding, rule and source", width: CONTENT_W - 224 },
    ];
    const rows = checks.map((c) => ({
      accent: c.status === "pass" ? undefined : TONE[c.status],
      cells: [
        cell(flow, cols[0]!.width, [], { tag: { text: VERDICT[c.status], tone: c.status } }),
        cell(flow, cols[1]!.width, [{ text: itemText(c), style: strong }]),
        cell(flow, cols[2]!.width, [{ text: percentUp(c.utilisation), style: strong }]),
        cell(flow, cols[3]!.width, [
          { text: checkSentence(c, inUnits), style: body },
          { text: `Rule: ${ruleText(c, inUnits)}  Source: ${c.source}`, style: small },
        ]),
      ],
    }));
    table(flow, cols, rows, "Checks");
  }
  if (plan.acknowledgements.length > 0) {
    flow.ensure(60);
    flow.y -= 6;
    flow.text("Warnings acknowledged before approval", LEFT, flow.y - 8, {
      font: flow.fonts.semibold,
      size: 9,
      color: STEEL,
    });
    flow.y -= 14;
    const cols: Column[] = [
      { title: "Check", width: 140 },
      { title: "Acknowledged by", width: 95 },
      { title: "When", width: 92 },
      { title: "Why it is acceptable", width: CONTENT_W - 327 },
    ];
    table(
      flow,
      cols,
      plan.acknowledgements.map((a) => ({
        cells: [
          cell(flow, cols[0]!.width, [{ text: a.checkItem, style: strong }]),
          cell(flow, cols[1]!.width, [{ text: a.by, style: body }]),
          cell(flow, cols[2]!.width, [{ text: utcText(a.at), style: body }]),
          cell(flow, cols[3]!.width, [{ text: a.reason, style: body }]),
        ],
      })),
      "Warnings acknowledged",
      { keepTogether: true },
    );
  }
}
