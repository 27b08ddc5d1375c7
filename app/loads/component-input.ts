import { z } from "zod";
import {
  COG_SOURCES,
  cogOutsideOutline,
  MASS_SOURCES,
  rectangleOutlines,
  type ComponentDefinition,
} from "~/loads/component-definition";
import { safeText, type FormResult } from "~/utils/forms";
import { fromDisplayLength, type Units } from "~/utils/format";
import { typedNumberField } from "~/utils/numbers";
import { amountField } from "~/utils/quantities";

/** At most this many tapped lift points and composite parts on one component. */
export const MAX_LIFT_POINTS = 12;
export const MAX_PARTS = 30;

const text = (max: number, options: { multiline?: boolean } = {}) =>
  z.preprocess(
    (v) => (typeof v === "string" ? v.trim() : ""),
    safeText(options).max(max, `At most ${max} characters.`),
  );
const required = (label: string, max: number) =>
  z.preprocess(
    (v) => (typeof v === "string" ? v.trim() : ""),
    safeText().min(1, `Enter the ${label}.`).max(max, `At most ${max} characters.`),
  );
// Figures are typed as people write them ("1 240,5", "1,240.5") and may carry their unit ("2.5 t", "12 in"); a bare
// figure is in the user's display unit. Masses come out in kg, lengths in m, thread engagement in mm.
const number = (label: string) => typedNumberField(label);
const mass = (label: string, units: Units) => amountField(label, "mass", units === "metric" ? "kg" : "lb", "kg");
const length = (label: string, units: Units, into: "m" | "mm" = "m") =>
  amountField(label, "length", units === "metric" ? "mm" : "in", into);

const headSchema = (units: Units) =>
  z.object({
    name: required("component's name", 200),
    description: text(4000, { multiline: true }),
    mass: mass("mass", units).refine((v) => v > 0, "The mass must be more than zero."),
    massSource: z.enum(MASS_SOURCES, { error: "Say where the mass comes from." }),
    massNote: text(500),
    contingencyPct: typedNumberField("contingency", { suffix: "%" }).refine(
      (v) => v >= 0 && v <= 100,
      "Give a contingency from 0 to 100 %.",
    ),
    length: length("length", units).refine((v) => v > 0, "The length must be more than zero."),
    width: length("width", units).refine((v) => v > 0, "The width must be more than zero."),
    height: length("height", units).refine((v) => v > 0, "The height must be more than zero."),
    cogX: length("CoG x", units),
    cogY: length("CoG y", units),
    cogZ: length("CoG z", units),
    cogSource: z.enum(COG_SOURCES, { error: "Say where the CoG comes from." }),
    cogNote: text(500),
    // Blank: no fit tolerance known (the checks then use common practice and say so).
    fitTolerance: z.preprocess(
      (v) => (typeof v === "string" && v.trim() !== "" ? v : null),
      typedNumberField("fit tolerance", { suffix: "°" })
        .refine((v) => v > 0 && v <= 45, "Give a fit tolerance above 0 and at most 45°.")
        .nullable(),
    ),
    fitToleranceSource: text(500),
    outlineMode: z.enum(["rectangle", "custom"]).default("rectangle"),
    outlineElevation: text(20000, { multiline: true }),
    outlinePlan: text(20000, { multiline: true }),
  });

const liftPointSchema = (units: Units) =>
  z.object({
    label: required("lift point's id", 10),
    x: length("x", units),
    y: length("y", units),
    z: length("z", units),
    ax: number("axis x").default(0),
    ay: number("axis y").default(0),
    az: number("axis z").default(1),
    thread: text(20),
    engagement: z.preprocess(
      (v) => (typeof v === "string" && v.trim() !== "" ? v : null),
      length("thread engagement", units, "mm").nullable(),
    ),
  });

const partSchema = (units: Units) =>
  z.object({
    name: required("part's name", 200),
    mass: mass("mass", units).refine((v) => v > 0, "A part's mass must be more than zero."),
    x: length("x", units),
    y: length("y", units),
    z: length("z", units),
  });

/** Rows of fields named `${prefix}-${i}-${field}`, in index order; rows whose fields are all empty are left out. */
export function indexedRows(
  formData: FormData,
  prefix: string,
): Array<{ index: number; values: Record<string, string> }> {
  const rows = new Map<number, Record<string, string>>();
  for (const [key, value] of formData.entries()) {
    const match = new RegExp(`^${prefix}-(\\d{1,3})-([a-z]+)$`).exec(key);
    if (!match || typeof value !== "string") continue;
    const index = Number(match[1]);
    const row = rows.get(index) ?? {};
    row[match[2]!] = value;
    rows.set(index, row);
  }
  return [...rows.entries()]
    .sort(([a], [b]) => a - b)
    .filter(([, values]) => Object.values(values).some((v) => v.trim() !== ""))
    .map(([index, values]) => ({ index, values }));
}

/** Parses "a, b" per line into points (in display units). */
export function parsePolygon(textValue: string): Array<[number, number]> | string {
  const lines = textValue
    .split(/\r?\n/)
    .map((l) => l.trim())
    .filter(Boolean);
  const points: Array<[number, number]> = [];
  for (const [i, line] of lines.entries()) {
    const parts = line.split(/[\s,;]+/).filter(Boolean);
    const a = Number(parts[0]);
    const b = Number(parts[1]);
    if (parts.length !== 2 || !Number.isFinite(a) || !Number.isFinite(b))
      return `Line ${i + 1} should hold two numbers, like "-600, 0".`;
    points.push([a, b]);
  }
  if (points.length < 3) return "An outline needs at least three corners, one per line.";
  if (points.length > 200) return "An outline can have at most 200 corners.";
  return points;
}

