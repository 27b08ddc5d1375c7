// Multi-leg rating: the tension each leg (or beam drop) is rated for, and the rule that set it.
// Symmetric slings follow the standards' uniform load method; slings that are not symmetric are
// rated for every statically admissible state with a leg slack and for the 2-leg (diagonal) rule.
import {
  MIN_DIRECTION_DET,
  NEGATIVE_TENSION_TOL,
  RAD_TO_DEG,
  SYMMETRY_ANGLE_TOL_DEG,
  SYMMETRY_TENSION_TOL,
  type BridleRating,
  type DesignGovernor,
  type LegDesignTension,
  type LegResult,
  type SolveMethod,
} from "./bridle-types";
import { STANDARD_GRAVITY_MS2 } from "./units";
import { columns3, cross, det3, dot, perpendicular, solve3, sub, type Vec3 } from "./vector";

const SOURCE_STATICS = "statics: equilibrium of the loads in the taut legs";
const SOURCE_ELASTIC = "statics: elastic share of slings of equal EA (stiffness 1/L)";
const SOURCE_UNIFORM = "DGUV Regel 100-500 (symmetric: 3 legs of a 4-leg sling carry); EN 818-4 / EN 13414-1 uniform load method";
const SOURCE_ONE_SLACK = "DGUV Regel 100-500 (not symmetric: fewer legs carry); statics of the legs left carrying";
const SOURCE_DIAGONAL = "US Navy NAVEDTRA rigging manuals (rate 3- and 4-leg bridles as 2-leg); DGUV Regel 100-500";
const SOURCE_RATING = "DGUV Regel 100-500; US Navy NAVEDTRA rigging manuals; EN 818-4 / EN 13414-1 mode factors";

/** The most each leg carries over the admissible states with slack legs, and which legs are slack then. */
export interface SlackStates {
  /** kN per leg; 0 when no admissible state loads the leg. */
  maxKn: number[];
  /** Per leg, the indices of the slack legs in the state that loads it most (empty when none). */
  slackIdx: number[][];
}

/** Per leg, the lever-rule figure when only its diagonal of four carries, and the diagonal partner. */
export interface DiagonalFigures {
  kn: number[];
  partner: number[];
}

export interface RatingLeg {
  liftPointId: string;
  tensionKn: number;
  angleFromVerticalDeg: number;
}

export function emptySlackStates(n: number): SlackStates {
  return { maxKn: new Array<number>(n).fill(0), slackIdx: Array.from({ length: n }, () => []) };
}

/** Records one admissible state (tensions kN per leg, `carrying` the loaded legs) into the running maxima. */
export function recordSlackState(states: SlackStates, tensionsKn: readonly number[], carrying: readonly number[], n: number): void {
  for (const i of carrying) {
    const t = Math.max(0, tensionsKn[i]!);
    if (t > states.maxKn[i]!) {
      states.maxKn[i] = t;
      states.slackIdx[i] = Array.from({ length: n }, (_, k) => k).filter((k) => !carrying.includes(k));
    }
  }
}

/**
 * Four legs meeting at one hook: every statically admissible state with one leg slack (the
 * determinate solve of each triple, all three tensions >= 0), and with two slack (a pair whose plane
 * holds the vertical). The admissible states of four legs form a segment whose ends have a leg slack,
 * so these maxima bound the leg loads over every admissible state, the elastic share included.
 */
export function bridleSlackStates(us: readonly Vec3[], vertical: Vec3, weightKn: number): SlackStates {
  const n = us.length;
  const states = emptySlackStates(n);
  if (n !== 4) return states;
  const w = { x: weightKn * vertical.x, y: weightKn * vertical.y, z: weightKn * vertical.z };
  const tol = -NEGATIVE_TENSION_TOL * weightKn;
  const t = [0, 0, 0, 0];
  for (let m = 0; m < 4; m++) {
    const tri = [0, 1, 2, 3].filter((k) => k !== m);
    const [a, b, c] = tri as [number, number, number];
    const mat = columns3(us[a]!, us[b]!, us[c]!);
    if (!(Math.abs(det3(mat)) > MIN_DIRECTION_DET)) continue;
    const s = solve3(mat, w);
    if (s === null || s.x < tol || s.y < tol || s.z < tol) continue;
    t[a] = s.x;
    t[b] = s.y;
    t[c] = s.z;
    t[m] = 0;
    recordSlackState(states, t, tri, n);
  }
  for (let i = 0; i < 4; i++) {
    for (let j = i + 1; j < 4; j++) {
      const ui = us[i]!;
      const uj = us[j]!;
      const cij = dot(ui, uj);
      const det = 1 - cij * cij;
      if (!(det > MIN_DIRECTION_DET)) continue;
      const bi = dot(ui, w);
      const bj = dot(uj, w);
      const ti = (bi - cij * bj) / det;
      const tj = (bj - cij * bi) / det;
      const rx = ti * ui.x + tj * uj.x - w.x;
      const ry = ti * ui.y + tj * uj.y - w.y;
      const rz = ti * ui.z + tj * uj.z - w.z;
      if (Math.sqrt(rx * rx + ry * ry + rz * rz) > 1e-7 * weightKn || ti < tol || tj < tol) continue;
      t.fill(0);
      t[i] = ti;
      t[j] = tj;
      recordSlackState(states, t, [i, j], n);
    }
  }
  return states;
}

