// The server's computation of a plan's results: the load snapshot, the arrangement and the
// allocated gear (looked up in the organisation's register) go through the statics core. The
// browser never sends a figure that is stored.
import { Op, type Transaction } from "sequelize";
import type { ComponentDefinition } from "~/loads/component-definition";
import { GearItem } from "~/models/gear-item.server";
import { getOrganisationRuleSet } from "~/models/organisation.server";
import { getReferenceTables } from "~/models/reference-row.server";
import { isBeamKind, parseLugPositions, type GearKind } from "~/gear/kinds";
import { arrangementInput } from "~/plans/arrangement-input";
import type { Arrangement, PlanDetails, PlanIssue, PlanResults, RiggingAllocation } from "~/plans/document";
import { fitOf } from "~/plans/rigging";
import { solveArrangement } from "~/statics/arrangement";
import type { BeamItemSpec } from "~/statics/beam-arrangement";
import {
  checkNeverExamined,
  type Check,
  type CraneSpec,
  type EyeboltFamily,
  type EyeboltSpec,
  type InspectionRecord,
  type LegRigging,
  type RiggingDescription,
  type ShackleSpec,
  type SlingSpec,
  type Wll,
} from "~/statics/checks";
import { DEFAULT_RULE_SET, findModeFactor, type ReferenceTables, type RuleSetId } from "~/statics/reference";

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
  role: "eyebolt" | "shackle" | "sling" | "master link" | "crane or hoist" | "lifting beam or spreader";
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
  if (rigging.beamItemId !== undefined)
    slots.push({ path: ["rigging", "beamItemId"], itemId: rigging.beamItemId, role: "lifting beam or spreader" });
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
    case "lifting beam or spreader":
      return isBeamKind(kind);
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
    if (slot.role === "lifting beam or spreader" && !beamItemSpec(item)) {
      issues.push({
        path: slot.path,
        message: `${item.itemCode} has no lug positions in the register: record its drop and top lugs before allocating it.`,
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

/** A register beam as the beam checks take it, or null when its geometry is not recorded. */
export function beamItemSpec(item: GearItem): BeamItemSpec | null {
  if (!isBeamKind(item.kind)) return null;
  const dropLugsM = parseLugPositions(item.dropLugsM);
  const topLugsM = parseLugPositions(item.topLugsM);
  if (!dropLugsM || !topLugsM || item.lengthM === null || item.beamMassKg === null) return null;
  const inspection = inspectionOf(item);
  return {
    itemCode: item.itemCode,
    kind: item.kind,
    lengthM: item.lengthM,
    dropLugsM,
    topLugsM,
    massKg: item.beamMassKg,
    wllKg: item.wllKg,
    ...(inspection ? { inspection } : {}),
  };
}

function inspectionOf(item: GearItem): InspectionRecord | undefined {
  if (!item.nextDueOn) return undefined;
  return { itemId: item.itemCode, status: item.status, examinationDue: item.nextDueOn };
}

/** What every spec carries about its item: the register code, its own mass, the marked WLL with its unit. */
function identityOf(item: GearItem) {
  return {
    itemCode: item.itemCode,
    ...(item.massKg !== null && item.massKg !== undefined ? { massKg: item.massKg } : {}),
  };
}

function markedOf(item: GearItem): Wll {
  return { value: item.wllValue, unit: item.wllUnit };
}

type Described = {
  description: RiggingDescription;
  extraChecks: Check[];
  notes: Array<{ code: string; message: string }>;
};

export type DescribeOptions = {
  details?: Pick<PlanDetails, "floorClearanceM" | "liftDate">;
  ruleSet?: RuleSetId;
  todayIso?: string;
};

/**
 * The rigging description the checks take, from the allocated items: marked WLLs as marked, eyebolt
 * family and thread, shackle shape and pin, each item's code and own mass, inspection status and due
 * date; the crane's SWL and highest hook position; the headroom the lift needs; the snapshot's contingency.
 */
export function describeRigging(
  snapshot: ComponentDefinition,
  rigging: RiggingAllocation,
  items: ReadonlyMap<number, GearItem>,
  tables: ReferenceTables,
  options: DescribeOptions = {},
): Described {
  const ruleSet = options.ruleSet ?? DEFAULT_RULE_SET;
  const extraChecks: Check[] = [];
  const notes: Described["notes"] = [];
  const withInspection = <T extends object>(
    spec: T,
    item: GearItem,
    name: string,
  ): T & { inspection?: InspectionRecord } => {
    const inspection = inspectionOf(item);
    if (!inspection) {
      extraChecks.push(
        checkNeverExamined(name, item.itemCode, options.todayIso ?? "", {
          ruleSet,
          tables,
          liftDateIso: options.details?.liftDate ?? null,
        }),
      );
      return spec;
    }
    return { ...spec, inspection };
  };
  const legs: NonNullable<RiggingDescription["legs"]> = {};
  const noted = new Set<number>();
  for (const [leg, r] of Object.entries(rigging.legs)) {
    const out: LegRigging = r.eyePlane ? { eyePlane: r.eyePlane } : {};
    const eyebolt = r.eyeboltItemId !== undefined ? items.get(r.eyeboltItemId) : undefined;
    if (eyebolt) {
      const spec: EyeboltSpec = {
        family: (eyebolt.eyeboltFamily ?? "plain") as EyeboltFamily,
        thread: eyebolt.thread ?? "",
        wll: markedOf(eyebolt),
        ...identityOf(eyebolt),
      };
      out.eyebolt = withInspection(spec, eyebolt, `Eyebolt at ${leg}`);
    }
    const shackle = r.shackleItemId !== undefined ? items.get(r.shackleItemId) : undefined;
    if (shackle) {
      const pin = shackle.pinType === "screw" || shackle.pinType === "bolt" ? shackle.pinType : undefined;
      const spec: ShackleSpec = {
        type: shackle.shackleType === "dee" ? "dee" : "bow",
        wll: markedOf(shackle),
        ...(pin ? { pin } : {}),
        ...identityOf(shackle),
      };
      out.shackle = withInspection(spec, shackle, `Shackle at ${leg}`);
    }
    const sling = r.slingItemId !== undefined ? items.get(r.slingItemId) : undefined;
    const slingKind = sling ? SLING_KINDS[sling.kind] : undefined;
    if (sling && slingKind) {
      const legCount = sling.legs ?? 1;
      const spec: SlingSpec = {
        kind: slingKind,
        hitch: r.hitch,
        assemblyLegs: legCount,
        ...identityOf(sling),
        ...(sling.diameterMm !== null ? { diameterMm: sling.diameterMm } : {}),
        ...(sling.chainGrade !== null ? { grade: String(sling.chainGrade) } : {}),
      };
      const perLeg = legCount > 1 ? perLegWll(sling, legCount, tables, ruleSet) : null;
      if (perLeg) {
        spec.wllKg = perLeg.wllKg;
        spec.assemblyWll = markedOf(sling);
        if (!noted.has(sling.id)) {
          noted.add(sling.id);
          notes.push({
            code: "SLING_LEG_FROM_ASSEMBLY",
            message: `${sling.itemCode} is a ${legCount}-leg sling; each leg is taken as its marked WLL over the mode factor ${perLeg.factor} (${perLeg.source}).`,
          });
        }
      } else {
        spec.wll = markedOf(sling);
      }
      out.sling = withInspection(spec, sling, `Sling leg ${leg}`);
    }
    legs[leg] = out;
  }
  const description: RiggingDescription = { legs, contingencyPct: snapshot.contingencyPct };
  const link = rigging.masterLinkItemId !== undefined ? items.get(rigging.masterLinkItemId) : undefined;
  if (link) description.masterLink = withInspection({ wll: markedOf(link), ...identityOf(link) }, link, "Master link");
  const crane = rigging.craneItemId !== undefined ? items.get(rigging.craneItemId) : undefined;
  if (crane) {
    const spec: CraneSpec = {
      swlKg: crane.wllKg,
      swl: markedOf(crane),
      itemCode: crane.itemCode,
      ...(crane.hookHeightM !== null ? { maxHookHeightM: crane.hookHeightM } : {}),
    };
    description.crane = withInspection(spec, crane, "Crane or hoist");
    if (options.details)
      description.headroom = {
        clearanceAboveFloorM: options.details.floorClearanceM,
        loadUndersideZM: undersideZ(snapshot),
      };
  }
  return { description, extraChecks, notes };
}

/** One leg's WLL of a multi-leg sling, kg: marked for the assembly with legs up to 45 deg, over the rule set's mode factor. */
function perLegWll(sling: GearItem, legCount: number, tables: ReferenceTables, ruleSet: RuleSetId) {
  const mode = findModeFactor(tables.modeFactors, legCount === 2 ? 2 : 3, 45, ruleSet);
  return mode ? { wllKg: sling.wllKg / mode.factor, factor: mode.factor, source: mode.source } : null;
}

/** The lowest z of the load's elevation outline (its underside), m. */
function undersideZ(snapshot: ComponentDefinition): number {
  const zs = snapshot.outlineElevation.map((p) => p[1]);
  return zs.length ? Math.min(...zs) : 0;
}

export type ComputeOptions = {
  details?: Pick<PlanDetails, "floorClearanceM" | "liftDate">;
  tables?: ReferenceTables;
  transaction?: Transaction;
  /** The organisation's rule set; read from the organisation when not given. */
  ruleSet?: RuleSetId;
};

/**
 * The plan's results under the organisation's rule set: bridle and beam alike go through the core's
 * one entry, as /api/solve's bodies do. Allocation problems come back as a 400 with their issues.
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
  const ruleSet = options.ruleSet ?? (await getOrganisationRuleSet(organisationId, options.transaction));
  const items = await loadAllocatedGear(organisationId, rigging, options.transaction);
  const base = { kind: arrangement.kind, computedOn: todayIso };
  const issues = allocationIssues(rigging, items);
  if (issues.length > 0) {
    return { ...base, status: 400, body: { error: `The gear allocation is not valid: ${issues[0]!.message}`, issues } };
  }
  const liftDate = options.details?.liftDate;
  const { description, extraChecks, notes } = describeRigging(snapshot, rigging, items, tables, {
    details: options.details,
    ruleSet,
    todayIso,
  });
  const beamItem =
    arrangement.kind === "beam" && rigging.beamItemId !== undefined ? items.get(rigging.beamItemId) : undefined;
  const beamSpec = beamItem ? beamItemSpec(beamItem) : null;
  if (beamItem && beamSpec && !beamSpec.inspection)
    extraChecks.push(
      checkNeverExamined(beamItem.kind === "spreader" ? "Spreader beam" : "Lifting beam", beamItem.itemCode, todayIso, {
        ruleSet,
        tables,
        liftDateIso: liftDate ?? null,
      }),
    );
  const solved = solveArrangement(
    arrangementInput(snapshot, arrangement, description, {
      ruleSet,
      todayIso,
      liftDate,
      extra: { checks: extraChecks, notes },
      fit: fitOf(snapshot),
      beamItem: beamSpec,
    }),
    tables,
  );
  return { ...base, ...solved };
}
