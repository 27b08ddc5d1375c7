// Reference tables as plain rows, each naming its source. Values marked "(memory)" have not been
// checked against the printed standard here: verify them before relying on them.
import type {
  AnglePercentRow,
  ChainGrade80UsRow,
  ChainGrade8Row,
  Din580EyeboltRow,
  HitchFactorRow,
  ModeFactorRow,
  ReferenceTables,
  RuleSetRow,
  ShackleRow,
  TextileColourRow,
  WireRopeRow,
} from "~/statics/reference";

const DIN580 = "DIN 580 annex table (90 deg column from the 2010 edition); per eyebolt, design factor 6";

export const DIN_580_EYEBOLTS: readonly Din580EyeboltRow[] = [
  { thread: "M8", axialKg: 140, upTo45Kg: 100, at90Kg: 70, source: DIN580 },
  { thread: "M10", axialKg: 230, upTo45Kg: 170, at90Kg: 115, source: DIN580 },
  { thread: "M12", axialKg: 340, upTo45Kg: 240, at90Kg: 170, source: DIN580 },
  { thread: "M16", axialKg: 700, upTo45Kg: 500, at90Kg: 350, source: DIN580 },
  { thread: "M20", axialKg: 1200, upTo45Kg: 860, at90Kg: 600, source: DIN580 },
  { thread: "M24", axialKg: 1800, upTo45Kg: 1290, at90Kg: 900, source: DIN580 },
  { thread: "M30", axialKg: 3200, upTo45Kg: 2300, at90Kg: 1600, source: DIN580 },
  { thread: "M36", axialKg: 4600, upTo45Kg: 3300, at90Kg: 2300, source: DIN580 },
  { thread: "M42", axialKg: 6300, upTo45Kg: 4500, at90Kg: 3150, source: DIN580 },
  { thread: "M48", axialKg: 8600, upTo45Kg: 6100, at90Kg: 4300, source: DIN580 },
];

const SHOULDER = "US practice shoulder eyebolt angular pull table (ASME B18.15-type), in the plane of the eye";

export const SHOULDER_EYEBOLT_ANGLES: readonly AnglePercentRow[] = [
  { upToAngleDeg: 5, percent: 100, source: SHOULDER },
  { upToAngleDeg: 15, percent: 80, source: SHOULDER },
  { upToAngleDeg: 30, percent: 65, source: SHOULDER },
  { upToAngleDeg: 45, percent: 30, source: SHOULDER },
  { upToAngleDeg: 90, percent: 25, source: SHOULDER },
];

const SHACKLE_SIZES = [0.5, 0.75, 1, 1.5, 2, 3.25, 4.75, 6.5, 8.5, 9.5, 12, 13.5, 17];

export const SHACKLES: readonly ShackleRow[] = [
  ...SHACKLE_SIZES.map((wll) => ({
    standard: "EN 13889" as const,
    wll,
    unit: "t" as const,
    source: "EN 13889 bow/dee shackles grade 6, WLL in tonnes",
  })),
  ...SHACKLE_SIZES.map((wll) => ({
    standard: "RR-C-271" as const,
    wll,
    unit: "shortTon" as const,
    source: "US Fed Spec RR-C-271 shackles, WLL in US short tons",
  })),
];

const SIDE_LOAD =
  "EN 13889 shackles: side load reduction, screw-pin and bolt types (common practice across rigging hardware guidance)";
const SIDE_LOAD_US =
  "ASME B30.26 shackles: side load reduction, screw-pin and bolt types (common practice in US shackle makers' guidance)";

export const SHACKLE_SIDE_LOAD: readonly AnglePercentRow[] = [
  { ruleSet: "uk-eu", upToAngleDeg: 0, percent: 100, source: SIDE_LOAD },
  { ruleSet: "uk-eu", upToAngleDeg: 45, percent: 70, source: SIDE_LOAD },
  { ruleSet: "uk-eu", upToAngleDeg: 90, percent: 50, source: SIDE_LOAD },
  { ruleSet: "us", upToAngleDeg: 0, percent: 100, source: SIDE_LOAD_US },
  { ruleSet: "us", upToAngleDeg: 45, percent: 70, source: SIDE_LOAD_US },
  { ruleSet: "us", upToAngleDeg: 90, percent: 50, source: SIDE_LOAD_US },
];

