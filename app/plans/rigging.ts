// Gear as the plan editor offers and allocates it, and the rigging description the checks take,
// assembled from an allocation. Pure and shared: the server makes the picks from its register.
import type { ComponentDefinition } from "~/loads/component-definition";
import type { RiggingAllocation } from "~/plans/document";
import type {
  CraneSpec,
  EyeboltSpec,
  InspectionRecord,
  LegRigging,
  MasterLinkSpec,
  RiggingDescription,
  ShackleSpec,
  SlingSpec,
} from "~/statics/check-types";

export type GearRole = "eyebolt" | "shackle" | "sling" | "masterLink" | "crane" | "beam";

export const GEAR_ROLE_LABELS: Record<GearRole, string> = {
  eyebolt: "Eyebolt",
  shackle: "Shackle",
  sling: "Sling",
  masterLink: "Master link",
  crane: "Crane or hoist",
  beam: "Lifting beam or spreader",
};

/** A register item as the editor's picker shows it, with the spec the checks need. */
export type GearPick = {
  id: number;
  itemCode: string;
  role: GearRole;
  /** "Chain sling 8 mm grade 8, 2 legs, 2.0 m" */
  description: string;
  wllKg: number;
  thread: string | null;
  lengthM: number | null;
  status: "in_service" | "quarantined" | "withdrawn";
  nextDueOn: string | null;
  /** The item's own mass, kg, where recorded. */
  massKg: number | null;
  /** The spec in the checks' terms (without hitch or inspection, added on assembly). */
  spec:
    | { role: "eyebolt"; eyebolt: Omit<EyeboltSpec, "inspection"> }
    | { role: "shackle"; shackle: Omit<ShackleSpec, "inspection"> }
    | { role: "sling"; sling: Omit<SlingSpec, "inspection" | "hitch"> }
    | { role: "masterLink"; masterLink: Omit<MasterLinkSpec, "inspection"> }
    | { role: "crane"; crane: Omit<CraneSpec, "inspection"> }
    | {
        role: "beam";
        /** The beam's geometry from the register (null where its lugs are not recorded), m from end A; kg. */
        beam: {
          kind: "beam" | "spreader";
          lengthM: number;
          dropLugsM: number[];
          topLugsM: number[];
          massKg: number;
        } | null;
      };
};

function inspection(pick: GearPick): InspectionRecord | undefined {
  return pick.nextDueOn ? { itemId: pick.itemCode, status: pick.status, examinationDue: pick.nextDueOn } : undefined;
}

/**
 * The rigging description for the checks from an allocation and the picks it names; items not
 * among the picks are left out (the server's own computation reports them).
 */
export function assembleRigging(
  allocation: RiggingAllocation,
  picks: ReadonlyMap<number, GearPick>,
  options: { contingencyPct: number; floorClearanceM?: number; loadUndersideZM?: number },
): RiggingDescription {
  const legs: NonNullable<RiggingDescription["legs"]> = {};
  for (const [label, leg] of Object.entries(allocation.legs)) {
    const out: LegRigging = leg.eyePlane ? { eyePlane: leg.eyePlane } : {};
    const eyebolt = leg.eyeboltItemId !== undefined ? picks.get(leg.eyeboltItemId) : undefined;
    if (eyebolt?.spec.role === "eyebolt") out.eyebolt = { ...eyebolt.spec.eyebolt, inspection: inspection(eyebolt) };
    const shackle = leg.shackleItemId !== undefined ? picks.get(leg.shackleItemId) : undefined;
    if (shackle?.spec.role === "shackle") out.shackle = { ...shackle.spec.shackle, inspection: inspection(shackle) };
    const sling = leg.slingItemId !== undefined ? picks.get(leg.slingItemId) : undefined;
    if (sling?.spec.role === "sling")
      out.sling = { ...sling.spec.sling, hitch: leg.hitch, inspection: inspection(sling) };
    legs[label] = out;
  }
  const description: RiggingDescription = { legs, contingencyPct: options.contingencyPct };
  const link = allocation.masterLinkItemId !== undefined ? picks.get(allocation.masterLinkItemId) : undefined;
  if (link?.spec.role === "masterLink")
    description.masterLink = { ...link.spec.masterLink, inspection: inspection(link) };
  const crane = allocation.craneItemId !== undefined ? picks.get(allocation.craneItemId) : undefined;
  if (crane?.spec.role === "crane") {
    description.crane = { ...crane.spec.crane, inspection: inspection(crane) };
    if (options.floorClearanceM !== undefined) {
      description.headroom = {
        clearanceAboveFloorM: options.floorClearanceM,
        loadUndersideZM: options.loadUndersideZM ?? 0,
      };
    }
  }
  return description;
}

/** The component's fit tolerance as the solve takes it (null: none recorded, so common practice applies). */
export function fitOf(snapshot: Pick<ComponentDefinition, "fitToleranceDeg" | "fitToleranceSource">) {
  return {
    toleranceDeg: snapshot.fitToleranceDeg ?? null,
    ...(snapshot.fitToleranceSource ? { source: snapshot.fitToleranceSource } : {}),
  };
}
