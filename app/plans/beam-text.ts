// One line about the beam a plan uses, for its page and its print: the register item with its figures, or
// the figures typed on a plan made before beams came from the register, said to be so. Pure.
import type { Arrangement, PlanResultsBody } from "~/plans/document";
import { formatLength, formatMass, type Units } from "~/utils/format";

export function beamLine(arrangement: Arrangement, beam: PlanResultsBody["beam"] | undefined, units: Units): string {
  const drops = arrangement.beam ? `, drops ${formatLength(arrangement.beam.dropLengthM, units)}` : "";
  if (beam?.itemCode)
    return `${beam.itemCode} from the register: own mass ${formatMass(beam.massKg, units)}, marked WLL ${formatMass(beam.wllKg, units)}${drops}`;
  const typed = arrangement.beam;
  const mass = beam?.massKg ?? typed?.massKg;
  const wll = beam?.wllKg ?? typed?.wllKg;
  if (mass === undefined || wll === undefined) return `No beam allocated from the register${drops}`;
  const length = typed?.lengthM !== undefined ? `${formatLength(typed.lengthM, units)} long, ` : "";
  return `Typed on the plan, not from the register: ${length}own mass ${formatMass(mass, units)}, WLL ${formatMass(wll, units)}${drops}`;
}