/**
 * Four legs: the tension (kN) each leg takes if it and its diagonal partner carry the whole weight,
 * shared by the lever rule on the plan projection (normal to `vertical`), at the leg's own angle.
 * Lift points are ordered around the CoG's plumb line; the CoG's plumb point is projected onto each
 * diagonal and clamped to it.
 */
export function diagonalTwoLegTensions(
  anglesFromVerticalDeg: readonly number[],
  positions: readonly Vec3[],
  cog: Vec3,
  vertical: Vec3,
  weightKn: number,
): DiagonalFigures {
  const e1 = perpendicular(vertical);
  const e2 = cross(vertical, e1);
  const plan = positions.map((p) => {
    const r = sub(p, cog);
    return { a: dot(r, e1), b: dot(r, e2) };
  });
  const order = plan.map((_, i) => i).sort((i, j) => Math.atan2(plan[i]!.b, plan[i]!.a) - Math.atan2(plan[j]!.b, plan[j]!.a));
  const kn = new Array<number>(positions.length).fill(0);
  const partner = new Array<number>(positions.length).fill(-1);
  const pairs: Array<[number, number]> = [
    [order[0]!, order[2]!],
    [order[1]!, order[3]!],
  ];
  for (const [i, j] of pairs) {
    partner[i] = j;
    partner[j] = i;
    const qi = plan[i]!;
    const qj = plan[j]!;
    const da = qj.a - qi.a;
    const db = qj.b - qi.b;
    const len2 = da * da + db * db;
    let s = len2 > 1e-18 ? -(qi.a * da + qi.b * db) / len2 : 0.5;
    s = Math.min(1, Math.max(0, s));
    const shares: Array<[number, number]> = [
      [i, 1 - s],
      [j, s],
    ];
    for (const [idx, share] of shares) {
      const c = Math.max(1e-6, Math.cos(anglesFromVerticalDeg[idx]! / RAD_TO_DEG));
      kn[idx] = (share * weightKn) / c;
    }
  }
  return { kn, partner };
}

function kgOf(kn: number): number {
  return (kn * 1000) / STANDARD_GRAVITY_MS2;
}

export interface RateLegsInput {
  legs: readonly RatingLeg[];
  weightKn: number;
  /** How the statics tensions were found (elastic share for 4 taut legs). */
  method: SolveMethod;
  /** 4 legs: the diagonal (2-leg) figures. */
  diagonal: DiagonalFigures | null;
  /** 3+ legs: maxima over the admissible states with a leg slack. */
  slack: SlackStates | null;
  /** "leg" for a sling from one hook, "drop" for vertical drops from a beam. */
  noun: "leg" | "drop";
}

/**
 * Rates legs by the multi-leg rules. Symmetric (angles within SYMMETRY_ANGLE_TOL_DEG, tensions within
 * SYMMETRY_TENSION_TOL): the uniform load method, 4 legs taken as 3 carrying. Not symmetric: each of
 * 4 legs is rated for the largest of its statics tension, its load in every admissible state with a
 * leg slack, and its diagonal (2-leg) figure; 1-3 legs keep their determinate tensions.
 */