const MAX_MASS_KG = 1_000_000;
const MAX_DIMENSION_M = 100;

/** Parses the component form, typed in the user's units, into an SI definition, with field errors keyed by field name. */
export function parseComponentForm(formData: FormData, units: Units): FormResult<ComponentDefinition> {
  const errors: Record<string, string[]> = {};
  const add = (key: string, message: string) => (errors[key] ??= []).push(message);
  const head = headSchema(units).safeParse(
    Object.fromEntries([...formData.entries()].filter(([, v]) => typeof v === "string")),
  );
  if (!head.success) for (const issue of head.error.issues) add(String(issue.path[0] ?? "_form"), issue.message);

  // Outline corners are typed as bare figures in the display unit.
  const L = (v: number) => fromDisplayLength(v, units);

  const liftRows = indexedRows(formData, "lp");
  if (liftRows.length > MAX_LIFT_POINTS)
    add("liftPoints", `A component can have at most ${MAX_LIFT_POINTS} lift points.`);
  const liftPoints: ComponentDefinition["liftPoints"] = [];
  const labels = new Set<string>();
  for (const { index, values } of liftRows) {
    const row = liftPointSchema(units).safeParse(values);
    if (!row.success) {
      for (const issue of row.error.issues) add(`lp-${index}-${String(issue.path[0])}`, issue.message);
      continue;
    }
    const p = row.data;
    const key = p.label.toUpperCase();
    if (labels.has(key)) add(`lp-${index}-label`, `Lift point ${p.label} is listed twice; give each its own id.`);
    labels.add(key);
    const axisLength = Math.hypot(p.ax, p.ay, p.az);
    if (!(axisLength > 1e-9)) {
      add(`lp-${index}-ax`, "The axis needs a direction: it cannot be 0, 0, 0.");
      continue;
    }
    if (p.engagement !== null && p.engagement <= 0)
      add(`lp-${index}-engagement`, "Thread engagement must be more than zero.");
    liftPoints.push({
      label: p.label,
      position: { x: p.x, y: p.y, z: p.z },
      axis: { x: p.ax / axisLength, y: p.ay / axisLength, z: p.az / axisLength },
      thread: p.thread.toUpperCase().replace(/\s+/g, ""),
      engagementMm: p.engagement,
    });
  }

  const partRows = indexedRows(formData, "part");
  if (partRows.length > MAX_PARTS) add("parts", `At most ${MAX_PARTS} parts.`);
  const parts: ComponentDefinition["parts"] = [];
  for (const { index, values } of partRows) {
    const row = partSchema(units).safeParse(values);
    if (!row.success) {
      for (const issue of row.error.issues) add(`part-${index}-${String(issue.path[0])}`, issue.message);
      continue;
    }
    parts.push({
      name: row.data.name,
      massKg: row.data.mass,
      position: { x: row.data.x, y: row.data.y, z: row.data.z },
    });
  }

  if (!head.success) return { ok: false, errors };
  const h = head.data;
  const massKg = h.mass;
  if (massKg > MAX_MASS_KG) add("mass", "That mass is over 1,000 t; check the figure and its unit.");
  if (h.fitTolerance !== null && h.fitToleranceSource === "")
    add("fitToleranceSource", "Say where the fit tolerance comes from (a drawing, the maker's instructions).");
  if (h.massSource === "estimated" && !(h.contingencyPct > 0))
    add("contingencyPct", "An estimated mass must carry a contingency above 0 %.");
  const dims = { lengthM: h.length, widthM: h.width, heightM: h.height };
  for (const [field, value] of [
    ["length", dims.lengthM],
    ["width", dims.widthM],
    ["height", dims.heightM],
  ] as const) {
    if (value > MAX_DIMENSION_M) add(field, "That is over 100 m; check the figure and its unit.");
  }

  let outlines = rectangleOutlines(dims.lengthM, dims.widthM, dims.heightM);
  if (h.outlineMode === "custom") {
    const elevation = parsePolygon(h.outlineElevation);
    const plan = parsePolygon(h.outlinePlan);
    if (typeof elevation === "string") add("outlineElevation", elevation);
    if (typeof plan === "string") add("outlinePlan", plan);
    if (typeof elevation !== "string" && typeof plan !== "string") {
      outlines = {
        outlineElevation: elevation.map(([a, b]) => [L(a), L(b)]),
        outlinePlan: plan.map(([a, b]) => [L(a), L(b)]),
      };
    }
  }

  const cog = { x: h.cogX, y: h.cogY, z: h.cogZ };
  const outside = cogOutsideOutline(cog, outlines);
  if (outside.x) add("cogX", outside.x);
  if (outside.y) add("cogY", outside.y);
  if (outside.z) add("cogZ", outside.z);

  if (Object.keys(errors).length) return { ok: false, errors };
  return {
    ok: true,
    data: {
      name: h.name,
      description: h.description,
      massKg,
      massSource: h.massSource,
      massNote: h.massNote,
      contingencyPct: h.contingencyPct,
      ...dims,
      cog,
      cogSource: h.cogSource,
      cogNote: h.cogNote,
      fitToleranceDeg: h.fitTolerance,
      fitToleranceSource: h.fitTolerance === null ? "" : h.fitToleranceSource,
      ...outlines,
      liftPoints,
      parts,
    },
  };
}
