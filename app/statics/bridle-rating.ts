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
const SOURCE_UNIFORM =
  "DGUV Regel 100-500 (symmetric: 3 legs of a 4-leg sling carry); EN 818-4 / EN 13414-1 uniform load method";
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
  const slackIdx: number[][] = [];
  for (let i = 0; i < n; i++) slackIdx.push([]);
  return { maxKn: new Array<number>(n).fill(0), slackIdx };
}

/** Records one admissible state (tensions kN per leg, `carrying` the loaded legs) into the running maxima. */
export function recordSlackState(
  states: SlackStates,
  tensionsKn: readonly number[],
  carrying: readonly number[],
  n: number,
): void {
  for (const i of carrying) {
    const t = Math.max(0, tensionsKn[i]!);
    if (t > states.maxKn[i]!) {
      states.maxKn[i] = t;
      const slackLegs: number[] = [];
      for (let k = 0; k < n; k++) if (!carrying.includes(k)) slackLegs.push(k);
      states.slackIdx[i] = slackLegs;
    }
  }
}

/** The three legs left when leg m of four is slack, and the six pairs. */
const TRIPLES: ReadonlyArray<readonly [number, number, number]> = [
  [1, 2, 3],
  [0, 2, 3],
  [0, 1, 3],
  [0, 1, 2],
];
const PAIRS: ReadonlyArray<readonly [number, number]> = [
  [0, 1],
  [0, 2],
  [0, 3],
  [1, 2],
  [1, 3],
  [2, 3],
];

/**
 * Four legs meeting at one hook: the statically admissible states (tensions >= 0 balancing the
 * weight) are a segment T(s) = T + s d, d the null vector of the legs' directions, whose ends have a
 * leg slack (two when they reach zero together). Each leg's largest load over every admissible state,
 * the elastic share included, is at one end. `tensionsKn` is any exact equilibrium (the solved one).
 */
export function bridleSlackStates(
  us: readonly Vec3[],
  tensionsKn: readonly number[],
  vertical: Vec3,
  weightKn: number,
): SlackStates {
  const n = us.length;
  const states = emptySlackStates(n);
  if (n !== 4) return states;
  const [u0, u1, u2, u3] = us as [Vec3, Vec3, Vec3, Vec3];
  // Generalised cross product: sum d_i u_i = 0.
  const d = [
    det3(columns3(u1, u2, u3)),
    -det3(columns3(u0, u2, u3)),
    det3(columns3(u0, u1, u3)),
    -det3(columns3(u0, u1, u2)),
  ];
  const size = Math.hypot(d[0]!, d[1]!, d[2]!, d[3]!);
  if (!(size > MIN_DIRECTION_DET)) return enumerateSlackStates(us, vertical, weightKn);
  const tol = NEGATIVE_TENSION_TOL * weightKn;
  let lo = -Infinity;
  let hi = Infinity;
  for (let i = 0; i < 4; i++) {
    const di = d[i]! / size;
    if (Math.abs(di) < 1e-12) continue;
    const s = -tensionsKn[i]! / di;
    if (di > 0) lo = Math.max(lo, s);
    else hi = Math.min(hi, s);
  }
  if (!(lo <= hi + tol) || !Number.isFinite(lo) || !Number.isFinite(hi))
    return enumerateSlackStates(us, vertical, weightKn);
  // Each end has a leg slack: solve the other three directly (the determinate state, to rounding).
  const w = { x: weightKn * vertical.x, y: weightKn * vertical.y, z: weightKn * vertical.z };
  const t = [0, 0, 0, 0];
  for (const s of [lo, hi]) {
    let slackLeg = 0;
    let least = Infinity;
    for (let i = 0; i < 4; i++) {
      const ti = tensionsKn[i]! + (s * d[i]!) / size;
      if (ti < least) {
        least = ti;
        slackLeg = i;
      }
    }
    const tri = TRIPLES[slackLeg]!;
    const [a, b, c] = tri;
    const sol = solve3(columns3(us[a]!, us[b]!, us[c]!), w, MIN_DIRECTION_DET);
    if (sol === null || sol.x < -tol || sol.y < -tol || sol.z < -tol)
      return enumerateSlackStates(us, vertical, weightKn);
    t.fill(0);
    t[a] = sol.x;
    t[b] = sol.y;
    t[c] = sol.z;
    recordSlackState(
      states,
      t,
      [a, b, c].filter((k) => t[k]! > tol),
      n,
    );
  }
  return states;
}

