import { z } from "zod";
import { isIsoDate } from "~/utils/dates";
import {
  CHAIN_GRADES,
  DEFECT_URGENCIES,
  EXAMINATION_KINDS,
  EYEBOLT_FAMILIES,
  MAX_DROP_LUGS,
  TOP_LUG_COUNT,
  formatLugPositions,
  isBeamKind,
  parseLugPositions,
  GEAR_KIND_INFO,
  GEAR_KINDS,
  GEAR_STATUSES,
  PIN_TYPES,
  SHACKLE_TYPES,
  SPEC_FIELD_LABELS,
  SPEC_FIELDS,
  WLL_UNIT_LABELS,
  WLL_UNITS,
  type GearKind,
  type GearStatus,
  type SpecField,
} from "~/gear/kinds";
import type { MassUnit } from "~/statics/units";
import { safeText } from "~/utils/forms";
import { readTypedQuantity } from "~/utils/numbers";
import { optionalAmountField, readMarkedAmount } from "~/utils/quantities";

const trimmed = (v: unknown) => (typeof v === "string" ? v.trim() : v == null ? "" : v);
const blankToNull = (v: unknown) => {
  const t = trimmed(v);
  return t === "" ? null : t;
};

const text = (max: number, options: { multiline?: boolean } = {}) =>
  z.preprocess(trimmed, safeText(options).max(max, `At most ${max} characters.`));

function optionalNumber(label: string, { min, max, integer = false }: { min: number; max: number; integer?: boolean }) {
  return z.preprocess(
    (v) => {
      const t = blankToNull(v);
      return typeof t === "string" ? Number(t.replace(/,/g, "")) : t;
    },
    z
      .number({ error: `Enter the ${label} as a number.` })
      .refine((n) => Number.isFinite(n), `Enter the ${label} as a number.`)
      .refine((n) => !integer || Number.isInteger(n), `The ${label} must be a whole number.`)
      .refine((n) => n >= min && n <= max, `The ${label} must be from ${min} to ${max}.`)
      .nullable(),
  );
}

function optionalChoice<T extends readonly [string, ...string[]]>(label: string, values: T) {
  return z.preprocess(
    (v) => {
      const t = blankToNull(v);
      return typeof t === "string" ? t.toLowerCase() : t;
    },
    z.enum(values, { error: `Choose the ${label}: ${values.join(", ")}.` }).nullable(),
  );
}

/** Lug positions along a beam, m from its end A: a list of numbers, stored ascending as "0.25, 2.75". */
function lugPositions(label: string) {
  return z.preprocess(
    blankToNull,
    safeText()
      .max(200, "At most 200 characters.")
      .transform((t, ctx) => {
        const values = parseLugPositions(t);
        if (!values) {
          ctx.addIssue({
            code: "custom",
            message: `Give the ${label} as metres from end A, separated by commas, e.g. 0.25, 2.75.`,
          });
          return z.NEVER;
        }
        return formatLugPositions(values);
      })
      .nullable(),
  );
}

/** Smallest distance between two drop lugs, m: two drops on one point are one drop (common practice). */
const MIN_LUG_GAP_M = 0.01;

