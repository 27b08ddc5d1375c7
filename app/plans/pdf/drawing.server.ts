// The rigging drawing: elevation and plan to one stated scale, with the legs' figures labelled.
import { placeBeamForPlan } from "~/plans/beam-geometry";
import type { BeamPlacement } from "~/statics/beam-placement";
import type { PlanLeg } from "~/plans/document";
import { degText, knText, tensionMassNumber } from "~/plans/pdf/format";
import {
  BRASS,
  CONTENT_W,
  INK,
  INK_SOFT,
  LEFT,
  PT_MM,
  RULE,
  STEEL,
  STEEL_FILL,
  svgPolygon,
  WHITE,
  type Flow,
} from "~/plans/pdf/layout.server";
import { LabelPlacer, type Box, type Candidate, type LabelLines, type Point } from "~/plans/pdf/labels.server";
import type { PrintablePlan } from "~/plans/printable";
import { formatForce, formatLength, massUnitLabel, type Units } from "~/utils/format";

type V2 = { a: number; b: number };
type Seg = { from: V2; to: V2 };
type ViewKind = "elevation" | "plan";

const project = (p: { x: number; y: number; z: number }, view: ViewKind): V2 => ({
  a: p.x,
  b: view === "elevation" ? p.z : p.y,
});

/** The largest common drawing scale 1:N (N = 1, 1.5, 2, 2.5, 3, 4, 5 or 7.5 x 10^k, N >= 1) that fits `maxPtPerM`. */
export function drawingScale(maxPtPerM: number): { denominator: number; ptPerM: number } {
  const ptPerMAtFullSize = 1000 / PT_MM;
  const needed = ptPerMAtFullSize / maxPtPerM;
  for (let k = -2; k <= 8; k++) {
    for (const m of [1, 1.5, 2, 2.5, 3, 4, 5, 7.5]) {
      const n = m * 10 ** k;
      if (n >= needed - 1e-9 && n >= 1) return { denominator: n, ptPerM: ptPerMAtFullSize / n };
    }
  }
  return { denominator: needed, ptPerM: maxPtPerM };
}

/** A scale bar length near `targetM`: 1, 2 or 5 x 10^n mm (metric) or a round number of inches/feet (imperial), in metres. */
function scaleBarM(targetM: number, units: Units): number {
  if (units === "imperial") {
    const inches = targetM / 0.0254;
    const steps = [1, 2, 3, 6, 12, 24, 36, 48, 60, 120, 240, 600, 1200, 2400, 6000, 12000, 24000];
    return (steps.filter((s) => s <= inches).at(-1) ?? 1) * 0.0254;
  }
  const power = 10 ** Math.floor(Math.log10(targetM));
  return [5, 2, 1].map((m) => m * power).find((v) => v <= targetM) ?? power;
}

type ViewGeometry = {
  kind: ViewKind;
  outline: V2[];
  cog: V2;
  hook: V2;
  liftPoints: Array<{ label: string; at: V2; used: boolean }>;
  /** Leg lines with the figures they carry. */
  legs: Array<{ name: string; from: V2; to: V2; leg: PlanLeg | null; note?: string }>;
  beam: Seg | null;
  /** Points that do not carry figures (the beam's lugs). */
  extra: V2[];
};

/** Where a beam typed on a plan (results stored before beams were placed) hangs, as those plans were solved. */
function storedPlanPlacement(plan: PrintablePlan): BeamPlacement | null {
  const { snapshot, arrangement } = plan;
  if (!arrangement.beam || arrangement.beam.lengthM === undefined) return null;
  const points = arrangement.liftPointLabels.flatMap((label) => {
    const p = snapshot.liftPoints.find((q) => q.label === label);
    return p ? [{ id: label, position: p.position }] : [];
  });
  const placed = placeBeamForPlan(points, snapshot.cog, arrangement.beam.dropLengthM, {
    lengthM: arrangement.beam.lengthM,
  });
  return placed.ok ? placed.placement : null;
}

