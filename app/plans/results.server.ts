// The server's computation of a plan's results: the load snapshot, the arrangement and the
// allocated gear (looked up in the organisation's register) go through the statics core. The
// browser never sends a figure that is stored.
import { Op, type Transaction } from "sequelize";
import type { ComponentDefinition } from "~/loads/component-definition";
import { GearItem } from "~/models/gear-item.server";
import { getReferenceTables } from "~/models/reference-row.server";
import type { GearKind } from "~/gear/kinds";
import type {
  Arrangement,
  PlanDetails,
  PlanIssue,
  PlanLeg,
  PlanResults,
  PlanResultsBody,
  RiggingAllocation,
} from "~/plans/document";
import { handleSolve, type SolveBody } from "~/statics/api";
import { solveBeamLift } from "~/statics/beam";
import type { LiftPoint } from "~/statics/bridle";
import {
  checkCraneLoad,
  checkEyebolt,
  checkHeadroom,
  checkInspection,
  checkMasterLink,
  checkShackle,
  checkSlingLeg,
  contingencyFactor,
  type CheckResult,
  type CraneSpec,
  type EyeboltFamily,
  type InspectionRecord,
  type RiggingDescription,
  type ShackleSpec,
  type SlingSpec,
} from "~/statics/checks";
import { findModeFactor, type ReferenceTables } from "~/statics/reference";
import { STANDARD_GRAVITY_MS2 } from "~/statics/units";

const SLING_KINDS: Partial<Record<GearKind, SlingSpec["kind"]>> = {
  chain_sling: "chain",
  wire_rope_sling: "wire",
  web_sling: "web",
  round_sling: "round",
};
const CRANE_KINDS: readonly GearKind[] = ["crane", "hoist", "chain_block", "lever_hoist"];

type Slot = {
  path: Array<string | number>;
  itemId: number;
  role: "eyebolt" | "shackle" | "sling" | "master link" | "crane or hoist";
  leg?: string;
};

function slotsOf(rigging: RiggingAllocation): Slot[] {
  const slots: Slot[] = [];
  for (const [leg, r] of Object.entries(rigging.legs)) {
    if (r.eyeboltItemId !== undefined)
      slots.push({ path: ["rigging", "legs", leg, "eyeboltItemId"], itemId: r.eyeboltItemId, role: "eyebolt", leg });
    if (r.shackleItemId !== undefined)
      slots.push({ path: ["rigging", "legs", leg, "shackleItemId"], itemId: r.shackleItemId, role: "shackle", leg });
    if (r.slingItemId !== undefined)
      slots.push({ path: ["rigging", "legs", leg, "slingItemId"], itemId: r.slingItemId, role: "sling", leg });
  }
  if (rigging.masterLinkItemId !== undefined)
    slots.push({ path: ["rigging", "masterLinkItemId"], itemId: rigging.masterLinkItemId, role: "master link" });
  if (rigging.craneItemId !== undefined)
    slots.push({ path: ["rigging", "craneItemId"], itemId: rigging.craneItemId, role: "crane or hoist" });
  return slots;
}

const withArticle = (noun: string) => `${/^[aeiou]/.test(noun) ? "an" : "a"} ${noun}`;

function fitsRole(kind: GearKind, role: Slot["role"]): boolean {
  switch (role) {
    case "eyebolt":
      return kind === "eyebolt";
    case "shackle":
      return kind === "shackle";
    case "sling":
      return SLING_KINDS[kind] !== undefined;
    case "master link":
      return kind === "master_link";
    case "crane or hoist":
      return CRANE_KINDS.includes(kind);
  }
}

/** The organisation's gear items named by the allocation (other organisations' items are simply not found). */
export async function loadAllocatedGear(
  organisationId: number,
  rigging: RiggingAllocation,
  transaction?: Transaction,
): Promise<Map<number, GearItem>> {
  const ids = [...new Set(slotsOf(rigging).map((s) => s.itemId))];
  if (ids.length === 0) return new Map();
  const items = await GearItem.findAll({ where: { organisationId, id: { [Op.in]: ids } }, transaction });
  return new Map(items.map((i) => [i.id, i]));
}

