import { ChecksList } from "~/components/results/checks-list";
import { GoverningSummary } from "~/components/results/governing-summary";
import { LegTable, type LegRow } from "~/components/results/leg-table";
import { warningSentence, type AnyCheck } from "~/plans/check-text";
import type { RuleSetId } from "~/statics/reference";
import { formatAngle, formatForce, type Units } from "~/utils/format";

export type ResultState =
  | { kind: "idle" }
  | { kind: "loading" }
  | { kind: "failed"; message: string }
  | { kind: "done"; status: number; body: unknown; stale: boolean };

type Body = {
  mode: "level" | "lengths";
  method: "determinate" | "elastic";
  weightKn: number;
  tiltDeg: number;
  legs: LegRow[];
  warnings: Array<{ code: string; message: string }>;
  rating?: {
    rule: string;
    source: string;
    effectiveLegs: number;
    legs?: Array<{ liftPointId: string; designTensionKn: number; designTensionKg: number }>;
  };
  ruleSet?: RuleSetId;
  checks?: AnyCheck[];
};

/** Warnings the checks already show (leg angles) are not repeated; the rest read in the user's units. */
export function warningsBesideChecks(warnings: ReadonlyArray<{ code: string; message: string }>, units: Units) {
  return warnings
    .filter((w) => !w.code.startsWith("LEG_ANGLE_"))
    .map((w) => ({ code: w.code, message: warningSentence(w, units) }));
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
  const warnings = warningsBesideChecks(body.warnings, units);
  return (
    <>
      <p className="text-sm">
        Load weight {formatForce(body.weightKn, units)} ·{" "}
        {body.mode === "lengths" ? `hangs tilted ${formatAngle(body.tiltDeg)} from level` : "hangs level"} ·{" "}
        {body.method === "elastic"
          ? "four legs: tensions shared as equal-stiffness legs (elastic)"
          : "tensions from statics (determinate)"}
      </p>
      <GoverningSummary checks={checks} units={units} ruleSet={body.ruleSet} />
      <LegTable legs={body.legs} design={body.rating?.legs} checks={checks} units={units} />
      {body.rating && (
        <p className="text-xs text-ink-soft">
          Sling rated by: {body.rating.rule} ({body.rating.source}). Tensions are before contingency; the checks add it.
        </p>
      )}
      {warnings.length > 0 && (
        <ul className="space-y-1 text-sm text-warn">
          {warnings.map((w, i) => (
            <li key={i}>⚠ {w.message}</li>
          ))}
        </ul>
      )}
      <ChecksList checks={checks} units={units} />
    </>
  );
}
