import type { CheckResult } from "~/statics/checks";
import { ceilTo } from "~/statics/units";
import { formatLength, type Units } from "~/utils/format";

export type ResultState =
  | { kind: "idle" }
  | { kind: "loading" }
  | { kind: "failed"; message: string }
  | { kind: "done"; status: number; body: unknown; stale: boolean };

type Leg = {
  liftPointId: string;
  lengthM: number;
  tensionKn: number;
  tensionKg: number;
  angleFromVerticalDeg: number;
  axisAngleDeg: number;
  verticalShare: number;
  slack: boolean;
};
type Body = {
  mode: "level" | "lengths";
  method: "determinate" | "elastic";
  weightKn: number;
  tiltDeg: number;
  legs: Leg[];
  warnings: Array<{ code: string; message: string }>;
  rating?: { rule: string; source: string; effectiveLegs: number };
  checks?: CheckResult[];
};

const STATUS_TEXT = { pass: "Pass", warn: "Warn", fail: "Fail" } as const;
const STATUS_CLASS = {
  pass: "bg-pass-soft text-pass",
  warn: "bg-warn-soft text-warn",
  fail: "bg-fail-soft text-fail",
} as const;

/** The worst check status on a leg (checks named "<kind>-<leg>"), or null when none. */
export function worstStatusForLeg(
  checks: ReadonlyArray<Pick<CheckResult, "id" | "status">>,
  label: string,
): "pass" | "warn" | "fail" | null {
  let worst: "pass" | "warn" | "fail" | null = null;
  const rank = { pass: 0, warn: 1, fail: 2 } as const;
  for (const c of checks) {
    if (!c.id.endsWith(`-${label}`)) continue;
    if (worst === null || rank[c.status] > rank[worst]) worst = c.status;
  }
  return worst;
}

/** A utilisation as a percentage, rounded up (never down). */
export function utilisationText(u: number | null) {
  if (u === null || !Number.isFinite(u)) return "—";
  return `${ceilTo(u * 100, 0)} %`;
}

export function StatusBadge({ status }: { status: "pass" | "warn" | "fail" }) {
  return (
    <span className={`inline-block rounded px-1.5 py-0.5 text-xs font-semibold ${STATUS_CLASS[status]}`}>
      {STATUS_TEXT[status]}
    </span>
  );
}

/** Leg figures, warnings and every check with its verdict in words, as worked out by the statics core. */
export function LiveResults({ state, units }: { state: ResultState; units: Units }) {
  return (
    <section
      className="space-y-3 rounded border border-rule bg-card p-4"
      aria-labelledby="results-heading"
      aria-live="polite"
      data-testid="results"
    >
      <h2 id="results-heading" className="text-lg">
        Figures and checks{" "}
        {state.kind === "done" && state.stale && <span className="text-sm font-normal text-ink-soft">(updating…)</span>}
      </h2>
      {state.kind === "idle" && (
        <p className="text-sm text-ink-soft">The figures appear here as you lay out the lift.</p>
      )}
      {state.kind === "loading" && <p className="text-sm text-ink-soft">Working out the figures…</p>}
      {state.kind === "failed" && <p className="text-sm text-fail">{state.message}</p>}
      {state.kind === "done" && state.status !== 200 && (
        <p
          role="alert"
          className="rounded border border-fail/40 bg-fail-soft p-2 text-sm text-fail"
          data-testid="results-error"
        >
          {(state.body as { error?: string }).error ?? "The lift cannot be worked out as laid out."}
        </p>
      )}
      {state.kind === "done" && state.status === 200 && <Figures body={state.body as Body} units={units} />}
      <p className="text-xs text-ink-soft">
        These figures assume a rigid load, legs meeting at one point, the marked WLLs and the mass and CoG as entered.
        They support, and do not replace, the judgement of the appointed person and your local lifting regulations
        (LOLER / BS 7121, OSHA / ASME B30, or the local equivalent).
      </p>
    </section>
  );
}

function Figures({ body, units }: { body: Body; units: Units }) {
  const checks = body.checks ?? [];
  return (
    <>
      <p className="text-sm">
        Load weight {body.weightKn.toFixed(2)} kN ·{" "}
        {body.mode === "lengths" ? `hangs tilted ${body.tiltDeg.toFixed(1)}° from level` : "hangs level"} ·{" "}
        {body.method === "elastic"
          ? "four legs: tensions shared as equal-stiffness legs (elastic)"
          : "tensions from statics (determinate)"}
      </p>
      <div className="overflow-x-auto">
        <table data-testid="leg-table">
          <thead>
            <tr>
              <th scope="col">Leg</th>
              <th scope="col">Length</th>
              <th scope="col">Tension</th>
              <th scope="col">From vertical</th>
              <th scope="col">To hole axis</th>
              <th scope="col">Share</th>
            </tr>
          </thead>
          <tbody>
            {body.legs.map((leg) => (
              <tr key={leg.liftPointId}>
                <td className="font-semibold">{leg.liftPointId}</td>
                <td>{formatLength(leg.lengthM, units)}</td>
                <td className="whitespace-nowrap">
                  {leg.slack
                    ? "slack"
                    : `${leg.tensionKn.toFixed(2)} kN (${Math.round(leg.tensionKg).toLocaleString("en-GB")} kg)`}
                </td>
                <td>{leg.angleFromVerticalDeg.toFixed(1)}°</td>
                <td>{leg.axisAngleDeg.toFixed(1)}°</td>
                <td>{ceilTo(leg.verticalShare * 100, 1)} %</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {body.rating && (
        <p className="text-xs text-ink-soft">
          Sling rated by: {body.rating.rule} ({body.rating.source}).
        </p>
      )}
      {body.warnings.length > 0 && (
        <ul className="space-y-1 text-sm text-warn">
          {body.warnings.map((w, i) => (
            <li key={i}>⚠ {w.message}</li>
          ))}
        </ul>
      )}
      {checks.length === 0 ? (
        <p className="text-sm text-ink-soft">No checks yet: allocate gear to check each item against its WLL.</p>
      ) : (
        <ul className="space-y-1.5 text-sm" data-testid="checks">
          {checks.map((c) => (
            <li key={c.id} className="flex gap-2">
              <StatusBadge status={c.status} />
              <span>
                <span className="font-semibold">{c.item}</span>
                {c.utilisation !== null && <span className="ml-1">· {utilisationText(c.utilisation)} of capacity</span>}
                <span className="block text-ink-soft">{c.message}</span>
                <span className="block text-xs text-ink-soft">
                  {c.rule} · {c.source}
                </span>
              </span>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