/** Allocations that cannot stand: unknown or withdrawn items, an item of the wrong kind, one item in two places. */
export function allocationIssues(rigging: RiggingAllocation, items: ReadonlyMap<number, GearItem>): PlanIssue[] {
  const issues: PlanIssue[] = [];
  const uses = new Map<number, Slot[]>();
  for (const slot of slotsOf(rigging)) {
    const item = items.get(slot.itemId);
    if (!item) {
      issues.push({
        path: slot.path,
        message: `There is no gear item ${slot.itemId} in your organisation's register.`,
      });
      continue;
    }
    if (item.status === "withdrawn") {
      issues.push({
        path: slot.path,
        message: `${item.itemCode} is withdrawn from use (${item.statusReason || "no reason recorded"}): it can never be allocated again. Allocate another item.`,
      });
      continue;
    }
    if (!fitsRole(item.kind, slot.role)) {
      issues.push({
        path: slot.path,
        message: `${item.itemCode} is ${withArticle(item.kind.replace(/_/g, " "))}, not ${withArticle(slot.role)}.`,
      });
      continue;
    }
    uses.set(item.id, [...(uses.get(item.id) ?? []), slot]);
  }
  for (const [id, slots] of uses) {
    const item = items.get(id)!;
    const allowed = slots[0]!.role === "sling" ? Math.max(1, item.legs ?? 1) : 1;
    if (slots.length > allowed) {
      const where = slots.map((s) => (s.leg ? `leg ${s.leg}` : s.role)).join(", ");
      issues.push({
        path: slots[allowed]!.path,
        message: `${item.itemCode} is allocated to ${where}, but ${allowed === 1 ? "it is one item" : `it has only ${allowed} legs`}: allocate another item.`,
      });
    }
  }
  return issues;
}

function inspectionOf(item: GearItem): InspectionRecord | undefined {
  if (!item.nextDueOn) return undefined;
  return { itemId: item.itemCode, status: item.status, examinationDue: item.nextDueOn };
}

function neverExamined(item: GearItem, name: string): CheckResult {
  return {
    id: `inspection-${item.itemCode}`,
    item: `${name} (${item.itemCode})`,
    status: "fail",
    utilisation: null,
    loadKg: null,
    capacityKg: null,
    rule: "In service and in date for thorough examination",
    source: "UK LOLER 1998 reg 9(3); ASME B30.9 / B30.26 periodic inspection",
    message: `${name} (${item.itemCode}) has no thorough examination on record: have it examined or allocate another item.`,
  };
}

type Described = {
  description: RiggingDescription;
  extraChecks: CheckResult[];
  notes: Array<{ code: string; message: string }>;
};

/**
 * The rigging description the checks take, from the allocated items: marked WLLs in kg, eyebolt
 * family and thread, shackle shape and pin, inspection status and due date; the crane's SWL and
 * highest hook position; the headroom the lift needs; the snapshot's contingency.
 */