/** What is wrong with a beam's geometry: lugs within its length, enough drops, its own count of top lugs. */
export function beamGeometryIssues(item: {
  kind: "beam" | "spreader";
  lengthM: number | null;
  dropLugsM: string | null;
  topLugsM: string | null;
}): Array<{ path: "dropLugsM" | "topLugsM"; message: string }> {
  const issues: Array<{ path: "dropLugsM" | "topLugsM"; message: string }> = [];
  const length = item.lengthM;
  const drops = parseLugPositions(item.dropLugsM);
  const tops = parseLugPositions(item.topLugsM);
  const outside = (values: number[]) => values.filter((v) => v < 0 || (length !== null && v > length + 1e-9));
  if (drops) {
    if (drops.length < 2 || drops.length > MAX_DROP_LUGS)
      issues.push({ path: "dropLugsM", message: `Give from 2 to ${MAX_DROP_LUGS} drop lug positions.` });
    const off = outside(drops);
    if (off.length)
      issues.push({
        path: "dropLugsM",
        message: `Drop lug${off.length > 1 ? "s" : ""} at ${off.join(", ")} m ${off.length > 1 ? "are" : "is"} off the beam: every lug lies from 0 to ${length ?? "its length"} m from end A.`,
      });
    const sorted = [...drops].sort((a, b) => a - b);
    if (sorted.some((v, i) => i > 0 && v - sorted[i - 1]! < MIN_LUG_GAP_M))
      issues.push({ path: "dropLugsM", message: "Two drop lugs are at the same place: give each lug once." });
  }
  if (tops) {
    const count = TOP_LUG_COUNT[item.kind];
    if (tops.length !== count)
      issues.push({
        path: "topLugsM",
        message:
          item.kind === "beam"
            ? "A lifting beam hangs from one top lug: give its one position."
            : "A spreader beam hangs from a 2-leg sling: give its two top lug positions.",
      });
    const off = outside(tops);
    if (off.length)
      issues.push({
        path: "topLugsM",
        message: `Top lug${off.length > 1 ? "s" : ""} at ${off.join(", ")} m ${off.length > 1 ? "are" : "is"} off the beam: every lug lies from 0 to ${length ?? "its length"} m from end A.`,
      });
    if (tops.length === 2 && Math.abs(tops[1]! - tops[0]!) < MIN_LUG_GAP_M)
      issues.push({ path: "topLugsM", message: "The two top lugs are at the same place: give each lug once." });
  }
  return issues;
}

function withArticle(noun: string) {
  return `${/^[aeiou]/.test(noun) ? "an" : "a"} ${noun}`;
}

/** An organisation's own id marked on the item: letters, digits and a few separators. */
export const itemCodeSchema = z.preprocess(
  trimmed,
  safeText()
    .min(1, "Enter the item's id as marked on it.")
    .max(40, "The item id can be at most 40 characters.")
    .regex(
      /^[A-Za-z0-9][A-Za-z0-9 ._/-]*$/,
      "Use letters, digits, spaces and . _ / - in the item id (starting with a letter or digit).",
    ),
);

const specShape = {
  thread: z.preprocess(blankToNull, safeText().max(20, "At most 20 characters.").nullable()),
  eyeboltFamily: optionalChoice("eyebolt type", EYEBOLT_FAMILIES),
  shackleType: optionalChoice("shackle shape", SHACKLE_TYPES),
  pinType: optionalChoice("pin type", PIN_TYPES),
  chainGrade: z.preprocess(
    (v) => {
      const t = blankToNull(v);
      return typeof t === "string" ? Number(t) : t;
    },
    z
      .number({ error: `Give the chain grade as ${CHAIN_GRADES.join(" or ")}.` })
      .refine(
        (n) => (CHAIN_GRADES as readonly number[]).includes(n),
        `Give the chain grade as ${CHAIN_GRADES.join(" or ")}.`,
      )
      .nullable(),
  ),
  diameterMm: optionalAmountField("diameter", "length", "mm", "mm", { min: 1, max: 500 }),
  legs: optionalNumber("number of legs", { min: 1, max: 4, integer: true }),
  lengthM: optionalAmountField("length", "length", "m", "m", { min: 0.05, max: 200 }),
  hookHeightM: optionalAmountField("hook height", "length", "m", "m", { min: 0.5, max: 200 }),
  beamMassKg: optionalAmountField("beam mass", "mass", "kg", "kg", { min: 0.1, max: 100_000 }),
  dropLugsM: lugPositions("drop lug positions"),
  topLugsM: lugPositions("top lug positions"),
} satisfies Record<SpecField, z.ZodType>;