export function rateLegs(input: RateLegsInput): BridleRating {
  const { legs, weightKn, method, diagonal, slack, noun } = input;
  const n = legs.length;
  let maxBeta = 0;
  let minBeta = Infinity;
  let maxT = 0;
  let minT = Infinity;
  for (const leg of legs) {
    maxBeta = Math.max(maxBeta, leg.angleFromVerticalDeg);
    minBeta = Math.min(minBeta, leg.angleFromVerticalDeg);
    maxT = Math.max(maxT, leg.tensionKn);
    minT = Math.min(minT, leg.tensionKn);
  }
  const symmetric =
    n <= 1 ||
    (maxBeta - minBeta <= SYMMETRY_ANGLE_TOL_DEG && maxT > 0 && (maxT - minT) / maxT <= SYMMETRY_TENSION_TOL);
  const sling = noun === "leg" ? `${n}-leg sling` : `${n} drops from a beam`;
  let effectiveLegs: 1 | 2 | 3;
  let rule: string;
  if (n === 1) {
    effectiveLegs = 1;
    rule = noun === "leg" ? "Single leg: the leg carries the whole load." : "Single drop: the drop carries the whole load.";
  } else if (n === 2) {
    effectiveLegs = symmetric ? 2 : 1;
    rule = symmetric
      ? `${sling}, symmetric: both carry (uniform load method, 2-leg mode factor).`
      : `${sling}, not symmetric: rated as if 1 leg carries (DGUV Regel 100-500); ${noun} loads from statics (lever rule).`;
  } else if (n === 3) {
    effectiveLegs = symmetric ? 3 : 2;
    rule = symmetric
      ? `${sling}, symmetric: all 3 carry (uniform load method, 3/4-leg mode factor).`
      : `${sling}, not symmetric: rated as if only 2 legs carry (NAVEDTRA; DGUV Regel 100-500); ${noun} loads from statics, or from a state with a ${noun} slack where that is larger.`;
  } else if (symmetric) {
    effectiveLegs = 3;
    rule = `${sling}, symmetric: rated as if 3 carry (DGUV Regel 100-500; 3/4-leg mode factor); each ${noun} rated for W / (3 cos beta) or its statics share if larger. The 2-leg (diagonal) figure is shown beside it.`;
  } else {
    effectiveLegs = 2;
    rule = `${sling}, not symmetric: rated as if only 2 carry (NAVEDTRA; DGUV Regel 100-500); each ${noun} rated for the most it carries with any ${noun} slack, its diagonal's lever-rule share, or its statics share, whichever is largest.`;
  }
  let maxDesign = 0;
  const out: LegDesignTension[] = legs.map((leg, i) => {
    const id = leg.liftPointId;
    const cands: Array<{ kn: number; gov: DesignGovernor; rule: string; source: string }> = [
      method === "elastic"
        ? { kn: leg.tensionKn, gov: "elastic", rule: `${cap(noun)} ${id}: its elastic share of equal slings (stiffness 1/L).`, source: SOURCE_ELASTIC }
        : { kn: leg.tensionKn, gov: "determinate", rule: `${cap(noun)} ${id}: its tension from the equilibrium of the taut ${noun}s.`, source: SOURCE_STATICS },
    ];
    if (n === 4 && symmetric) {
      const c = Math.max(1e-6, Math.cos(leg.angleFromVerticalDeg / RAD_TO_DEG));
      cands.push({ kn: weightKn / (3 * c), gov: "three-leg-uniform", rule: `${cap(noun)} ${id}: W / (3 cos beta), 3 of 4 taken to carry a symmetric load.`, source: SOURCE_UNIFORM });
    }
    const slackIds = slack ? slack.slackIdx[i]!.map((k) => legs[k]!.liftPointId) : [];
    if (!symmetric && n >= 3 && slack && slack.maxKn[i]! > 0) {
      const which = slackIds.length === 1 ? `${noun} ${slackIds[0]} is slack` : `${noun}s ${slackIds.join(" and ")} are slack`;
      cands.push({
        kn: slack.maxKn[i]!,
        gov: "one-slack",
        rule: `${cap(noun)} ${id}: its tension when ${which} and the others carry, a state the load reaches when the slings differ slightly in length.`,
        source: SOURCE_ONE_SLACK,
      });
    }
    const partner = diagonal ? diagonal.partner[i]! : -1;
    if (!symmetric && n === 4 && diagonal) {
      cands.push({
        kn: diagonal.kn[i]!,
        gov: "diagonal",
        rule: `${cap(noun)} ${id}: its lever-rule share when only the diagonal ${id}-${legs[partner]?.liftPointId ?? "?"} carries.`,
        source: SOURCE_DIAGONAL,
      });
    }
    let design = 0;
    for (const c of cands) design = Math.max(design, c.kn);
    // The first figure (statics, uniform, one slack, diagonal) that reaches the design tension governs.
    const gov = cands.find((c) => c.kn >= design * (1 - 1e-12)) ?? cands[0]!;
    maxDesign = Math.max(maxDesign, design);
    const entry: LegDesignTension = {
      liftPointId: id,
      designTensionKn: design,
      designTensionKg: kgOf(design),
      governedBy: gov.gov,
      rule: gov.rule,
      source: gov.source,
    };
    if (n === 4 && diagonal) {
      entry.twoLegTensionKn = diagonal.kn[i]!;
      entry.twoLegTensionKg = kgOf(diagonal.kn[i]!);
    }
    if (n >= 3 && slack) {
      entry.oneSlackTensionKn = slack.maxKn[i]!;
      entry.oneSlackTensionKg = kgOf(slack.maxKn[i]!);
      entry.slackLegIds = slackIds;
    }
    return entry;
  });
  return {
    legCount: n,
    symmetric,
    effectiveLegs,
    maxAngleFromVerticalDeg: maxBeta,
    rule,
    source: SOURCE_RATING,
    legs: out,
    designTensionKn: maxDesign,
    designTensionKg: kgOf(maxDesign),
  };
}

function cap(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** Rates a solved bridle: the statics tensions, and for 4 legs the one-slack and diagonal figures. */
export function rateBridle(
  legs: readonly LegResult[],
  liftPointPositions: readonly Vec3[],
  cog: Vec3,
  vertical: Vec3,
  weightKn: number,
  method?: SolveMethod,
): BridleRating {
  const n = legs.length;
  const m: SolveMethod = method ?? (n === 4 && legs.every((l) => !l.slack) ? "elastic" : "determinate");
  const four = n === 4;
  return rateLegs({
    legs,
    weightKn,
    method: m,
    diagonal: four ? diagonalTwoLegTensions(legs.map((l) => l.angleFromVerticalDeg), liftPointPositions, cog, vertical, weightKn) : null,
    slack: four ? bridleSlackStates(legs.map((l) => l.direction), vertical, weightKn) : null,
    noun: "leg",
  });
}