export function describeRigging(
  snapshot: ComponentDefinition,
  rigging: RiggingAllocation,
  items: ReadonlyMap<number, GearItem>,
  tables: ReferenceTables,
  details?: Pick<PlanDetails, "floorClearanceM">,
): Described {
  const extraChecks: CheckResult[] = [];
  const notes: Described["notes"] = [];
  const withInspection = <T extends object>(
    spec: T,
    item: GearItem,
    name: string,
  ): T & { inspection?: InspectionRecord } => {
    const inspection = inspectionOf(item);
    if (!inspection) {
      extraChecks.push(neverExamined(item, name));
      return spec;
    }
    return { ...spec, inspection };
  };
  const legs: NonNullable<RiggingDescription["legs"]> = {};
  for (const [leg, r] of Object.entries(rigging.legs)) {
    const out: NonNullable<RiggingDescription["legs"]>[string] = {};
    const eyebolt = r.eyeboltItemId !== undefined ? items.get(r.eyeboltItemId) : undefined;
    if (eyebolt) {
      out.eyebolt = withInspection(
        {
          family: (eyebolt.eyeboltFamily ?? "plain") as EyeboltFamily,
          thread: eyebolt.thread ?? "",
          wllKg: eyebolt.wllKg,
        },
        eyebolt,
        `Eyebolt at ${leg}`,
      );
    }
    const shackle = r.shackleItemId !== undefined ? items.get(r.shackleItemId) : undefined;
    if (shackle) {
      const pin = shackle.pinType === "screw" || shackle.pinType === "bolt" ? shackle.pinType : undefined;
      const shackleSpec: ShackleSpec = {
        type: shackle.shackleType === "dee" ? "dee" : "bow",
        wllKg: shackle.wllKg,
        ...(pin ? { pin } : {}),
      };
      out.shackle = withInspection(shackleSpec, shackle, `Shackle at ${leg}`);
    }
    const sling = r.slingItemId !== undefined ? items.get(r.slingItemId) : undefined;
    const slingKind = sling ? SLING_KINDS[sling.kind] : undefined;
    if (sling && slingKind) {
      let wllKg = sling.wllKg;
      const legCount = sling.legs ?? 1;
      if (legCount > 1 && notes.some((n) => n.message.startsWith(`${sling.itemCode} `))) {
        const mode = findModeFactor(tables.modeFactors, legCount === 2 ? 2 : 3, 45);
        if (mode) wllKg = sling.wllKg / mode.factor;
      } else if (legCount > 1) {
        // A multi-leg sling is marked with the assembly's WLL for legs up to 45 deg; one leg's share is that over the mode factor.
        const mode = findModeFactor(tables.modeFactors, legCount === 2 ? 2 : 3, 45);
        if (mode) {
          wllKg = sling.wllKg / mode.factor;
          notes.push({
            code: "SLING_LEG_FROM_ASSEMBLY",
            message: `${sling.itemCode} is a ${legCount}-leg sling marked ${Math.round(sling.wllKg)} kg; each leg is taken as ${Math.floor(wllKg)} kg (marked WLL / mode factor ${mode.factor}, ${mode.source}).`,
          });
        }
      }
      out.sling = withInspection(
        {
          kind: slingKind,
          wllKg,
          hitch: r.hitch,
          ...(sling.diameterMm !== null ? { diameterMm: sling.diameterMm } : {}),
          ...(sling.chainGrade !== null ? { grade: String(sling.chainGrade) } : {}),
        },
        sling,
        `Sling leg ${leg}`,
      );
    }
    legs[leg] = out;
  }
  const description: RiggingDescription = { legs, contingencyPct: snapshot.contingencyPct };
  const link = rigging.masterLinkItemId !== undefined ? items.get(rigging.masterLinkItemId) : undefined;
  if (link) description.masterLink = withInspection({ wllKg: link.wllKg }, link, "Master link");
  const crane = rigging.craneItemId !== undefined ? items.get(rigging.craneItemId) : undefined;
  if (crane) {
    const spec: CraneSpec = {
      swlKg: crane.wllKg,
      ...(crane.hookHeightM !== null ? { maxHookHeightM: crane.hookHeightM } : {}),
    };
    description.crane = withInspection(spec, crane, "Crane or hoist");
    if (details)
      description.headroom = { clearanceAboveFloorM: details.floorClearanceM, loadUndersideZM: undersideZ(snapshot) };
  }
  return { description, extraChecks, notes };
}

/** The lowest z of the load's elevation outline (its underside), m. */
function undersideZ(snapshot: ComponentDefinition): number {
  const zs = snapshot.outlineElevation.map((p) => p[1]);
  return zs.length ? Math.min(...zs) : 0;
}

/** The /api/solve body for a bridle arrangement of the snapshot. */
export function buildSolveBody(
  snapshot: ComponentDefinition,
  arrangement: Arrangement,
  rigging: RiggingDescription,
): unknown {
  const byLabel = new Map(snapshot.liftPoints.map((p) => [p.label, p]));
  const liftPoints = arrangement.liftPointLabels.map((label) => {
    const p = byLabel.get(label);
    if (!p) return { id: label };
    return { id: label, ...p.position, axis: p.axis, ...(p.thread ? { thread: p.thread } : {}) };
  });
  return {
    load: { massKg: snapshot.massKg, cog: snapshot.cog },
    liftPoints,
    ...(arrangement.mode === "level"
      ? { hook: { z: arrangement.hookHeightM } }
      : {
          legLengths: Object.fromEntries(arrangement.liftPointLabels.map((l) => [l, arrangement.legLengthsM[l] ?? 0])),
        }),
    rigging,
  } satisfies Partial<Record<keyof SolveBody, unknown>>;
}

export type ComputeOptions = {
  details?: Pick<PlanDetails, "floorClearanceM">;
  tables?: ReferenceTables;
  transaction?: Transaction;
};

/**
 * The plan's results: a bridle goes through handleSolve exactly as /api/solve would; a beam through
 * the beam solver with the same checks. Allocation problems come back as a 400 with their issues.
 */