/** The fields of a gear item as a form or a CSV row gives them (strings), checked against its kind. */
export const gearItemSchema = z
  .object({
    itemCode: itemCodeSchema,
    kind: z.preprocess(
      (v) =>
        typeof v === "string"
          ? v
              .trim()
              .toLowerCase()
              .replace(/[\s-]+/g, "_")
          : v,
      z.enum(GEAR_KINDS, { error: `Choose the kind of item (${GEAR_KINDS.join(", ")}).` }),
    ),
    description: text(300),
    manufacturer: text(120),
    serial: text(80),
    // Read here for its number (so a mistyped figure is named at once); its unit is checked against wllUnit below.
    wllValue: z
      .preprocess((v) => (typeof v === "number" ? String(v) : typeof v === "string" ? v.trim() : ""), safeText())
      .transform((text, ctx): string => {
        const input = text;
        // Text that is no figure at all gets the field's own sentence; a figure is read, or refused saying why.
        const read = /^[+\-\u2212]?[\d.,]/.test(text) ? readTypedQuantity(text) : null;
        const message =
          read === null
            ? "Enter the WLL marked on the item, as a number."
            : !read.ok
              ? read.message
              : !(read.value > 0)
                ? "The WLL must be more than zero."
                : read.value > 1_000_000
                  ? "That WLL is beyond anything the register holds; check the figure and its unit."
                  : null;
        if (message === null) return text;
        ctx.issues.push({ code: "custom", input, message });
        return z.NEVER;
      }),
    wllUnit: z.preprocess(
      (v) => {
        const t = trimmed(v);
        return t === "US ton" || t === "short ton" || t === "shortton" ? "shortTon" : t;
      },
      z.enum(WLL_UNITS, { error: "Choose the WLL's unit as marked: kg, t, lb or shortTon." }),
    ),
    ...specShape,
    massKg: optionalAmountField("item's own mass", "mass", "kg", "kg", { min: 0, max: 100_000 }),
  })
  .superRefine((item, ctx) => {
    const info = GEAR_KIND_INFO[item.kind];
    const what = withArticle(info.label.toLowerCase());
    for (const field of SPEC_FIELDS) {
      const present = item[field] !== null;
      if (present && !info.fields.includes(field)) {
        ctx.addIssue({
          code: "custom",
          path: [field],
          message: `${SPEC_FIELD_LABELS[field]} does not apply to ${what}; leave it empty.`,
        });
      } else if (!present && info.required.includes(field)) {
        ctx.addIssue({
          code: "custom",
          path: [field],
          message: `Enter the ${SPEC_FIELD_LABELS[field].replace(/ \(.*\)$/, "").toLowerCase()} for ${what}.`,
        });
      }
    }
    if (isBeamKind(item.kind)) {
      for (const issue of beamGeometryIssues({ ...item, kind: item.kind }))
        ctx.addIssue({ code: "custom", path: [issue.path], message: issue.message });
      if (item.massKg !== null && item.beamMassKg !== null && item.massKg !== item.beamMassKg)
        ctx.addIssue({
          code: "custom",
          path: ["massKg"],
          message: "A beam's own mass is its beam mass: leave the item's own mass empty or give the same figure.",
        });
    }
  })
  .transform((item, ctx) => {
    const wll = readMarkedAmount(item.wllValue, item.wllUnit, WLL_UNIT_LABELS[item.wllUnit]);
    if (!wll.ok) {
      ctx.issues.push({ code: "custom", path: ["wllValue"], input: item.wllValue, message: wll.message });
      return z.NEVER;
    }
    return { ...item, wllValue: wll.value };
  });

export type GearItemFields = z.output<typeof gearItemSchema>;

/** A gear item as the model stores it: the checked fields and the home site. */
export type GearItemInput = GearItemFields & { homeSiteId: number | null };

export type GearSpec = Pick<GearItemFields, SpecField> & { kind: GearKind; wllUnit: MassUnit };

