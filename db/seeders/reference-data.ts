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
  "Shackle side load reduction, screw-pin and bolt types (common practice across rigging hardware guidance)";

export const SHACKLE_SIDE_LOAD: readonly AnglePercentRow[] = [
  { upToAngleDeg: 0, percent: 100, source: SIDE_LOAD },
  { upToAngleDeg: 45, percent: 70, source: SIDE_LOAD },
  { upToAngleDeg: 90, percent: 50, source: SIDE_LOAD },
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

const WIRE =
  "(memory) EN 13414-1 single-leg WLL, 6x36 IWRC 1770 grade, ferrule-secured eyes; values reconstructed from minimum breaking force (K = 0.356), termination efficiency 0.9 and design factor 5, rounded down; verify against the sling's certificate";

export const WIRE_ROPE_SLINGS: readonly WireRopeRow[] = [
  [8, 0.7],
  [10, 1.1],
  [12, 1.6],
  [14, 2.2],
  [16, 2.9],
  [18, 3.7],
  [20, 4.6],
  [22, 5.6],
  [24, 6.6],
  [26, 7.8],
  [28, 9.0],
  [32, 11.8],
  [36, 14.9],
  [40, 18.5],
].map(([diameterMm, singleLegT]) => ({
  diameterMm: diameterMm!,
  singleLegT: singleLegT!,
  construction: "6x36 IWRC",
  ropeGradeNmm2: 1770,
  termination: "ferrule-secured",
  source: WIRE,
}));

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
  { hitch: "straight", factor: 1.0, source: "EN 818-4 / EN 13414-1 / EN 1492-1 straight lift" },
  { hitch: "choke", factor: 0.8, source: "EN 818-4 / EN 13414-1 mode factor for choke hitch" },
  { hitch: "basket", factor: 2.0, source: "EN 1492-1 annex, basket hitch with parallel legs" },
];

const MODE = "EN 818-4 / EN 13414-1 mode factors (uniform load method)";

export const MODE_FACTORS: readonly ModeFactorRow[] = [
  {
    effectiveLegs: 1,
    upToAngleDeg: 45,
    factor: 1.0,
    source: "Single leg carries: WLL of one leg (DGUV Regel 100-500)",
  },
  {
    effectiveLegs: 1,
    upToAngleDeg: 60,
    factor: 1.0,
    source: "Single leg carries: WLL of one leg (DGUV Regel 100-500)",
  },
  { effectiveLegs: 2, upToAngleDeg: 45, factor: 1.4, source: MODE },
  { effectiveLegs: 2, upToAngleDeg: 60, factor: 1.0, source: MODE },
  { effectiveLegs: 3, upToAngleDeg: 45, factor: 2.1, source: MODE },
  { effectiveLegs: 3, upToAngleDeg: 60, factor: 1.5, source: MODE },
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
};