export async function computePlanResults(
  snapshot: ComponentDefinition,
  arrangement: Arrangement,
  rigging: RiggingAllocation,
  organisationId: number,
  todayIso: string,
  options: ComputeOptions = {},
): Promise<PlanResults> {
  const tables = options.tables ?? (await getReferenceTables());
  const items = await loadAllocatedGear(organisationId, rigging, options.transaction);
  const base = { kind: arrangement.kind, computedOn: todayIso };
  const issues = allocationIssues(rigging, items);
  if (issues.length > 0) {
    return { ...base, status: 400, body: { error: `The gear allocation is not valid: ${issues[0]!.message}`, issues } };
  }
  const { description, extraChecks, notes } = describeRigging(snapshot, rigging, items, tables, options.details);
  if (arrangement.kind === "beam") {
    const beam = beamResults(snapshot, arrangement, description, extraChecks, notes, tables, todayIso);
    return beam.status === 200 ? { ...base, status: 200, body: beam.body } : { ...base, status: 422, body: beam.body };
  }
  const solved = handleSolve(buildSolveBody(snapshot, arrangement, description), tables, { todayIso });
  if (solved.status !== 200) return { ...base, ...solved };
  const body: PlanResultsBody = {
    ...solved.body,
    warnings: [...solved.body.warnings, ...notes],
    checks: uniqueById([...(solved.body.checks ?? []), ...extraChecks]),
  };
  return { ...base, status: 200, body };
}

/** One check per id: a multi-leg sling on several legs is inspected once. */
function uniqueById<T extends { id: string }>(items: T[]): T[] {
  const seen = new Set<string>();
  return items.filter((c) => (seen.has(c.id) ? false : (seen.add(c.id), true)));
}

type BeamOutcome = { status: 200; body: PlanResultsBody } | { status: 422; body: { error: string; code: string } };