const isoDate = (label: string) =>
  z.preprocess(trimmed, safeText().refine(isIsoDate, `Give the ${label} as a date (YYYY-MM-DD).`));

/** A thorough examination as the form gives it; the next due date may be left empty for the default. */
export const examinationSchema = z
  .object({
    kind: z.enum(EXAMINATION_KINDS, { error: "Choose the kind of examination." }).default("periodic"),
    examinedOn: isoDate("examination date"),
    reportNumber: text(100),
    examiner: z.preprocess(
      trimmed,
      safeText().min(1, "Enter the competent person who examined the item.").max(200, "At most 200 characters."),
    ),
    examinerOrganisation: text(200),
    result: z.enum(["pass", "fail"], { error: "Choose pass or fail." }),
    defects: text(4000, { multiline: true }),
    defectUrgency: z.enum(DEFECT_URGENCIES, { error: "Choose how urgent the defects are." }).default("none"),
    defectsDueBy: z.preprocess(
      blankToNull,
      safeText().refine(isIsoDate, "Give the date as a date (YYYY-MM-DD).").nullable(),
    ),
    schemeReference: text(200),
    nextDueOn: z.preprocess(
      blankToNull,
      safeText().refine(isIsoDate, "Give the next due date as a date (YYYY-MM-DD).").nullable(),
    ),
  })
  .superRefine((exam, ctx) => {
    const issue = (path: string, message: string) => ctx.addIssue({ code: "custom", path: [path], message });
    if (exam.result === "fail" && !exam.defects) issue("defects", "A failed examination needs the defects found.");
    if (exam.defectUrgency !== "none" && !exam.defects) issue("defects", "Describe the defects the urgency is for.");
    if (exam.defects && exam.defectUrgency === "none" && exam.result === "pass")
      issue("defectUrgency", "Say how soon the defects must be put right, or remove them if there are none.");
    if (exam.result === "pass" && exam.defectUrgency === "immediate")
      issue("result", "A defect of immediate danger means the item fails: record the result as fail.");
    if (exam.defectUrgency === "by_date") {
      if (!exam.defectsDueBy) issue("defectsDueBy", "Give the date by which the defects must be put right.");
      else if (exam.defectsDueBy <= exam.examinedOn)
        issue("defectsDueBy", "The date to put the defects right must fall after the examination.");
    }
    if (exam.kind === "scheme" && !exam.schemeReference)
      issue("schemeReference", "Name the written examination scheme this examination follows.");
    if (exam.nextDueOn && exam.nextDueOn <= exam.examinedOn) {
      issue("nextDueOn", "The next examination must fall after this one.");
    }
  });

export type ExaminationFields = z.output<typeof examinationSchema>;

export const statusChangeSchema = z.object({
  status: z.enum(GEAR_STATUSES, { error: "Choose in service, quarantined or withdrawn." }),
  reason: z.preprocess(
    trimmed,
    safeText({ multiline: true })
      .min(1, "Give the reason for the change; it goes in the item's history.")
      .max(1000, "At most 1000 characters."),
  ),
});

export const defectReportSchema = z.object({
  defect: z.preprocess(
    trimmed,
    safeText({ multiline: true }).min(3, "Describe the defect you found.").max(2000, "At most 2000 characters."),
  ),
});

export type { GearStatus };

/** Every optional field of a register item, empty: spread it and set what the test needs. */
export const BLANK_GEAR_FIELDS: Omit<GearItemInput, "itemCode" | "kind" | "wllValue" | "wllUnit"> = {
  description: "",
  manufacturer: "",
  serial: "",
  thread: null,
  eyeboltFamily: null,
  shackleType: null,
  pinType: null,
  chainGrade: null,
  diameterMm: null,
  legs: null,
  lengthM: null,
  hookHeightM: null,
  beamMassKg: null,
  dropLugsM: null,
  topLugsM: null,
  massKg: null,
  homeSiteId: null,
};