const EN818 = "EN 818-4 grade 8 chain slings, WLL table (reprinted standard table)";

export const CHAIN_GRADE_8: readonly ChainGrade8Row[] = [
  {
    diameterMm: 6,
    singleLegT: 1.12,
    twoLegUpTo45T: 1.6,
    twoLeg45To60T: 1.12,
    multiLegUpTo45T: 2.36,
    multiLeg45To60T: 1.7,
    source: EN818,
  },
  {
    diameterMm: 8,
    singleLegT: 2.0,
    twoLegUpTo45T: 2.8,
    twoLeg45To60T: 2.0,
    multiLegUpTo45T: 4.25,
    multiLeg45To60T: 3.0,
    source: EN818,
  },
  {
    diameterMm: 10,
    singleLegT: 3.15,
    twoLegUpTo45T: 4.25,
    twoLeg45To60T: 3.15,
    multiLegUpTo45T: 6.7,
    multiLeg45To60T: 4.75,
    source: EN818,
  },
  {
    diameterMm: 13,
    singleLegT: 5.3,
    twoLegUpTo45T: 7.5,
    twoLeg45To60T: 5.3,
    multiLegUpTo45T: 11.2,
    multiLeg45To60T: 8.0,
    source: EN818,
  },
  {
    diameterMm: 16,
    singleLegT: 8.0,
    twoLegUpTo45T: 11.2,
    twoLeg45To60T: 8.0,
    multiLegUpTo45T: 17.0,
    multiLeg45To60T: 11.8,
    source: EN818,
  },
];

export const CHAIN_GRADE_80_US: readonly ChainGrade80UsRow[] = [
  {
    diameterIn: 0.5,
    singleLb: 12000,
    double60Lb: 20800,
    double45Lb: 17000,
    double30Lb: 12000,
    triple60Lb: 31200,
    triple45Lb: 25500,
    triple30Lb: 18000,
    source: "OSHA Guidance on Safe Sling Use, Table 1, grade 80 chain (rounded to 100 lb)",
  },
];

const WIRE_TABLE_4 =
  "EN 13414-1:2003 Table 4, steel wire rope slings 6x19 / 6x36 class, ferrule-secured eyes (read in a reprint of the standard's table; values rounded by the table)";
const WIRE_MEMORY =
  "(memory) EN 13414-1 single-leg WLL, 6x36 IWRC 1770 grade, ferrule-secured eyes; reconstructed from minimum breaking force (K = 0.356), termination efficiency 0.9 and design factor 5, rounded down; a size Table 4 as read here does not list: verify against the sling's certificate";

const wireRow = (diameterMm: number, singleLegT: number, source: string, published?: number[]): WireRopeRow => ({
  diameterMm,
  singleLegT,
  ...(published
    ? {
        twoLegUpTo45T: published[0]!,
        twoLeg45To60T: published[1]!,
        multiLegUpTo45T: published[2]!,
        multiLeg45To60T: published[3]!,
        endlessChokeT: published[4]!,
      }
    : {}),
  construction: published ? "6x19 / 6x36 class" : "6x36 IWRC",
  ropeGradeNmm2: 1770,
  termination: "ferrule-secured",
  source,
});

export const WIRE_ROPE_SLINGS: readonly WireRopeRow[] = [
  wireRow(8, 0.75, WIRE_TABLE_4, [1.05, 0.75, 1.55, 1.1, 1.2]),
  wireRow(10, 1.15, WIRE_TABLE_4, [1.6, 1.15, 2.4, 1.7, 1.85]),
  wireRow(12, 1.7, WIRE_TABLE_4, [2.3, 1.7, 3.55, 2.5, 2.7]),
  wireRow(14, 2.2, WIRE_MEMORY),
  wireRow(16, 3.0, WIRE_TABLE_4, [4.2, 3.0, 6.3, 4.5, 4.8]),
  wireRow(18, 3.7, WIRE_MEMORY),
  wireRow(20, 4.6, WIRE_TABLE_4, [6.5, 4.6, 9.8, 6.9, 7.35]),
  wireRow(22, 5.6, WIRE_MEMORY),
  wireRow(24, 6.7, WIRE_TABLE_4, [9.4, 6.7, 14.0, 10.0, 10.6]),
  wireRow(26, 7.8, WIRE_MEMORY),
  wireRow(28, 9.0, WIRE_TABLE_4, [12.5, 9.0, 19.0, 13.5, 14.5]),
  wireRow(32, 11.8, WIRE_TABLE_4, [16.5, 11.8, 25.0, 17.5, 19.0]),
  wireRow(36, 14.9, WIRE_MEMORY),
  wireRow(40, 18.5, WIRE_TABLE_4, [26.0, 18.5, 39.0, 28.0, 30.0]),
];

