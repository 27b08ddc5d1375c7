// The invented general arrangement drawing of the demo's C2 element (elevation and plan), drawn as PNG
// from the component's own definition so that the drawing and the demo data always agree. Demo only.
import { PNG } from "pngjs";
import type { ComponentDefinition } from "~/loads/component-definition";

/** Pixels per millimetre on the drawing: 0.6 px/mm, so 1,000 mm is 600 px. */
export const DRAWING_PX_PER_MM = 0.6;

// A 5 x 7 stroke font for the drawing's lettering: each glyph is seven rows of five bits.
const GLYPHS: Record<string, number[]> = {
  "0": [14, 17, 19, 21, 25, 17, 14],
  "1": [4, 12, 4, 4, 4, 4, 14],
  "2": [14, 17, 1, 2, 4, 8, 31],
  "3": [31, 2, 4, 2, 1, 17, 14],
  "4": [2, 6, 10, 18, 31, 2, 2],
  "5": [31, 16, 30, 1, 1, 17, 14],
  "6": [6, 8, 16, 30, 17, 17, 14],
  "7": [31, 1, 2, 4, 8, 8, 8],
  "8": [14, 17, 17, 14, 17, 17, 14],
  "9": [14, 17, 17, 15, 1, 2, 12],
  A: [14, 17, 17, 31, 17, 17, 17],
  B: [30, 17, 17, 30, 17, 17, 30],
  C: [14, 17, 16, 16, 16, 17, 14],
  D: [28, 18, 17, 17, 17, 18, 28],
  E: [31, 16, 16, 30, 16, 16, 31],
  F: [31, 16, 16, 30, 16, 16, 16],
  G: [14, 17, 16, 23, 17, 17, 15],
  H: [17, 17, 17, 31, 17, 17, 17],
  I: [14, 4, 4, 4, 4, 4, 14],
  K: [17, 18, 20, 24, 20, 18, 17],
  L: [16, 16, 16, 16, 16, 16, 31],
  M: [17, 27, 21, 21, 17, 17, 17],
  N: [17, 17, 25, 21, 19, 17, 17],
  O: [14, 17, 17, 17, 17, 17, 14],
  P: [30, 17, 17, 30, 16, 16, 16],
  R: [30, 17, 17, 30, 20, 18, 17],
  S: [15, 16, 16, 14, 1, 1, 30],
  T: [31, 4, 4, 4, 4, 4, 4],
  V: [17, 17, 17, 17, 17, 10, 4],
  W: [17, 17, 17, 21, 21, 21, 10],
  Y: [17, 17, 10, 4, 4, 4, 4],
  "-": [0, 0, 0, 31, 0, 0, 0],
  ".": [0, 0, 0, 0, 0, 12, 12],
  ":": [0, 12, 12, 0, 12, 12, 0],
  "/": [1, 1, 2, 4, 8, 16, 16],
  ",": [0, 0, 0, 0, 12, 4, 8],
  " ": [0, 0, 0, 0, 0, 0, 0],
};

class Sheet {
  readonly png: PNG;
  constructor(
    readonly width: number,
    readonly height: number,
  ) {
    this.png = new PNG({ width, height });
    this.png.data.fill(255);
  }
  dot(x: number, y: number, shade = 0) {
    const xi = Math.round(x);
    const yi = Math.round(y);
    if (xi < 0 || yi < 0 || xi >= this.width || yi >= this.height) return;
    const i = (yi * this.width + xi) * 4;
    this.png.data[i] = shade;
    this.png.data[i + 1] = shade;
    this.png.data[i + 2] = shade;
    this.png.data[i + 3] = 255;
  }
  line(x1: number, y1: number, x2: number, y2: number, weight = 1, shade = 0) {
    const steps = Math.max(Math.abs(x2 - x1), Math.abs(y2 - y1), 1);
    for (let s = 0; s <= steps; s++) {
      const x = x1 + ((x2 - x1) * s) / steps;
      const y = y1 + ((y2 - y1) * s) / steps;
      for (let dx = 0; dx < weight; dx++) for (let dy = 0; dy < weight; dy++) this.dot(x + dx, y + dy, shade);
    }
  }
  rect(x: number, y: number, w: number, h: number, weight = 1) {
    this.line(x, y, x + w, y, weight);
    this.line(x + w, y, x + w, y + h, weight);
    this.line(x, y + h, x + w, y + h, weight);
    this.line(x, y, x, y + h, weight);
  }
  circle(cx: number, cy: number, r: number, weight = 1) {
    const steps = Math.ceil(2 * Math.PI * r * 2);
    for (let s = 0; s < steps; s++) {
      const a = (2 * Math.PI * s) / steps;
      for (let w = 0; w < weight; w++) this.dot(cx + (r + w) * Math.cos(a), cy + (r + w) * Math.sin(a));
    }
  }
  text(x: number, y: number, value: string, size = 2) {
    let cursor = x;
    for (const ch of value.toUpperCase()) {
      const rows = GLYPHS[ch] ?? GLYPHS[" "]!;
      rows.forEach((bits, row) => {
        for (let col = 0; col < 5; col++)
          if (bits & (1 << (4 - col)))
            for (let dx = 0; dx < size; dx++)
              for (let dy = 0; dy < size; dy++) this.dot(cursor + col * size + dx, y + row * size + dy);
      });
      cursor += 6 * size;
    }
  }
  /** A horizontal dimension from x1 to x2 at height y, with extension ticks and the length written over it. */
  dimensionH(x1: number, x2: number, y: number, label: string) {
    this.line(x1, y, x2, y);
    for (const x of [x1, x2]) {
      this.line(x, y - 8, x, y + 8);
      this.line(x - 5, y + 5, x + 5, y - 5);
    }
    this.text((x1 + x2) / 2 - label.length * 6, y - 20, label);
  }
  /** A vertical dimension from y1 to y2 at x, with the length written beside it. */
  dimensionV(x: number, y1: number, y2: number, label: string) {
    this.line(x, y1, x, y2);
    for (const y of [y1, y2]) {
      this.line(x - 8, y, x + 8, y);
      this.line(x - 5, y + 5, x + 5, y - 5);
    }
    this.text(x + 12, (y1 + y2) / 2 - 7, label);
  }
  titleBlock(lines: string[]) {
    const w = 430;
    const h = 22 * lines.length + 16;
    const x = this.width - w - 20;
    const y = this.height - h - 20;
    this.rect(x, y, w, h, 2);
    lines.forEach((l, i) => this.text(x + 10, y + 10 + i * 22, l));
  }
  toBuffer(): Buffer {
    return PNG.sync.write(this.png);
  }
}

