// What the printed plan shows: the sealed record of the revision, and beside it the gear's state now
// and who printed it when. Everything is decided before printing (server side) and handed to the
// PDF builder as plain data, so the PDF never works anything out for itself.
import type { ComponentDefinition } from "~/loads/component-definition";
import type { Arrangement, PlanDetails, PlanResultsBody } from "~/plans/document";
import type { LoadOverrideMark } from "~/plans/load-override";
import type { LiveGearState } from "~/plans/live-state";
import type { Units } from "~/utils/format";

export type PrintableScheduleRow = {
  /** "Leg A eyebolt", "Master link", "Crane or hoist" */
  position: string;
  itemCode: string;
  description: string;
  wllKg: number;
  /** The load this item carries in the plan, kg (with contingency where the check applies it). */
  loadKg: number | null;
  /** load / derated WLL, unrounded; printed rounded up. */
  utilisation: number | null;
  nextDueOn: string | null;
  /** As sealed (absent from prints made before sealing): serial and the latest examination and certificate. */
  serial?: string;
  certificate?: string;
};

export type PrintablePlan = {
  organisationName: string;
  title: string;
  site: { name: string; customer: string; address: string };
  job: { workOrder: string; title: string };
  revision: number;
  status: "approved" | "superseded" | "completed" | "cancelled";
  units: Units;
  planner: { name: string };
  approval: { name: string; role: string; approvedAt: string; comment: string; selfApproved: boolean };
  /** SHA-256 (hex) of the sealed record. */
  fingerprint: string;
  /** Absolute URL of /verify/<token>, for the QR code. */
  verifyUrl: string;
  printedAt: string;
  printedBy: string;
  snapshot: ComponentDefinition;
  /** Where the load as planned differs from the component (both figures and the reason). */
  loadOverride?: LoadOverrideMark | null;
  arrangement: Arrangement;
  /** The server's results (status 200 body) of the approved revision. */
  results: PlanResultsBody;
  schedule: PrintableScheduleRow[];
  details: PlanDetails;
  acknowledgements: Array<{ checkItem: string; reason: string; by: string; at: string }>;
  /** The gear judged when printing (an approved revision); NOT FIT TO LIFT is printed across every page. */
  live?: LiveGearState | null;
  /** The lift made to a completed revision. */
  liftRecord?: { liftedAt: string; by: string } | null;
};