const TEXTILE = "EN 1492-1 / EN 1492-2 colour code by WLL in straight lift";

export const TEXTILE_COLOURS: readonly TextileColourRow[] = [
  { colour: "violet", wllT: 1, andAbove: false, source: TEXTILE },
  { colour: "green", wllT: 2, andAbove: false, source: TEXTILE },
  { colour: "yellow", wllT: 3, andAbove: false, source: TEXTILE },
  { colour: "grey", wllT: 4, andAbove: false, source: TEXTILE },
  { colour: "red", wllT: 5, andAbove: false, source: TEXTILE },
  { colour: "brown", wllT: 6, andAbove: false, source: TEXTILE },
  { colour: "blue", wllT: 8, andAbove: false, source: TEXTILE },
  { colour: "orange", wllT: 10, andAbove: true, source: TEXTILE },
];

export const HITCH_FACTORS: readonly HitchFactorRow[] = [
  { ruleSet: "uk-eu", hitch: "straight", factor: 1.0, source: "EN 818-4 / EN 13414-1 / EN 1492-1 straight lift" },
  { ruleSet: "uk-eu", hitch: "choke", factor: 0.8, source: "EN 818-4 / EN 13414-1 mode factor for choke hitch" },
  { ruleSet: "uk-eu", hitch: "basket", factor: 2.0, source: "EN 1492-1 annex, basket hitch with parallel legs" },
  { ruleSet: "us", hitch: "straight", factor: 1.0, source: "ASME B30.9 single vertical hitch" },
  {
    ruleSet: "us",
    hitch: "choke",
    factor: 0.75,
    source:
      "US Navy rigging manual (NAVEDTRA), single-choker hitch: SWL x 3/4 for choke angles of 120 deg or more; ASME B30.9 choker hitch",
  },
  {
    ruleSet: "us",
    hitch: "basket",
    factor: 2.0,
    source: "ASME B30.9 basket hitch, vertical legs: twice the single vertical rating",
  },
];

const MODE = "EN 818-4 / EN 13414-1 mode factors (uniform load method)";
const MODE_US =
  "(derived) US rated load = single-leg rating x legs x sin(theta) at the tabulated 60 / 45 / 30 deg horizontal angles (ASME B30.9; OSHA Guidance on Safe Sling Use, Table 1: triple/quad = 3 legs); between them the next lower rating";
const MODE_US_VERTICAL =
  "(derived) legs within 5 deg of vertical count as vertical (29 CFR 1910.184(b)): legs x single-leg rating";

const sinDeg = (deg: number) => Math.sin((deg * Math.PI) / 180);
const usModeRows = (effectiveLegs: 1 | 2 | 3): ModeFactorRow[] => [
  { ruleSet: "us", effectiveLegs, upToAngleDeg: 5, factor: effectiveLegs, source: MODE_US_VERTICAL },
  ...[30, 45, 60].map((beta) => ({
    ruleSet: "us" as const,
    effectiveLegs,
    upToAngleDeg: beta,
    factor: Number((effectiveLegs * sinDeg(90 - beta)).toFixed(4)),
    source: MODE_US,
  })),
];