function viewGeometry(plan: PrintablePlan, view: ViewKind): ViewGeometry {
  const { snapshot, arrangement, results } = plan;
  const outline = (view === "elevation" ? snapshot.outlineElevation : snapshot.outlinePlan).map(([a, b]) => ({ a, b }));
  const used = new Set(arrangement.liftPointLabels);
  const liftPoints = snapshot.liftPoints.map((p) => ({
    label: p.label,
    at: project(p.position, view),
    used: used.has(p.label),
  }));
  const hook = project(results.hook, view);
  const cog = project(snapshot.cog, view);
  const legs: ViewGeometry["legs"] = [];
  let beam: Seg | null = null;
  const extra: V2[] = [];
  const point = (label: string) => snapshot.liftPoints.find((p) => p.label === label)?.position;
  if (arrangement.kind === "beam" && arrangement.beam) {
    // Drawn true: the beam along its axis at its length, drops from its lugs, top rigging from its top lug(s).
    const placement = results.beam?.placement ?? storedPlanPlacement(plan);
    if (placement) {
      for (const l of results.legs) {
        const p = point(l.liftPointId);
        const drop = placement.drops.find((d) => d.liftPointId === l.liftPointId);
        if (p && drop)
          legs.push({ name: `Drop ${l.liftPointId}`, from: project(drop.lug, view), to: project(p, view), leg: l });
      }
      beam = { from: project(placement.endA, view), to: project(placement.endB, view) };
      const topLegs = results.beam?.topLegs ?? [];
      placement.topLugs.forEach((lug, i) => {
        const at = project(lug, view);
        extra.push(at);
        legs.push({
          name: placement.topLugs.length > 1 ? `Top leg ${i + 1}` : "Top leg",
          from: hook,
          to: at,
          leg: topLegs[i] ?? null,
        });
      });
      for (const d of placement.drops) extra.push(project(d.lug, view));
    }
  } else {
    for (const l of results.legs) {
      const p = point(l.liftPointId);
      if (p) legs.push({ name: `Leg ${l.liftPointId}`, from: hook, to: project(p, view), leg: l });
    }
  }
  return { kind: view, outline, cog, hook, liftPoints, legs, beam, extra };
}

function viewBounds(g: ViewGeometry) {
  const pts = [
    ...g.outline,
    g.cog,
    g.hook,
    ...g.liftPoints.map((p) => p.at),
    ...g.extra,
    ...g.legs.flatMap((l) => [l.from, l.to]),
  ];
  const as = pts.map((p) => p.a);
  const bs = pts.map((p) => p.b);
  return { minA: Math.min(...as), maxA: Math.max(...as), minB: Math.min(...bs), maxB: Math.max(...bs) };
}

const VIEW_GAP = 10;
const VIEW_W = (CONTENT_W - VIEW_GAP) / 2;
const VIEW_PAD = 22;
const VIEW_TITLE_H = 16;
const VIEW_FOOT_H = 16;
/** The tallest the two views can be, pt: a heading kept with the drawing needs this much below it. */
export const VIEW_MAX_H = 300;
const VIEW_MIN_H = 170;

function legLabelLines(flow: Flow, name: string, leg: PlanLeg | null, units: Units): LabelLines {
  const bold = { font: flow.fonts.semibold, size: 7, color: INK };
  const small = { font: flow.fonts.regular, size: 6.5, color: INK };
  if (!leg) return [{ text: name, style: bold }];
  if (leg.slack) return [{ text: `${name}: slack`, style: bold }];
  return [
    {
      text: `${name}: ${units === "metric" ? knText(leg.tensionKn) : formatForce(leg.tensionKn, units)} · ${tensionMassNumber(leg.tensionKg, units)} ${massUnitLabel(units)}`,
      style: bold,
    },
    { text: `${degText(leg.angleFromVerticalDeg)} from vertical`, style: small },
  ];
}