const mmText = (m: number) => String(Math.round(m * 1000));

/** The elevation (looking along y): x across, z up, with the lift points, the CoG and their dimensions. */
export function drawElevation(def: ComponentDefinition): Buffer {
  const k = DRAWING_PX_PER_MM * 1000; // px per metre
  const sheet = new Sheet(1200, 1000);
  const left = 160;
  const floor = 760;
  const x0 = -def.lengthM / 2;
  const px = (x: number) => left + (x - x0) * k;
  const pz = (z: number) => floor - z * k;
  // Body, feet, inlet and discharge flanges.
  sheet.rect(px(x0), pz(def.heightM), def.lengthM * k, def.heightM * k, 3);
  sheet.rect(px(x0 + 0.08), pz(0.06), 0.22 * k, 0.06 * k, 2);
  sheet.rect(px(-x0 - 0.3), pz(0.06), 0.22 * k, 0.06 * k, 2);
  sheet.rect(px(-0.15), pz(def.heightM + 0.05), 0.3 * k, 0.05 * k, 2);
  sheet.circle(px(-0.2), pz(0.45), 0.16 * k, 1);
  sheet.circle(px(0.2), pz(0.45), 0.12 * k, 1);
  for (const p of def.liftPoints) {
    sheet.circle(px(p.position.x), pz(p.position.z) - 16, 14, 3);
    sheet.line(px(p.position.x), pz(p.position.z), px(p.position.x), pz(p.position.z) - 2, 3);
    sheet.text(px(p.position.x) - 6, pz(p.position.z) - 60, p.label, 3);
  }
  // Centre of gravity: circle with a cross.
  const gx = px(def.cog.x);
  const gz = pz(def.cog.z);
  sheet.circle(gx, gz, 12, 2);
  sheet.line(gx - 20, gz, gx + 20, gz, 2);
  sheet.line(gx, gz - 20, gx, gz + 20, 2);
  sheet.text(gx + 18, gz + 14, "COG");
  // Dimensions: lift point to lift point above, overall length below, height at the right, CoG from A.
  const [a, b] = def.liftPoints;
  if (a && b)
    sheet.dimensionH(px(a.position.x), px(b.position.x), pz(def.heightM) - 110, mmText(b.position.x - a.position.x));
  sheet.dimensionH(px(x0), px(-x0), floor + 60, mmText(def.lengthM));
  sheet.dimensionV(px(-x0) + 60, floor, pz(def.heightM), mmText(def.heightM));
  sheet.dimensionV(gx - 80, floor, gz, mmText(def.cog.z));
  sheet.titleBlock([
    "KESTREL ROTATING PLANT - DEMO",
    "C2 ELEMENT GA-2210 REV C",
    "SHEET 1 OF 2: ELEVATION",
    "DIMENSIONS IN MM. INVENTED DATA",
  ]);
  return sheet.toBuffer();
}

/** The plan (looking down z): x across, y up the sheet. */
export function drawPlan(def: ComponentDefinition): Buffer {
  const k = DRAWING_PX_PER_MM * 1000;
  const sheet = new Sheet(1200, 900);
  const left = 160;
  const mid = 380;
  const x0 = -def.lengthM / 2;
  const px = (x: number) => left + (x - x0) * k;
  const py = (y: number) => mid - y * k;
  sheet.rect(px(x0), py(def.widthM / 2), def.lengthM * k, def.widthM * k, 3);
  for (const p of def.liftPoints) {
    sheet.circle(px(p.position.x), py(p.position.y), 14, 3);
    sheet.text(px(p.position.x) - 6, py(p.position.y) - 50, p.label, 3);
  }
  const gx = px(def.cog.x);
  const gy = py(def.cog.y);
  sheet.circle(gx, gy, 12, 2);
  sheet.line(gx - 20, gy, gx + 20, gy, 2);
  sheet.line(gx, gy - 20, gx, gy + 20, 2);
  sheet.text(gx + 18, gy + 14, "COG");
  sheet.dimensionH(px(x0), px(-x0), py(-def.widthM / 2) + 60, mmText(def.lengthM));
  sheet.dimensionV(px(-x0) + 60, py(-def.widthM / 2), py(def.widthM / 2), mmText(def.widthM));
  sheet.titleBlock([
    "KESTREL ROTATING PLANT - DEMO",
    "C2 ELEMENT GA-2210 REV C",
    "SHEET 2 OF 2: PLAN",
    "DIMENSIONS IN MM. INVENTED DATA",
  ]);
  return sheet.toBuffer();
}