export const MODE_FACTORS: readonly ModeFactorRow[] = [
  {
    ruleSet: "uk-eu",
    effectiveLegs: 1,
    upToAngleDeg: 45,
    factor: 1.0,
    source: "Single leg carries: WLL of one leg (DGUV Regel 100-500)",
  },
  {
    ruleSet: "uk-eu",
    effectiveLegs: 1,
    upToAngleDeg: 60,
    factor: 1.0,
    source: "Single leg carries: WLL of one leg (DGUV Regel 100-500)",
  },
  { ruleSet: "uk-eu", effectiveLegs: 2, upToAngleDeg: 45, factor: 1.4, source: MODE },
  { ruleSet: "uk-eu", effectiveLegs: 2, upToAngleDeg: 60, factor: 1.0, source: MODE },
  { ruleSet: "uk-eu", effectiveLegs: 3, upToAngleDeg: 45, factor: 2.1, source: MODE },
  { ruleSet: "uk-eu", effectiveLegs: 3, upToAngleDeg: 60, factor: 1.5, source: MODE },
  ...usModeRows(1),
  ...usModeRows(2),
  ...usModeRows(3),
];

export const RULE_SETS: readonly RuleSetRow[] = [
  {
    id: "uk-eu",
    name: "UK / EU",
    standards: "LOLER 1998, BS 7121, EN 13414-1, EN 818-4, EN 1492, DIN 580, EN 13889",
    verticalDeg: 5,
    warnDeg: 45,
    maxDeg: 60,
    angleSource:
      "EN 818-4 / EN 13414-1 (ratings drop above 45 deg); EN 818-6 practice: beta never above 60 deg; within 5 deg counts vertical (29 CFR 1910.184(b) definition, common practice)",
    collarEyebolts: "din580",
    shoulderEyebolts: "shoulder-percent",
    plainEyebolts: "in-line-only",
    eyeboltSource:
      "DIN 580 collar eyebolts (per eyebolt, eye in the plane of the pull); shoulder eyebolts by the ASME B18.15-type percentage table, no EN table covering them; plain eyebolts in-line only",
    accessoryExaminationMonths: 6,
    equipmentExaminationMonths: 12,
    examinationSource:
      "UK LOLER 1998 reg 9(3): lifting accessories at least every 6 months, other lifting equipment at least every 12 months",
    sharedShackleMaxDeg: 120,
    source: "Plumbline rule set UK / EU (LOLER, EN, DIN)",
  },
  {
    id: "us",
    name: "US",
    standards: "OSHA 29 CFR 1910.184, ASME B30.9, B30.26, B30.20, ASME B18.15",
    verticalDeg: 5,
    warnDeg: 45,
    maxDeg: 60,
    angleSource:
      "29 CFR 1910.184(b) (within 5 deg counts vertical); OSHA Guidance on Safe Sling Use: no horizontal angle below 30 deg without the sling maker or a qualified person; over 45 deg from vertical warns (common practice)",
    collarEyebolts: "shoulder-percent",
    shoulderEyebolts: "shoulder-percent",
    plainEyebolts: "in-line-only",
    eyeboltSource:
      "ASME B18.15-type shoulder eyebolt table for collar and shoulder eyebolts (percentage of rated load, in the plane of the eye); ASME B30.26: plain eyebolts in-line only",
    accessoryExaminationMonths: 12,
    equipmentExaminationMonths: 12,
    examinationSource:
      "ASME B30.9 / B30.26 / B30.20 periodic inspection at most yearly in normal service (monthly to quarterly in severe service)",
    sharedShackleMaxDeg: 120,
    source: "Plumbline rule set US (OSHA, ASME B30)",
  },
];

/** All reference tables, as the checks take them. */
export const REFERENCE_TABLES: ReferenceTables = {
  din580Eyebolts: DIN_580_EYEBOLTS,
  shoulderEyeboltAngles: SHOULDER_EYEBOLT_ANGLES,
  shackles: SHACKLES,
  shackleSideLoad: SHACKLE_SIDE_LOAD,
  chainGrade8: CHAIN_GRADE_8,
  chainGrade80Us: CHAIN_GRADE_80_US,
  wireRope: WIRE_ROPE_SLINGS,
  textileColours: TEXTILE_COLOURS,
  hitchFactors: HITCH_FACTORS,
  modeFactors: MODE_FACTORS,
  ruleSets: RULE_SETS,
};