/** Both views to one scale, with the scale stated; moves the cursor below them. */
export function riggingDrawing(flow: Flow, plan: PrintablePlan) {
  const views = [viewGeometry(plan, "elevation"), viewGeometry(plan, "plan")];
  const bounds = views.map(viewBounds);
  const drawW = VIEW_W - 2 * VIEW_PAD;
  const drawMaxH = VIEW_MAX_H - VIEW_TITLE_H - VIEW_FOOT_H - 2 * VIEW_PAD;
  const fit = Math.min(
    ...bounds.map((b) => Math.min(drawW / Math.max(b.maxA - b.minA, 1e-3), drawMaxH / Math.max(b.maxB - b.minB, 1e-3))),
  );
  const { denominator, ptPerM } = drawingScale(fit);
  const tallest = Math.max(...bounds.map((b) => (b.maxB - b.minB) * ptPerM));
  const frameH = Math.max(VIEW_MIN_H, tallest + VIEW_TITLE_H + VIEW_FOOT_H + 2 * VIEW_PAD);
  flow.ensure(frameH + 30);
  const frameTop = flow.y - 4;
  views.forEach((g, i) => {
    const frame = { x: LEFT + i * (VIEW_W + VIEW_GAP), y: frameTop - frameH, w: VIEW_W, h: frameH };
    drawView(flow, plan, g, bounds[i]!, frame, ptPerM);
  });
  flow.y = frameTop - frameH - 4;
  const scaleLine = `Both views to one scale: 1:${denominator.toLocaleString("en-GB")} on A4 printed at actual size (100 %, no fit to page). Check a dimension against the scale bar before measuring from the print.`;
  flow.paragraph(scaleLine, { font: flow.fonts.regular, size: 7, color: INK_SOFT }, { gapAfter: 2 });
}

