import type { AnyCheck } from "~/plans/check-text";
import { worstVerdictForLeg } from "~/plans/check-text";
import { StatusBadge } from "~/components/results/status-badge";
import { formatAngle, formatForce, formatLength, formatLoad, formatUtilisation, type Units } from "~/utils/format";

export type LegRow = {
  liftPointId: string;
  lengthM: number;
  tensionKn: number;
  tensionKg: number;
  angleFromVerticalDeg: number;
  axisAngleDeg: number;
  verticalShare: number;
  slack: boolean;
};

/** A tension as a force and, for metric users, the mass it holds up, both rounded up: "16.18 kN (1,650 kg)" or "3,636 lbf". */
export function tensionText(kn: number, kg: number, units: Units) {
  return units === "metric" ? `${formatForce(kn, units)} (${formatLoad(kg, units)})` : formatForce(kn, units);
}

/** Each leg (or drop): length, tension, the tension it is rated for, angles, share and its worst check. */
export function LegTable({
  legs,
  design,
  checks = [],
  units,
  beam = false,
}: {
  legs: readonly LegRow[];
  design?: ReadonlyArray<{ liftPointId: string; designTensionKn: number; designTensionKg: number }>;
  checks?: readonly AnyCheck[];
  units: Units;
  beam?: boolean;
}) {
  return (
    // Focusable so a keyboard can scroll it when it is wider than its column (WCAG 2.1.1).
    <div className="overflow-x-auto" tabIndex={0} role="region" aria-label={beam ? "Drop figures" : "Leg figures"}>
      <table data-testid="leg-table">
        <thead>
          <tr>
            <th scope="col">{beam ? "Drop to" : "Leg to"}</th>
            <th scope="col">Length</th>
            <th scope="col">Tension</th>
            {design && <th scope="col">Rated for</th>}
            <th scope="col">From vertical</th>
            <th scope="col">Off the bolt axis</th>
            <th scope="col">Share</th>
            {checks.length > 0 && <th scope="col">Checks</th>}
          </tr>
        </thead>
        <tbody>
          {legs.map((leg) => {
            const rated = design?.find((l) => l.liftPointId === leg.liftPointId);
            const worst = worstVerdictForLeg(checks, leg.liftPointId);
            return (
              <tr key={leg.liftPointId}>
                <td className="font-semibold">{leg.liftPointId}</td>
                <td>{formatLength(leg.lengthM, units)}</td>
                <td className="whitespace-nowrap">
                  {leg.slack ? "slack" : tensionText(leg.tensionKn, leg.tensionKg, units)}
                </td>
                {design && (
                  <td className="whitespace-nowrap">
                    {rated ? tensionText(rated.designTensionKn, rated.designTensionKg, units) : "—"}
                  </td>
                )}
                <td>{formatAngle(leg.angleFromVerticalDeg)}</td>
                <td>{formatAngle(leg.axisAngleDeg)}</td>
                <td>{formatUtilisation(leg.verticalShare)}</td>
                {checks.length > 0 && <td>{worst ? <StatusBadge verdict={worst} /> : "—"}</td>}
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
