// How the reference tables page names its columns and writes its cells, for a rigger rather than a programmer.

/** Column headings as a rigger reads them, with units; a column not listed here is spelt out from its name. */
export const HEADINGS: Record<string, string> = {
  thread: "Thread",
  axialKg: "Axial pull (kg)",
  upTo45Kg: "Up to 45° from the axis (kg)",
  at90Kg: "At 90° to the axis (kg)",
  upToAngleDeg: "Angle up to (°)",
  percent: "Share of rated load (%)",
  standard: "Standard",
  wll: "WLL",
  unit: "Unit",
  diameterMm: "Diameter (mm)",
  diameterIn: "Diameter (in)",
  singleLegT: "1 leg (t)",
  twoLegUpTo45T: "2 legs, β ≤ 45° (t)",
  twoLeg45To60T: "2 legs, β 45–60° (t)",
  multiLegUpTo45T: "3 or 4 legs, β ≤ 45° (t)",
  multiLeg45To60T: "3 or 4 legs, β 45–60° (t)",
  singleLb: "Single leg (lb)",
  double60Lb: "2 legs at 60° from horizontal (lb)",
  double45Lb: "2 legs at 45° (lb)",
  double30Lb: "2 legs at 30° (lb)",
  triple60Lb: "3 or 4 legs at 60° from horizontal (lb)",
  triple45Lb: "3 or 4 legs at 45° (lb)",
  triple30Lb: "3 or 4 legs at 30° (lb)",
  construction: "Rope construction",
  ropeGradeNmm2: "Rope grade (N/mm²)",
  termination: "Eye termination",
  colour: "Colour",
  wllT: "WLL, straight lift (t)",
  andAbove: "Range",
  hitch: "Hitch",
  factor: "Factor",
  effectiveLegs: "Legs taken to carry",
  ruleSet: "Rule set",
  endlessChokeT: "Endless sling, choke (t)",
  id: "Id",
  name: "Rule set",
  standards: "Standards",
  verticalDeg: "Counts as vertical up to (°)",
  warnDeg: "Warns past (° from vertical)",
  maxDeg: "Fails past (° from vertical)",
  angleSource: "Angle limits from",
  collarEyebolts: "Collar eyebolts rated by",
  shoulderEyebolts: "Shoulder eyebolts rated by",
  plainEyebolts: "Plain eyebolts rated by",
  eyeboltSource: "Eyebolt tables from",
  accessoryExaminationMonths: "Accessories examined at least every (months)",
  equipmentExaminationMonths: "Other lifting equipment at least every (months)",
  examinationSource: "Examination intervals from",
  sharedShackleMaxDeg: "Two legs on one shackle, included angle at most (°)",
};

/** Values as a rigger reads them: units spelt as marked, and flags in words. */
export function cellText(column: string, value: string) {
  if (column === "andAbove") return value === "true" ? "and above" : "exactly";
  if (column === "ruleSet" || column === "id")
    return ({ "uk-eu": "UK / EU", us: "US" } as Record<string, string>)[value] ?? value;
  if (column.endsWith("Eyebolts"))
    return (
      (
        {
          din580: "DIN 580 table",
          "shoulder-percent": "shoulder % table",
          "in-line-only": "in-line pull only",
        } as Record<string, string>
      )[value] ?? value
    );
  if (column === "unit")
    return ({ t: "t", kg: "kg", lb: "lb", shortTon: "US short tons" } as Record<string, string>)[value] ?? value;
  return value;
}

export function columnLabel(key: string) {
  return HEADINGS[key] ?? key.replace(/([A-Z])/g, " $1").replace(/^./, (c) => c.toUpperCase());
}