function beamResults(
  snapshot: ComponentDefinition,
  arrangement: Arrangement,
  rigging: RiggingDescription,
  extraChecks: CheckResult[],
  notes: Array<{ code: string; message: string }>,
  tables: ReferenceTables,
  todayIso: string,
): BeamOutcome {
  const beam = arrangement.beam!;
  const byLabel = new Map(snapshot.liftPoints.map((p) => [p.label, p]));
  const chosen = arrangement.liftPointLabels.map((l) => byLabel.get(l)!);
  const points: LiftPoint[] = chosen.map((p) => {
    const n = Math.hypot(p.axis.x, p.axis.y, p.axis.z) || 1;
    return { id: p.label, position: p.position, axis: { x: p.axis.x / n, y: p.axis.y / n, z: p.axis.z / n } };
  });
  const span = Math.max(
    0,
    ...points.flatMap((a) => points.map((b) => Math.hypot(a.position.x - b.position.x, a.position.y - b.position.y))),
  );
  if (span > beam.lengthM + 1e-6) {
    return {
      status: 422,
      body: {
        code: "BEAM_TOO_SHORT",
        error: `The lift points are ${Math.round(span * 1000)} mm apart but the beam is ${Math.round(beam.lengthM * 1000)} mm long: use a longer beam or other lift points.`,
      },
    };
  }
  // The beam hangs level with its drops; its lug is set plumb over the load's CoG (an adjustable lifting beam).
  const beamZ = Math.max(...points.map((p) => p.position.z)) + beam.dropLengthM;
  if (!(arrangement.hookHeightM > beamZ + 1e-6)) {
    return {
      status: 422,
      body: {
        code: "HOOK_BELOW_BEAM",
        error: `The hook must be above the beam's lug at ${Math.round(beamZ * 1000)} mm (component frame): raise the hook height.`,
      },
    };
  }
  const dropLengths = points.map((p) => beamZ - p.position.z);
  const lug = { x: snapshot.cog.x, y: snapshot.cog.y, z: beamZ };
  const outcome = solveBeamLift(
    snapshot.massKg,
    snapshot.cog,
    points,
    { massKg: beam.massKg, cog: lug, topLugs: [lug] },
    arrangement.hookHeightM,
    dropLengths,
  );
  if (!outcome.ok) return { status: 422, body: { error: outcome.message, code: outcome.code } };
  const s = outcome.solution;
  const factor = contingencyFactor(rigging.contingencyPct);
  const legs: PlanLeg[] = s.drops.drops.map((d, i) => {
    const axis = points[i]!.axis;
    return {
      liftPointId: d.liftPointId,
      lengthM: dropLengths[i]!,
      tensionKn: d.tensionKn,
      tensionKg: d.tensionKg,
      angleFromVerticalDeg: 0,
      axisAngleDeg: (Math.acos(Math.max(-1, Math.min(1, axis.z))) * 180) / Math.PI,
      verticalShare: d.share,
      slack: d.slack,
    };
  });
  const checks: CheckResult[] = [];
  const inspections: Array<{ name: string; record: InspectionRecord }> = [];
  for (const leg of legs) {
    const lr = rigging.legs?.[leg.liftPointId];
    const loadKg = leg.tensionKg * factor;
    if (lr?.sling) {
      checks.push(checkSlingLeg(leg.liftPointId, loadKg, lr.sling, tables));
      if (lr.sling.inspection) inspections.push({ name: `Sling leg ${leg.liftPointId}`, record: lr.sling.inspection });
    }
    if (lr?.shackle) {
      checks.push(checkShackle(leg.liftPointId, loadKg, lr.shackle, tables));
      if (lr.shackle.inspection)
        inspections.push({ name: `Shackle at ${leg.liftPointId}`, record: lr.shackle.inspection });
    }
    if (lr?.eyebolt) {
      const thread = byLabel.get(leg.liftPointId)?.thread || undefined;
      checks.push(checkEyebolt(leg.liftPointId, loadKg, leg.axisAngleDeg, lr.eyebolt, thread, tables));
      if (lr.eyebolt.inspection)
        inspections.push({ name: `Eyebolt at ${leg.liftPointId}`, record: lr.eyebolt.inspection });
    }
  }
  const designLoadKg = snapshot.massKg * factor;
  const beamUtilisation = designLoadKg / beam.wllKg;
  const ceilKg = (x: number) => `${Math.ceil(x - 1e-9).toLocaleString("en-GB")} kg`;
  checks.push({
    id: "beam",
    item: "Lifting beam",
    status: beamUtilisation > 1 + 1e-12 ? "fail" : "pass",
    utilisation: beamUtilisation,
    loadKg: designLoadKg,
    capacityKg: beam.wllKg,
    rule: "Load with contingency vs the beam's marked WLL",
    source: "marked WLL of the beam",
    message:
      beamUtilisation > 1 + 1e-12
        ? `The lifting beam would carry ${ceilKg(designLoadKg)} but is marked for only ${ceilKg(beam.wllKg)}: use a larger beam.`
        : `The lifting beam carries ${ceilKg(designLoadKg)} of its marked ${ceilKg(beam.wllKg)}.`,
  });
  const hookLoadKg = designLoadKg + beam.massKg + (rigging.riggingMassKg ?? 0);
  if (rigging.masterLink) {
    checks.push(checkMasterLink(hookLoadKg, rigging.masterLink));
    if (rigging.masterLink.inspection) inspections.push({ name: "Master link", record: rigging.masterLink.inspection });
  }
  if (rigging.crane) {
    checks.push(checkCraneLoad(hookLoadKg, rigging.crane));
    if (rigging.crane.inspection) inspections.push({ name: "Crane or hoist", record: rigging.crane.inspection });
    if (rigging.crane.maxHookHeightM !== undefined && rigging.headroom) {
      const drop = arrangement.hookHeightM - (rigging.headroom.loadUndersideZM ?? 0);
      checks.push(checkHeadroom(rigging.headroom.clearanceAboveFloorM + drop, rigging.crane.maxHookHeightM));
    }
  }
  for (const { name, record } of inspections) checks.push(checkInspection(name, record, todayIso));
  checks.push(...extraChecks);
  const unique = uniqueById(checks);
  const active = legs.filter((l) => !l.slack);
  const maxKg = Math.max(0, ...active.map((l) => l.tensionKg));
  const topLegs: PlanLeg[] = s.top.legs.map((l) => ({
    liftPointId: l.liftPointId,
    lengthM: l.lengthM,
    tensionKn: l.tensionKn,
    tensionKg: l.tensionKg,
    angleFromVerticalDeg: l.angleFromVerticalDeg,
    axisAngleDeg: l.axisAngleDeg,
    verticalShare: l.verticalShare,
    slack: l.slack,
  }));
  const body: PlanResultsBody = {
    mode: "level",
    weightKn: (snapshot.massKg * STANDARD_GRAVITY_MS2) / 1000,
    method: s.drops.method,
    hook: { x: s.top.hook.x, y: s.top.hook.y, z: s.top.hook.z },
    tiltDeg: 0,
    legs,
    warnings: [...s.warnings.map((w) => ({ code: w.code, message: w.message })), ...notes],
    rating: {
      legCount: legs.length,
      symmetric: false,
      effectiveLegs: Math.min(3, Math.max(1, active.length)) as 1 | 2 | 3,
      maxAngleFromVerticalDeg: 0,
      rule: "Vertical drops from a beam: lever rule for two drops, elastic share of a rigid load for more.",
      source: "common practice",
      legs: legs.map((l) => ({
        liftPointId: l.liftPointId,
        designTensionKn: l.tensionKn,
        designTensionKg: l.tensionKg,
      })),
      designTensionKn: (maxKg * STANDARD_GRAVITY_MS2) / 1000,
      designTensionKg: maxKg,
    },
    checks: unique,
    beam: { massKg: beam.massKg, wllKg: beam.wllKg, hookMassKg: s.hookMassKg, topLegs },
  };
  return { status: 200, body };
}
