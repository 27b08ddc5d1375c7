// The sealed record of an approved revision: everything its page, its print and its verify page show,
// stored once in the approval's transaction and never read again from live rows. Its SHA-256 is the
// revision's fingerprint. Pure and shared with the browser.
import type { ComponentDefinition } from "~/loads/component-definition";
import type { LoadOverrideMark } from "~/plans/load-override";
import type { Arrangement, PlanDetails, PlanResultsBody, RiggingAllocation } from "~/plans/document";

export type GearSlot = "eyebolt" | "shackle" | "sling" | "masterLink" | "crane" | "beam";

/** One allocated item as it was when the revision was approved, with what it carries in the plan. */
export type SealedItem = {
  /** "Leg A eyebolt", "Master link", "Crane or hoist" */
  position: string;
  slot: GearSlot;
  leg: string | null;
  itemId: number;
  itemCode: string;
  kind: string;
  /** "Chain sling 8 mm grade 8, 2 legs, 2.0 m" */
  description: string;
  serial: string;
  manufacturer: string;
  /** The marked WLL in kg, and as marked ("2 t"). */
  wllKg: number;
  wllMarked: string;
  /** The item's own mass where the register has it (beams), kg. */
  massKg: number | null;
  lastExaminedOn: string | null;
  nextDueOn: string | null;
  /** "Examined 2025-03-14 by A. Examiner (pass); certificate cert-0311.pdf" */
  certificate: string;
  /** The load this item carries in the plan, kg (with contingency where the check applies it). */
  loadKg: number | null;
  /** load / derated WLL, unrounded; printed rounded up. */
  utilisation: number | null;
};

export type SealedPlan = {
  seal: 1;
  planId: number;
  organisationName: string;
  title: string;
  site: { name: string; customer: string; address: string };
  job: { workOrder: string; title: string; startsOn: string | null };
  revision: number;
  dates: { createdAt: string; submittedAt: string | null; approvedAt: string };
  planner: { id: number; name: string };
  submitter: { id: number; name: string } | null;
  approval: {
    userId: number;
    name: string;
    role: string;
    approvedAt: string;
    comment: string;
    selfApproved: boolean;
    typedName: string;
  };
  component: { id: number | null; version: number | null };
  /** The load as planned (the plan's copy of the component, with the planner's override of its mass and CoG). */
  snapshot: ComponentDefinition;
  /** Where the load as planned differs from the component, with both figures and the reason; absent in older seals. */
  loadOverride?: LoadOverrideMark | null;
  arrangement: Arrangement;
  rigging: RiggingAllocation;
  /** The server's results (status 200 body) worked out on approval. */
  results: PlanResultsBody;
  resultsComputedOn: string;
  schedule: SealedItem[];
  details: PlanDetails;
  acknowledgements: Array<{
    checkId: string;
    checkItem: string;
    checkMessage: string;
    reason: string;
    by: string;
    at: string;
  }>;
};

/** The sealed record stored on a revision, or null when there is none (not approved, or approved before sealing). */
export function readSealed(json: string | null | undefined): SealedPlan | null {
  if (!json) return null;
  const value = JSON.parse(json) as SealedPlan;
  return value && value.seal === 1 ? value : null;
}