function drawView(
  flow: Flow,
  plan: PrintablePlan,
  g: ViewGeometry,
  b: ReturnType<typeof viewBounds>,
  frame: Box,
  ptPerM: number,
) {
  const page = flow.page;
  const { semibold, regular } = flow.fonts;
  page.drawRectangle({
    x: frame.x,
    y: frame.y,
    width: frame.w,
    height: frame.h,
    borderColor: RULE,
    borderWidth: 0.8,
    color: WHITE,
  });
  const title = g.kind === "elevation" ? "Elevation, looking along y" : "Plan, looking down";
  flow.text(title, frame.x + 6, frame.y + frame.h - 11, { font: semibold, size: 8, color: STEEL });
  // Centre the drawing in the area between the title and the foot.
  const area = { x: frame.x, y: frame.y + VIEW_FOOT_H, w: frame.w, h: frame.h - VIEW_TITLE_H - VIEW_FOOT_H };
  const midA = (b.minA + b.maxA) / 2;
  const midB = (b.minB + b.maxB) / 2;
  const X = (a: number) => area.x + area.w / 2 + (a - midA) * ptPerM;
  const Y = (v: number) => area.y + area.h / 2 + (v - midB) * ptPerM;
  const P = (v: V2) => ({ x: X(v.a), y: Y(v.b) });

  // The floor under the load (elevation only): where the load stands before the lift.
  if (g.kind === "elevation" && g.outline.length > 0) {
    const floorZ = Math.min(...g.outline.map((p) => p.b));
    const x1 = X(Math.min(...g.outline.map((p) => p.a))) - 10;
    const x2 = X(Math.max(...g.outline.map((p) => p.a))) + 10;
    const y = Y(floorZ);
    page.drawLine({ start: { x: x1, y }, end: { x: x2, y }, thickness: 0.8, color: INK_SOFT });
    for (let x = x1 + 4; x < x2; x += 6)
      page.drawLine({ start: { x, y }, end: { x: x - 4, y: y - 4 }, thickness: 0.4, color: INK_SOFT });
  }

  // The outline of the load.
  if (g.outline.length >= 3) {
    page.drawSvgPath(svgPolygon(g.outline.map((v) => [X(v.a), Y(v.b)] as const)), {
      x: 0,
      y: 0,
      color: STEEL_FILL,
      borderColor: STEEL,
      borderWidth: 1,
    });
  }

  // Legs, drops, beam.
  const segments: Array<{ x1: number; y1: number; x2: number; y2: number }> = [];
  for (const l of g.legs) {
    const s = P(l.from);
    const e = P(l.to);
    segments.push({ x1: s.x, y1: s.y, x2: e.x, y2: e.y });
    page.drawLine({ start: s, end: e, thickness: 1.4, color: INK, dashArray: l.leg?.slack ? [4, 3] : undefined });
  }
  if (g.beam) {
    const s = P(g.beam.from);
    const e = P(g.beam.to);
    if (Math.hypot(e.x - s.x, e.y - s.y) < 2) {
      // Seen end on: the beam's section, a small square.
      page.drawRectangle({ x: s.x - 3, y: s.y - 3, width: 6, height: 6, color: STEEL });
      segments.push({ x1: s.x - 3, y1: s.y - 3, x2: s.x + 3, y2: s.y + 3 });
    } else {
      page.drawLine({ start: s, end: e, thickness: 5, color: STEEL });
      const len = Math.hypot(e.x - s.x, e.y - s.y);
      const nx = (-(e.y - s.y) / len) * 3;
      const ny = ((e.x - s.x) / len) * 3;
      segments.push(
        { x1: s.x + nx, y1: s.y + ny, x2: e.x + nx, y2: e.y + ny },
        { x1: s.x - nx, y1: s.y - ny, x2: e.x - nx, y2: e.y - ny },
      );
    }
  }
  for (const v of g.extra) {
    const p = P(v);
    page.drawCircle({ x: p.x, y: p.y, size: 2.5, color: WHITE, borderColor: INK, borderWidth: 1 });
  }

  // The hook: a ring at the hook point and the crane's rope going up.
  const hook = P(g.hook);
  const hookR = g.kind === "plan" ? 8 : 3.5;
  if (g.kind === "elevation") {
    page.drawLine({
      start: { x: hook.x, y: hook.y + hookR },
      end: { x: hook.x, y: hook.y + hookR + 14 },
      thickness: 1.2,
      color: STEEL,
    });
    segments.push({ x1: hook.x, y1: hook.y, x2: hook.x, y2: hook.y + hookR + 14 });
  }
  page.drawCircle({
    x: hook.x,
    y: hook.y,
    size: hookR,
    borderColor: STEEL,
    borderWidth: 1.6,
    color: g.kind === "plan" ? undefined : WHITE,
  });

  // Lift points.
  const markers: Box[] = [{ x: hook.x - hookR - 1, y: hook.y - hookR - 1, w: 2 * hookR + 2, h: 2 * hookR + 2 }];
  for (const lp of g.liftPoints) {
    const p = P(lp.at);
    page.drawCircle({ x: p.x, y: p.y, size: 3, color: lp.used ? BRASS : WHITE, borderColor: BRASS, borderWidth: 1 });
    markers.push({ x: p.x - 4, y: p.y - 4, w: 8, h: 8 });
  }

  // The CoG: the usual quartered circle.
  const cog = P(g.cog);
  const r = 5;
  page.drawCircle({ x: cog.x, y: cog.y, size: r, color: WHITE, borderColor: INK, borderWidth: 1 });
  const quarter = (from: number) => {
    const pts: Array<[number, number]> = [[cog.x, cog.y]];
    for (let k = 0; k <= 8; k++) {
      const t = from + (k / 8) * (Math.PI / 2);
      pts.push([cog.x + r * Math.cos(t), cog.y + r * Math.sin(t)]);
    }
    return svgPolygon(pts);
  };
  page.drawSvgPath(quarter(0), { x: 0, y: 0, color: INK });
  page.drawSvgPath(quarter(Math.PI), { x: 0, y: 0, color: INK });
  markers.push({ x: cog.x - r - 1, y: cog.y - r - 1, w: 2 * r + 2, h: 2 * r + 2 });

  const outlinePts = g.outline.map(P);
  const outlineBox =
    outlinePts.length > 0
      ? (() => {
          const xs = outlinePts.map((p) => p.x);
          const ys = outlinePts.map((p) => p.y);
          return {
            x: Math.min(...xs),
            y: Math.min(...ys),
            w: Math.max(...xs) - Math.min(...xs),
            h: Math.max(...ys) - Math.min(...ys),
          };
        })()
      : null;
  const placer = new LabelPlacer(
    { x: frame.x, y: frame.y + VIEW_FOOT_H, w: frame.w, h: frame.h - VIEW_FOOT_H - VIEW_TITLE_H + 4 },
    segments,
    markers,
    outlineBox,
  );

  const drawLabel = (lines: LabelLines, candidatesFor: (w: number, h: number) => Candidate[], boxed: boolean) => {
    const w =
      Math.max(...lines.map((l) => flow.ts.width(flow.ts.clean(l.text), l.style.font, l.style.size))) + (boxed ? 6 : 2);
    const h = lines.reduce((s, l) => s + l.style.size * 1.2, 0) + (boxed ? 3 : 0);
    const { box, anchor } = placer.place({ w, h }, candidatesFor(w, h));
    // A leader from a label set away from what it names.
    const nx = Math.min(Math.max(anchor.x, box.x), box.x + box.w);
    const ny = Math.min(Math.max(anchor.y, box.y), box.y + box.h);
    if (boxed && Math.hypot(anchor.x - nx, anchor.y - ny) > 7) {
      page.drawLine({ start: { x: nx, y: ny }, end: anchor, thickness: 0.4, color: INK_SOFT });
      page.drawCircle({ x: anchor.x, y: anchor.y, size: 1, color: INK_SOFT });
    }
    if (boxed)
      page.drawRectangle({
        x: box.x,
        y: box.y,
        width: box.w,
        height: box.h,
        color: WHITE,
        borderColor: RULE,
        borderWidth: 0.5,
        opacity: 0.92,
        borderOpacity: 1,
      });
    let y = box.y + box.h - (boxed ? 1.5 : 0);
    for (const l of lines) {
      y -= l.style.size * 1.2;
      flow.text(l.text, box.x + (boxed ? 3 : 1), y + l.style.size * 0.25, l.style);
    }
  };
  const around =
    (p: Point, gap: number) =>
    (w: number, h: number): Candidate[] =>
      [gap, gap + 6, gap + 12].flatMap((d) => [
        { x: p.x + d, y: p.y + d * 0.5, anchor: p },
        { x: p.x - d - w, y: p.y + d * 0.5, anchor: p },
        { x: p.x + d, y: p.y - d * 0.5 - h, anchor: p },
        { x: p.x - d - w, y: p.y - d * 0.5 - h, anchor: p },
        { x: p.x - w / 2, y: p.y + d, anchor: p },
        { x: p.x - w / 2, y: p.y - d - h, anchor: p },
        { x: p.x + d, y: p.y - h / 2, anchor: p },
        { x: p.x - d - w, y: p.y - h / 2, anchor: p },
      ]);
  // Anywhere in the view, for when nothing near is free (the label then gets a leader).
  const anywhere =
    (anchor: Point) =>
    (w: number, h: number): Candidate[] => {
      const c: Candidate[] = [];
      for (let x = frame.x + 4; x + w <= frame.x + frame.w - 4; x += 10) {
        for (let y = frame.y + VIEW_FOOT_H + 2; y + h <= frame.y + frame.h - VIEW_TITLE_H; y += 8)
          c.push({ x, y, anchor });
      }
      return c;
    };

  const bold8 = { font: semibold, size: 8, color: INK };
  const small7 = { font: regular, size: 7, color: INK };
  // The small labels first, right beside what they name; the leg figures then find room, with a leader if need be.
  drawLabel(
    [{ text: g.kind === "plan" ? "Hook (above)" : "Hook", style: { font: semibold, size: 7, color: STEEL } }],
    around(hook, hookR + 2),
    false,
  );
  drawLabel([{ text: "CoG", style: small7 }], around(cog, r + 2), false);
  for (const lp of g.liftPoints) {
    drawLabel(
      [{ text: lp.label, style: lp.used ? bold8 : { ...small7, color: INK_SOFT } }],
      around(P(lp.at), 4),
      false,
    );
  }
  for (const l of g.legs) {
    const s = P(l.from);
    const e = P(l.to);
    const lines = legLabelLines(flow, l.name, l.leg, plan.units);
    drawLabel(
      lines,
      (w, h) => {
        const c: Candidate[] = [];
        const len = Math.hypot(e.x - s.x, e.y - s.y);
        if (len < 1) return [...around(e, 8)(w, h), ...anywhere(e)(w, h)];
        const ux = (e.x - s.x) / len;
        const uy = (e.y - s.y) / len;
        for (const t of [0.5, 0.4, 0.6, 0.3, 0.7, 0.2, 0.8]) {
          const m = { x: s.x + (e.x - s.x) * t, y: s.y + (e.y - s.y) * t };
          c.push(
            { x: m.x + 5, y: m.y - h / 2, anchor: m },
            { x: m.x - 5 - w, y: m.y - h / 2, anchor: m },
            { x: m.x - w / 2, y: m.y + 4, anchor: m },
            { x: m.x - w / 2, y: m.y - 4 - h, anchor: m },
          );
        }
        // Past the lift point along the leg's line, then to either side farther out: for short legs seen from above.
        for (const d of [14, 30, 50, 75]) {
          const m = { x: e.x + ux * d, y: e.y + uy * d };
          const cx = m.x + (ux >= 0 ? 0 : -w);
          const cy = m.y + (uy >= 0 ? 0 : -h);
          c.push(
            { x: cx, y: cy, anchor: e },
            { x: m.x - w / 2, y: m.y + 6, anchor: e },
            { x: m.x - w / 2, y: m.y - 6 - h, anchor: e },
          );
        }
        return [...c, ...anywhere({ x: (s.x + e.x) / 2, y: (s.y + e.y) / 2 })(w, h)];
      },
      true,
    );
  }

  // Scale bar (bottom left) and axis arrows (bottom right).
  const barM = scaleBarM((frame.w * 0.3) / ptPerM, plan.units);
  const barPt = barM * ptPerM;
  const bx = frame.x + 8;
  const by = frame.y + 7;
  const halves = 2;
  for (let k = 0; k < halves; k++) {
    page.drawRectangle({
      x: bx + (k * barPt) / halves,
      y: by,
      width: barPt / halves,
      height: 3,
      color: k % 2 === 0 ? INK : WHITE,
      borderColor: INK,
      borderWidth: 0.5,
    });
  }
  flow.text(formatLength(barM, plan.units).replace(/\.00 in$/, " in"), bx + barPt + 4, by - 0.5, {
    font: regular,
    size: 7,
    color: INK,
  });
  const ax = frame.x + frame.w - 34;
  const ay = frame.y + 6;
  const arrow = (x1: number, y1: number, x2: number, y2: number, label: string) => {
    page.drawLine({ start: { x: x1, y: y1 }, end: { x: x2, y: y2 }, thickness: 0.7, color: INK_SOFT });
    const ang = Math.atan2(y2 - y1, x2 - x1);
    const head = (d: number) => ({ x: x2 - 3.5 * Math.cos(ang + d), y: y2 - 3.5 * Math.sin(ang + d) });
    page.drawSvgPath(
      svgPolygon([
        [x2, y2],
        [head(0.45).x, head(0.45).y],
        [head(-0.45).x, head(-0.45).y],
      ]),
      { x: 0, y: 0, color: INK_SOFT },
    );
    flow.text(label, x2 + (x2 > x1 ? 2 : -2), y2 + (y2 > y1 ? 1 : -2), { font: regular, size: 6.5, color: INK_SOFT });
  };
  arrow(ax, ay, ax + 16, ay, "x");
  arrow(ax, ay, ax, ay + 12, g.kind === "elevation" ? "z" : "y");
}