/**
 * The same by enumeration, for directions that leave the segment undefined: each triple's
 * determinate solve with all three tensions >= 0, and each pair whose plane holds the vertical.
 */
function enumerateSlackStates(us: readonly Vec3[], vertical: Vec3, weightKn: number): SlackStates {
  const n = us.length;
  const states = emptySlackStates(n);
  const w = { x: weightKn * vertical.x, y: weightKn * vertical.y, z: weightKn * vertical.z };
  const tol = -NEGATIVE_TENSION_TOL * weightKn;
  const t = [0, 0, 0, 0];
  for (const tri of TRIPLES) {
    const [a, b, c] = tri;
    const mat = columns3(us[a]!, us[b]!, us[c]!);
    if (!(Math.abs(det3(mat)) > MIN_DIRECTION_DET)) continue;
    const s = solve3(mat, w);
    if (s === null || s.x < tol || s.y < tol || s.z < tol) continue;
    t.fill(0);
    t[a] = s.x;
    t[b] = s.y;
    t[c] = s.z;
    recordSlackState(states, t, tri, n);
  }
  for (const pair of PAIRS) {
    const [i, j] = pair;
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
    recordSlackState(states, t, pair, n);
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
  const order = plan
    .map((_, i) => i)
    .sort((i, j) => Math.atan2(plan[i]!.b, plan[i]!.a) - Math.atan2(plan[j]!.b, plan[j]!.a));
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
    n <= 1 || (maxBeta - minBeta <= SYMMETRY_ANGLE_TOL_DEG && maxT > 0 && (maxT - minT) / maxT <= SYMMETRY_TENSION_TOL);
  const sling = noun === "leg" ? `${n}-leg sling` : `${n} drops from a beam`;
  // Mode factors rate a multi-leg sling assembly; beam drops are separate slings, rated leg by leg.
  const mode2 = noun === "leg" ? "; 2-leg mode factor" : "";
  const mode34 = noun === "leg" ? "; 3/4-leg mode factor" : "";
  let effectiveLegs: 1 | 2 | 3;
  let rule: string;
  if (n === 1) {
    effectiveLegs = 1;
    rule = `Single ${noun}: it carries the whole load.`;
  } else if (n === 2) {
    effectiveLegs = symmetric ? 2 : 1;
    rule = symmetric
      ? `${sling}, symmetric: both ${noun}s carry (uniform load method${mode2}).`
      : `${sling}, not symmetric: rated as if 1 ${noun} carries (DGUV Regel 100-500); ${noun} loads from statics (lever rule).`;
  } else if (n === 3) {
    effectiveLegs = symmetric ? 3 : 2;
    rule = symmetric
      ? `${sling}, symmetric: all 3 ${noun}s carry (uniform load method${mode34}).`
      : `${sling}, not symmetric: rated as if only 2 ${noun}s carry (NAVEDTRA; DGUV Regel 100-500); ${noun} loads from statics, or from a state with a ${noun} slack where that is larger.`;
  } else if (symmetric) {
    effectiveLegs = 3;
    rule = `${sling}, symmetric: rated as if 3 ${noun}s carry (DGUV Regel 100-500${mode34}); each ${noun} rated for W / (3 cos beta) or its statics share if larger. The 2-leg (diagonal) figure is shown beside it.`;
  } else {
    effectiveLegs = 2;
    rule = `${sling}, not symmetric: rated as if only 2 ${noun}s carry (NAVEDTRA; DGUV Regel 100-500); each ${noun} rated for the most it carries with any ${noun} slack, its diagonal's lever-rule share, or its statics share, whichever is largest.`;
  }
  let maxDesign = 0;
  const out: LegDesignTension[] = [];
  for (let i = 0; i < n; i++) {
    const leg = legs[i]!;
    // Figures in order of precedence: the first that reaches the design tension governs.
    let design = leg.tensionKn;
    let gov: DesignGovernor = method;
    const uniform =
      n >= 4 && symmetric ? weightKn / (3 * Math.max(1e-6, Math.cos(leg.angleFromVerticalDeg / RAD_TO_DEG))) : -1;
    const oneSlack = !symmetric && n >= 3 && slack ? slack.maxKn[i]! : -1;
    const twoLeg = !symmetric && n === 4 && diagonal ? diagonal.kn[i]! : -1;
    if (uniform > design * (1 + 1e-12)) {
      design = uniform;
      gov = "three-leg-uniform";
    }
    if (oneSlack > design * (1 + 1e-12)) {
      design = oneSlack;
      gov = "one-slack";
    }
    if (twoLeg > design * (1 + 1e-12)) {
      design = twoLeg;
      gov = "diagonal";
    }
    maxDesign = Math.max(maxDesign, design);
    const slackIds: string[] = [];
    if (slack) for (const k of slack.slackIdx[i]!) slackIds.push(legs[k]!.liftPointId);
    const partner = diagonal ? (legs[diagonal.partner[i]!]?.liftPointId ?? "?") : "?";
    const entry: LegDesignTension = {
      liftPointId: leg.liftPointId,
      designTensionKn: design,
      designTensionKg: kgOf(design),
      governedBy: gov,
      rule: legRule(gov, noun, leg.liftPointId, slackIds, partner),
      source: SOURCES[gov],
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
    out.push(entry);
  }
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

const SOURCES: Record<DesignGovernor, string> = {
  determinate: SOURCE_STATICS,
  elastic: SOURCE_ELASTIC,
  "three-leg-uniform": SOURCE_UNIFORM,
  "one-slack": SOURCE_ONE_SLACK,
  diagonal: SOURCE_DIAGONAL,
};

/** One sentence: how a leg's design tension was found. */
function legRule(
  gov: DesignGovernor,
  noun: "leg" | "drop",
  id: string,
  slackIds: readonly string[],
  partner: string,
): string {
  const Noun = noun === "leg" ? "Leg" : "Drop";
  switch (gov) {
    case "determinate":
      return `${Noun} ${id}: its tension from the equilibrium of the taut ${noun}s.`;
    case "elastic":
      return `${Noun} ${id}: its elastic share of equal slings (stiffness 1/L).`;
    case "three-leg-uniform":
      return `${Noun} ${id}: W / (3 cos beta), 3 taken to carry a symmetric load.`;
    case "one-slack": {
      const which =
        slackIds.length === 1 ? `${noun} ${slackIds[0]} is slack` : `${noun}s ${slackIds.join(" and ")} are slack`;
      return `${Noun} ${id}: its tension when ${which} and the others carry, a state the load reaches when the slings differ slightly in length.`;
    }
    case "diagonal":
      return `${Noun} ${id}: its lever-rule share when only the diagonal ${id}-${partner} carries.`;
  }
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
    diagonal: four
      ? diagonalTwoLegTensions(
          legs.map((l) => l.angleFromVerticalDeg),
          liftPointPositions,
          cog,
          vertical,
          weightKn,
        )
      : null,
    slack: four
      ? bridleSlackStates(
          legs.map((l) => l.direction),
          legs.map((l) => l.tensionKn),
          vertical,
          weightKn,
        )
      : null,
    noun: "leg",
  });
}
