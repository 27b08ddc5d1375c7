// The plan's checks swept over hook height: at each height a level solve of the layout and the same
// checks the plan runs, so the hook-height chart shows the design load the checks use and each item's
// capacity at that height (an eyebolt derated for its angle, a sling leg by its hitch), and where each
// check starts to pass. Pure and shared with the browser.
import { solveLevel, type LiftPoint } from "~/statics/bridle";
import type { CheckKind, RiggingDescription, Verdict } from "~/statics/check-types";
import { checkRigging } from "~/statics/checks";
import { contingencyFactor } from "~/statics/checks-common";
import type { ReferenceTables, RuleSetId } from "~/statics/reference";

/** Checks whose load is one leg's design load, so they share the chart's axis with it. */
const LEG_ITEM_KINDS: readonly CheckKind[] = ["sling-leg", "eyebolt", "shackle"];

export type SweepItem = { id: string; item: string; kind: CheckKind; legs: string[] };

export type SweepPoint = {
  hookZM: number;
  /** The largest leg design load with contingency, kg: what the sling-leg, eyebolt and shackle checks carry. */
  designLoadKg: number;
  /** Per leg, its design load with contingency, kg. */
  legLoadKg: Record<string, number>;
  maxAngleDeg: number;
  /** Per item check id: its capacity at this height and its verdict. */
  items: Record<string, { loadKg: number; capacityKg: number; verdict: Verdict }>;
};

export type SweepInput = {
  massKg: number;
  cog: { x: number; y: number; z: number };
  points: ReadonlyArray<LiftPoint & { thread?: string }>;
  rigging?: RiggingDescription;
  tables?: ReferenceTables | null;
  ruleSet?: RuleSetId;
};

/** The layout solved level at `steps + 1` hook heights from fromZM to toZM (m); heights that cannot hang level are left out. */
export function hookSweep(input: SweepInput, fromZM: number, toZM: number, steps: number) {
  const items = new Map<string, SweepItem>();
  const out: SweepPoint[] = [];
  const factor = contingencyFactor(input.rigging?.contingencyPct);
  for (let i = 0; i <= steps; i++) {
    const z = fromZM + ((toZM - fromZM) * i) / steps;
    const r = solveLevel({ massKg: input.massKg, cog: input.cog }, input.points, z);
    if (!r.ok) continue;
    const s = r.solution;
    const legLoadKg = Object.fromEntries(s.rating.legs.map((l) => [l.liftPointId, l.designTensionKg * factor]));
    const point: SweepPoint = {
      hookZM: z,
      designLoadKg: Math.max(0, ...Object.values(legLoadKg)),
      legLoadKg,
      maxAngleDeg: Math.max(...s.legs.map((l) => l.angleFromVerticalDeg)),
      items: {},
    };
    if (input.rigging && input.tables) {
      const checks = checkRigging(
        s,
        input.massKg,
        input.cog,
        input.points.map((p) => ({ id: p.id, thread: p.thread, axis: p.axis })),
        input.rigging,
        input.tables,
        undefined,
        { ruleSet: input.ruleSet },
      );
      for (const c of checks) {
        if (!LEG_ITEM_KINDS.includes(c.kind) || c.loadKg === null || c.capacityKg === null) continue;
        if (!items.has(c.id)) items.set(c.id, { id: c.id, item: c.item, kind: c.kind, legs: c.position.legs });
        point.items[c.id] = { loadKg: c.loadKg, capacityKg: c.capacityKg, verdict: c.verdict };
      }
    }
    out.push(point);
  }
  return { points: out, items: [...items.values()] };
}

/**
 * The lowest swept hook height (m) from which the check passes at every higher swept height; null when it
 * fails or warns at the top of the sweep (no height shown puts it right) or was never judged.
 */
export function passesFrom(points: readonly SweepPoint[], id: string): number | null {
  let from: number | null = null;
  for (let i = points.length - 1; i >= 0; i--) {
    const item = points[i]!.items[id];
    if (!item) continue;
    if (item.verdict !== "pass") break;
    from = points[i]!.hookZM;
  }
  return from;
}
