// The printed lift plan: an A4 PDF built from a PrintablePlan and nothing else. Pure apart from
// reading the two Barlow font files once; the figures are printed as the server decided them.
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import fontkit from "@pdf-lib/fontkit";
import { degrees, PDFDocument, rgb, type PDFFont, type PDFImage, type PDFPage, type RGB } from "pdf-lib";
import QRCode from "qrcode";
import { COG_SOURCE_LABELS, MASS_SOURCE_LABELS } from "~/loads/component-definition";
import { PERSON_ROLE_LABELS, PLAN_CAUTION, PLAN_STATUS_LABELS, type PlanLeg } from "~/plans/document";
import { PRE_LIFT_CHECKLIST } from "~/plans/workflow";
import type { PrintablePlan } from "~/plans/printable";
import type { CheckResult } from "~/statics/checks";
import { ceilTo } from "~/statics/units";
import { formatLength, formatMass, massUnitLabel, toDisplayMass, type Units } from "~/utils/format";

// ----- page geometry (pt) -----

export const A4_WIDTH_PT = 595.28;
export const A4_HEIGHT_PT = 841.89;
/** One point in millimetres (1/72 in). */
export const PT_MM = 25.4 / 72;
const MARGIN_X = 36;
const MARGIN_TOP = 26;
const MARGIN_BOTTOM = 22;
const CONTENT_W = A4_WIDTH_PT - 2 * MARGIN_X;
const LEFT = MARGIN_X;
const RIGHT = A4_WIDTH_PT - MARGIN_X;

// ----- palette -----

const hex = (h: string) =>
  rgb(parseInt(h.slice(1, 3), 16) / 255, parseInt(h.slice(3, 5), 16) / 255, parseInt(h.slice(5, 7), 16) / 255);
const INK = hex("#17212b");
const INK_SOFT = hex("#4a5663");
const BRASS = hex("#9a6a14");
const STEEL = hex("#2f5d7c");
const STEEL_FILL = hex("#dbe8f1");
const STEEL_WASH = hex("#f1f5f8");
const RULE = hex("#c5ced6");
const WHITE = rgb(1, 1, 1);
type Tone = "pass" | "warn" | "fail" | "hold" | "neutral";
const TONE: Record<Tone, RGB> = {
  pass: hex("#2e7346"),
  warn: hex("#9a5b00"),
  fail: hex("#a8261d"),
  hold: BRASS,
  neutral: STEEL,
};

// ----- fonts (bytes read once per process; embedded as subsets in every PDF) -----

type FontFiles = { regular: Uint8Array; semibold: Uint8Array; codePoints: ReadonlySet<number> };
let fontFiles: FontFiles | null = null;
type ParsedFont = ReturnType<typeof fontkit.create>;
const parsedFonts = new Map<Uint8Array, ParsedFont>();

/**
 * fontkit with each font file parsed once per process: parsing and the lazily read tables are the
 * bulk of the cost of a PDF. pdf-lib only reads the parsed font (each PDF makes its own subset).
 */
const cachingFontkit: Parameters<PDFDocument["registerFontkit"]>[0] = {
  create(bytes: Uint8Array, postscriptName?: string) {
    let font = parsedFonts.get(bytes);
    if (!font) parsedFonts.set(bytes, (font = fontkit.create(bytes, postscriptName)));
    return font;
  },
};

/**
 * Font features off: plain glyphs with their own advance widths (no kerning or ligatures), so
 * the text measures exactly as drawn from the advance table, copies out of the PDF letter for
 * letter, and shaping costs next to nothing.
 */
const PLAIN_GLYPHS = {
  kern: false,
  liga: false,
  clig: false,
  calt: false,
  rlig: false,
  rclt: false,
  ccmp: false,
  locl: false,
  mark: false,
  mkmk: false,
  curs: false,
};

/**
 * The name a subset font goes by: six capital letters, "+", the font's name (PDF 32000-1 9.6.4),
 * so viewers and checkers see it is a subset. Derived from the document, so a rebuild matches.
 */
function subsetName(seed: string, postscriptName: string): string {
  const digest = createHash("sha256").update(`${seed}/${postscriptName}`).digest();
  const tag = Array.from(digest.subarray(0, 6), (b) => String.fromCharCode(65 + (b % 26))).join("");
  return `${tag}+${postscriptName}`;
}

function loadFontFiles(): FontFiles {
  if (fontFiles) return fontFiles;
  const require = createRequire(import.meta.url);
  const read = (path: string) => new Uint8Array(readFileSync(require.resolve(path)));
  const regular = read("@expo-google-fonts/barlow/400Regular/Barlow_400Regular.ttf");
  const semibold = read("@expo-google-fonts/barlow/600SemiBold/Barlow_600SemiBold.ttf");
  const bold = new Set(cachingFontkit.create(semibold).characterSet);
  // Only characters both weights can draw count as printable.
  const codePoints = new Set(cachingFontkit.create(regular).characterSet.filter((c) => bold.has(c)));
  fontFiles = { regular, semibold, codePoints };
  return fontFiles;
}

/** Advance widths at 1 pt per code point, per font file (filled as characters are met). */
const advanceTables = new Map<Uint8Array, Map<number, number>>();

function advanceAt1pt(bytes: Uint8Array, codePoint: number): number {
  let table = advanceTables.get(bytes);
  if (!table) advanceTables.set(bytes, (table = new Map()));
  let w = table.get(codePoint);
  if (w === undefined) {
    const font = cachingFontkit.create(bytes) as ParsedFont;
    w = font.glyphForCodePoint(codePoint).advanceWidth / font.unitsPerEm;
    table.set(codePoint, w);
  }
  return w;
}

/** Stand-ins for characters the font cannot draw (anything else unknown becomes "?"). */
const STAND_INS: Record<string, string> = {
  "→": "->",
  "←": "<-",
  "↑": "up",
  "↓": "down",
  "⇒": "=>",
  "≤": "<=",
  "≥": ">=",
  "≠": "!=",
  "≈": "~",
  Σ: "sum ",
  Δ: "delta ",
  "✓": "yes",
  "✔": "yes",
  "✗": "x",
  "☐": "[ ]",
  "•": "-",
  "·": "-",
  "\t": " ",
};

/** The text with every character the embedded font lacks replaced by a plain stand-in. */
export function printableText(text: string, codePoints: ReadonlySet<number> = loadFontFiles().codePoints): string {
  let out = "";
  for (const ch of text) {
    const cp = ch.codePointAt(0)!;
    if (codePoints.has(cp)) out += ch;
    else if (ch === "\n") out += "\n";
    else if (cp < 0x20 || (cp >= 0x7f && cp < 0xa0)) continue;
    else if (Object.hasOwn(STAND_INS, ch) && [...STAND_INS[ch]!].every((c) => codePoints.has(c.codePointAt(0)!)))
      out += STAND_INS[ch];
    else {
      // Accented letters the font lacks: drop the accent rather than lose the letter.
      const base = ch.normalize("NFKD").replace(/\p{M}/gu, "");
      out += base && [...base].every((c) => codePoints.has(c.codePointAt(0)!)) ? base : "?";
    }
  }
  return out;
}

// ----- formatting -----

/** "2025-05-12 08:40 UTC" from an ISO timestamp. */
function utcText(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  const s = d.toISOString();
  return `${s.slice(0, 10)} ${s.slice(11, 16)} UTC`;
}

/** A utilisation as a whole percent, never rounded down. */
function percentUp(u: number | null): string {
  if (u === null) return "–";
  if (!Number.isFinite(u)) return "no rating";
  return `${ceilTo(u * 100, 0).toLocaleString("en-GB")} %`;
}

/** A load, rounded up so the print never understates it. */
function loadText(kg: number, units: Units): string {
  return formatMass(Math.ceil(kg - 1e-9), units);
}
const knText = (kn: number) => `${ceilTo(kn, 2).toFixed(2)} kN`;
const degText = (d: number) => `${d.toFixed(1)}°`;
/** The mass figure of a tension in the user's unit, without the unit, rounded up ("1,650"). */
const tensionMassNumber = (kg: number, units: Units) =>
  Math.ceil(toDisplayMass(kg, units) - 1e-9).toLocaleString("en-GB");

const VERDICT: Record<CheckResult["status"], string> = { pass: "PASS", warn: "WARN", fail: "FAIL" };

function statusWords(status: PrintablePlan["status"]): string {
  if (status === "superseded" || status === "cancelled") return `${PLAN_STATUS_LABELS[status]}: not for use`;
  return PLAN_STATUS_LABELS[status];
}

// ----- text measuring and wrapping -----

type Style = { font: PDFFont; size: number; color: RGB };

class Typesetter {
  constructor(
    readonly codePoints: ReadonlySet<number>,
    private readonly files: ReadonlyMap<PDFFont, Uint8Array>,
  ) {}

  clean(text: string): string {
    return printableText(text, this.codePoints);
  }

  /** Width of already-clean text at the size, pt: the sum of the glyphs' advances, as drawn. */
  width(text: string, font: PDFFont, size: number): number {
    const bytes = this.files.get(font);
    if (!bytes) return font.widthOfTextAtSize(text, size);
    let w = 0;
    for (const ch of text) w += advanceAt1pt(bytes, ch.codePointAt(0)!);
    return w * size;
  }

  /** Lines of at most `width` pt; explicit newlines kept; words longer than a line broken by character. */
  wrap(raw: string, font: PDFFont, size: number, width: number): string[] {
    const lines: string[] = [];
    const space = this.width(" ", font, size);
    for (const paragraph of this.clean(raw).split(/\r?\n/)) {
      const words = paragraph.split(/ +/).filter((w) => w !== "");
      let line = "";
      let lineW = 0;
      for (let word of words) {
        let wordW = this.width(word, font, size);
        if (line && lineW + space + wordW <= width) {
          line += ` ${word}`;
          lineW += space + wordW;
          continue;
        }
        if (line) lines.push(line);
        line = "";
        lineW = 0;
        while (wordW > width) {
          let cut = word.length - 1;
          while (cut > 1 && this.width(word.slice(0, cut), font, size) > width) cut--;
          lines.push(word.slice(0, cut));
          word = word.slice(cut);
          wordW = this.width(word, font, size);
        }
        line = word;
        lineW = wordW;
      }
      lines.push(line);
    }
    return lines;
  }

  /** One line cut to fit `width`, ending in "…" when cut. */
  fit(raw: string, font: PDFFont, size: number, width: number): string {
    const text = this.clean(raw);
    if (this.width(text, font, size) <= width) return text;
    let n = text.length;
    while (n > 0 && this.width(`${text.slice(0, n)}…`, font, size) > width) n--;
    return `${text.slice(0, n).trimEnd()}…`;
  }
}

// ----- page flow -----

type Fonts = { regular: PDFFont; semibold: PDFFont };

class Flow {
  readonly pages: PDFPage[] = [];
  page!: PDFPage;
  /** Top of the free space on the current page, pt from the bottom. */
  y = 0;

  constructor(
    readonly pdf: PDFDocument,
    readonly fonts: Fonts,
    readonly ts: Typesetter,
    readonly top: number,
    readonly bottom: number,
  ) {
    this.newPage();
  }

  newPage() {
    this.page = this.pdf.addPage([A4_WIDTH_PT, A4_HEIGHT_PT]);
    this.pages.push(this.page);
    this.y = this.top;
  }

  get room() {
    return this.y - this.bottom;
  }

  get pageRoom() {
    return this.top - this.bottom;
  }

  /** Starts a new page unless `height` pt fit below the cursor. */
  ensure(height: number) {
    if (this.room < height && this.y < this.top) this.newPage();
  }

  text(raw: string, x: number, y: number, style: Style, align: "left" | "right" | "center" = "left") {
    const text = this.ts.clean(raw);
    const w = align === "left" ? 0 : this.ts.width(text, style.font, style.size);
    const at = align === "left" ? x : align === "right" ? x - w : x - w / 2;
    this.page.drawText(text, { x: at, y, size: style.size, font: style.font, color: style.color });
  }

  /** Wrapped text flowing across pages; returns nothing, moves the cursor. */
  paragraph(raw: string, style: Style, opts: { x?: number; width?: number; gapAfter?: number } = {}) {
    const x = opts.x ?? LEFT;
    const width = opts.width ?? CONTENT_W;
    const lh = style.size * 1.3;
    for (const line of this.ts.wrap(raw, style.font, style.size, width)) {
      this.ensure(lh);
      this.y -= lh;
      this.page.drawText(line, {
        x,
        y: this.y + style.size * 0.28,
        size: style.size,
        font: style.font,
        color: style.color,
      });
    }
    this.y -= opts.gapAfter ?? 4;
  }
}

// ----- small drawing helpers -----

function tagWidth(ts: Typesetter, font: PDFFont, text: string, size = 6.5) {
  return ts.width(ts.clean(text), font, size) + 7;
}

/** A word in a box (the verdict or a hold point): the word carries the meaning, the colour only helps. */
function drawTag(
  page: PDFPage,
  ts: Typesetter,
  font: PDFFont,
  text: string,
  tone: Tone,
  x: number,
  yTop: number,
  size = 6.5,
) {
  const w = tagWidth(ts, font, text, size);
  const h = size + 4.5;
  const solid = tone === "fail" || tone === "hold";
  page.drawRectangle({
    x,
    y: yTop - h,
    width: w,
    height: h,
    color: solid ? TONE[tone] : tone === "warn" ? hex("#fbefd9") : WHITE,
    borderColor: TONE[tone],
    borderWidth: tone === "warn" ? 1.2 : 0.8,
  });
  page.drawText(ts.clean(text), { x: x + 3.5, y: yTop - h + 3, size, font, color: solid ? WHITE : TONE[tone] });
  return w;
}

/** A polygon (page coordinates) as an SVG path for drawSvgPath at x = 0, y = 0 (which flips y). */
function svgPolygon(points: ReadonlyArray<readonly [number, number]>): string {
  return `${points.map(([x, y], i) => `${i === 0 ? "M" : "L"}${x.toFixed(2)},${(-y).toFixed(2)}`).join(" ")} Z`;
}

// ----- headings, fact lists, tables -----

function heading(flow: Flow, number: number, title: string, keepWith = 60) {
  flow.ensure(26 + keepWith);
  flow.y -= 18;
  flow.text(`${number}`, LEFT, flow.y, { font: flow.fonts.semibold, size: 11, color: BRASS });
  flow.text(title, LEFT + 16, flow.y, { font: flow.fonts.semibold, size: 11, color: STEEL });
  flow.page.drawLine({
    start: { x: LEFT, y: flow.y - 4 },
    end: { x: RIGHT, y: flow.y - 4 },
    thickness: 0.6,
    color: BRASS,
  });
  flow.y -= 10;
}

type Fact = [label: string, value: string];

/** Label/value rows in a column; draws when `draw` is set, and returns the height either way. */
function facts(flow: Flow, items: Fact[], x: number, width: number, yTop: number, draw: boolean, labelW = 74): number {
  const valueStyle = { font: flow.fonts.regular, size: 8.5, color: INK };
  const labelStyle = { font: flow.fonts.semibold, size: 7, color: STEEL };
  let y = yTop;
  for (const [label, value] of items) {
    const lines = flow.ts.wrap(value || "–", valueStyle.font, valueStyle.size, width - labelW);
    if (draw) {
      flow.text(label.toUpperCase(), x, y - 8.2, labelStyle);
      lines.forEach((line, i) =>
        flow.page.drawText(line, {
          x: x + labelW,
          y: y - 8.5 - i * 10.6,
          size: 8.5,
          font: valueStyle.font,
          color: INK,
        }),
      );
    }
    y -= lines.length * 10.6 + 2.6;
  }
  return yTop - y;
}

type CellItem =
  | { kind: "line"; text: string; style: Style }
  | { kind: "tag"; text: string; tone: Tone }
  | { kind: "signoff"; label: string };
type Cell = { items: CellItem[] };
type Column = { title: string; width: number; align?: "left" | "right" };

const CELL_PAD_X = 3.5;
const CELL_PAD_Y = 3;
const itemHeight = (item: CellItem) => (item.kind === "line" ? item.style.size * 1.3 : item.kind === "tag" ? 12 : 17);

/** A cell of wrapped text blocks (each block its own style), an optional tag first and a sign-off line last. */
function cell(
  flow: Flow,
  width: number,
  blocks: Array<{ text: string; style: Style }>,
  extra: { tag?: { text: string; tone: Tone }; signoff?: string } = {},
): Cell {
  const items: CellItem[] = [];
  if (extra.tag) items.push({ kind: "tag", ...extra.tag });
  for (const b of blocks) {
    if (b.text === "") continue;
    for (const line of flow.ts.wrap(b.text, b.style.font, b.style.size, width - 2 * CELL_PAD_X))
      items.push({ kind: "line", text: line, style: b.style });
  }
  if (extra.signoff) items.push({ kind: "signoff", label: extra.signoff });
  return { items };
}

function drawTableHeader(flow: Flow, columns: Column[]) {
  const h = 14;
  flow.page.drawRectangle({ x: LEFT, y: flow.y - h, width: CONTENT_W, height: h, color: STEEL_WASH });
  let x = LEFT;
  for (const c of columns) {
    const style = { font: flow.fonts.semibold, size: 7, color: STEEL };
    if (c.align === "right") flow.text(c.title, x + c.width - CELL_PAD_X, flow.y - 9.5, style, "right");
    else flow.text(c.title, x + CELL_PAD_X, flow.y - 9.5, style);
    x += c.width;
  }
  flow.page.drawLine({
    start: { x: LEFT, y: flow.y - h },
    end: { x: RIGHT, y: flow.y - h },
    thickness: 0.8,
    color: STEEL,
  });
  flow.y -= h;
}

function drawRowPart(flow: Flow, columns: Column[], cells: Cell[], height: number, accent: RGB | null) {
  let x = LEFT;
  const yTop = flow.y;
  if (accent) flow.page.drawRectangle({ x: LEFT, y: yTop - height, width: 2.2, height, color: accent });
  columns.forEach((c, i) => {
    let y = yTop - CELL_PAD_Y;
    for (const item of cells[i]?.items ?? []) {
      if (item.kind === "line") {
        const size = item.style.size;
        const textX =
          c.align === "right"
            ? x + c.width - CELL_PAD_X - flow.ts.width(item.text, item.style.font, size)
            : x + CELL_PAD_X;
        flow.page.drawText(item.text, {
          x: textX,
          y: y - size * 1.02,
          size,
          font: item.style.font,
          color: item.style.color,
        });
      } else if (item.kind === "tag") {
        drawTag(flow.page, flow.ts, flow.fonts.semibold, item.text, item.tone, x + CELL_PAD_X, y - 1);
      } else {
        const labelStyle = { font: flow.fonts.regular, size: 6.5, color: INK_SOFT };
        flow.text(item.label, x + CELL_PAD_X, y - 13, labelStyle);
        const start = x + CELL_PAD_X + flow.ts.width(flow.ts.clean(item.label), labelStyle.font, 6.5) + 4;
        flow.page.drawLine({
          start: { x: start, y: y - 13.5 },
          end: { x: x + c.width - CELL_PAD_X, y: y - 13.5 },
          thickness: 0.5,
          color: INK_SOFT,
        });
      }
      y -= itemHeight(item);
    }
    x += c.width;
  });
  flow.page.drawLine({
    start: { x: LEFT, y: yTop - height },
    end: { x: RIGHT, y: yTop - height },
    thickness: 0.4,
    color: RULE,
  });
  flow.y -= height;
}

/**
 * A table that flows across pages: the column header repeats on every page, and a row too tall for
 * what is left of a page goes to the next one (or, if taller than a whole page, is split by lines).
 */
function table(
  flow: Flow,
  columns: Column[],
  rows: Array<{ cells: Cell[]; accent?: RGB }>,
  continued: string,
  opts: { keepTogether?: boolean } = {},
) {
  const headerH = 14;
  const rowHeight = (cells: Cell[]) =>
    Math.max(...cells.map((c) => c.items.reduce((s, it) => s + itemHeight(it), 0))) + 2 * CELL_PAD_Y;
  const total = headerH + rows.reduce((s, r) => s + rowHeight(r.cells), 0);
  if (opts.keepTogether && total <= flow.pageRoom) flow.ensure(total);
  const continuedTitle = () => {
    flow.y -= 12;
    flow.text(`${continued} (continued)`, LEFT, flow.y, { font: flow.fonts.semibold, size: 8, color: STEEL });
    flow.y -= 4;
  };
  flow.ensure(headerH + (rows[0] ? Math.min(rowHeight(rows[0].cells), 60) : 0));
  drawTableHeader(flow, columns);
  for (const row of rows) {
    let cells = row.cells;
    for (;;) {
      const h = rowHeight(cells);
      if (h <= flow.room) {
        drawRowPart(flow, columns, cells, h, row.accent ?? null);
        break;
      }
      const fresh = flow.pageRoom - headerH - 16;
      if (h <= fresh || flow.room < 40) {
        flow.newPage();
        continuedTitle();
        drawTableHeader(flow, columns);
        continue;
      }
      // Taller than what is left: fill this page with as many lines as fit, carry the rest over.
      const budget = flow.room - 2 * CELL_PAD_Y;
      const head: Cell[] = [];
      const tail: Cell[] = [];
      for (const c of cells) {
        let used = 0;
        let k = 0;
        while (k < c.items.length && used + itemHeight(c.items[k]!) <= budget) used += itemHeight(c.items[k++]!);
        head.push({ items: c.items.slice(0, k) });
        tail.push({ items: c.items.slice(k) });
      }
      drawRowPart(flow, columns, head, rowHeight(head), row.accent ?? null);
      cells = tail;
      flow.newPage();
      continuedTitle();
      drawTableHeader(flow, columns);
    }
  }
  flow.y -= 6;
}

// ----- the rigging drawing -----

type V2 = { a: number; b: number };
type Seg = { from: V2; to: V2 };
type Box = { x: number; y: number; w: number; h: number };
type ViewKind = "elevation" | "plan";

const project = (p: { x: number; y: number; z: number }, view: ViewKind): V2 => ({
  a: p.x,
  b: view === "elevation" ? p.z : p.y,
});

/** The largest common drawing scale 1:N (N = 1, 1.5, 2, 2.5, 3, 4, 5 or 7.5 x 10^k, N >= 1) that fits `maxPtPerM`. */
export function drawingScale(maxPtPerM: number): { denominator: number; ptPerM: number } {
  const ptPerMAtFullSize = 1000 / PT_MM;
  const needed = ptPerMAtFullSize / maxPtPerM;
  for (let k = -2; k <= 8; k++) {
    for (const m of [1, 1.5, 2, 2.5, 3, 4, 5, 7.5]) {
      const n = m * 10 ** k;
      if (n >= needed - 1e-9 && n >= 1) return { denominator: n, ptPerM: ptPerMAtFullSize / n };
    }
  }
  return { denominator: needed, ptPerM: maxPtPerM };
}

/** A scale bar length near `targetM`: 1, 2 or 5 x 10^n mm (metric) or a round number of inches/feet (imperial), in metres. */
function scaleBarM(targetM: number, units: Units): number {
  if (units === "imperial") {
    const inches = targetM / 0.0254;
    const steps = [1, 2, 3, 6, 12, 24, 36, 48, 60, 120, 240, 600, 1200, 2400, 6000, 12000, 24000];
    return (steps.filter((s) => s <= inches).at(-1) ?? 1) * 0.0254;
  }
  const power = 10 ** Math.floor(Math.log10(targetM));
  return [5, 2, 1].map((m) => m * power).find((v) => v <= targetM) ?? power;
}

function segmentHitsBox(s: { x1: number; y1: number; x2: number; y2: number }, r: Box): boolean {
  // Liang-Barsky clipping: does any part of the segment lie inside the box?
  let t0 = 0;
  let t1 = 1;
  const dx = s.x2 - s.x1;
  const dy = s.y2 - s.y1;
  const edges: Array<[number, number]> = [
    [-dx, s.x1 - r.x],
    [dx, r.x + r.w - s.x1],
    [-dy, s.y1 - r.y],
    [dy, r.y + r.h - s.y1],
  ];
  for (const [p, q] of edges) {
    if (Math.abs(p) < 1e-12) {
      if (q < 0) return false;
      continue;
    }
    const t = q / p;
    if (p < 0) t0 = Math.max(t0, t);
    else t1 = Math.min(t1, t);
    if (t0 > t1) return false;
  }
  return true;
}

const boxesOverlap = (a: Box, b: Box) => a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;

type Point = { x: number; y: number };
type Candidate = Point & { anchor: Point };
type LabelLines = Array<{ text: string; style: Style }>;

/** Places labels one by one where they cross the fewest lines, markers and earlier labels, inside the frame. */
class LabelPlacer {
  private placed: Box[] = [];
  constructor(
    private readonly frame: Box,
    private readonly segments: Array<{ x1: number; y1: number; x2: number; y2: number }>,
    private readonly markers: Box[],
    private readonly outline: Box | null,
  ) {}

  place(size: { w: number; h: number }, candidates: Candidate[]): { box: Box; anchor: Point } {
    let best: { box: Box; anchor: Point } | null = null;
    let bestScore = Infinity;
    const inner = { x: this.frame.x + 2, y: this.frame.y + 2, w: this.frame.w - 4, h: this.frame.h - 4 };
    for (const c of candidates) {
      const box = { x: c.x, y: c.y, w: size.w, h: size.h };
      // Prefer spots near what the label names; then avoid the frame edge, lines, markers and other labels.
      let score = Math.hypot(box.x + box.w / 2 - c.anchor.x, box.y + box.h / 2 - c.anchor.y) * 0.02;
      if (box.x < inner.x || box.y < inner.y || box.x + box.w > inner.x + inner.w || box.y + box.h > inner.y + inner.h)
        score += 1000;
      for (const s of this.segments) if (segmentHitsBox(s, box)) score += 50;
      for (const m of this.markers) if (boxesOverlap(m, box)) score += 80;
      for (const p of this.placed) if (boxesOverlap(p, box)) score += 200;
      // A leader from this spot must not run through a label already placed.
      const nx = Math.min(Math.max(c.anchor.x, box.x), box.x + box.w);
      const ny = Math.min(Math.max(c.anchor.y, box.y), box.y + box.h);
      if (Math.hypot(c.anchor.x - nx, c.anchor.y - ny) > 7) {
        const leader = { x1: nx, y1: ny, x2: c.anchor.x, y2: c.anchor.y };
        for (const p of this.placed) if (segmentHitsBox(leader, p)) score += 30;
        for (const m of this.markers) if (segmentHitsBox(leader, m)) score += 10;
      }
      if (this.outline && boxesOverlap(this.outline, box)) score += 3;
      if (score < bestScore) {
        bestScore = score;
        best = { box, anchor: c.anchor };
      }
    }
    const chosen = best ?? {
      box: { x: inner.x, y: inner.y, w: size.w, h: size.h },
      anchor: { x: inner.x, y: inner.y },
    };
    // Keep it on the frame even when every spot is poor.
    chosen.box.x = Math.min(Math.max(chosen.box.x, inner.x), inner.x + inner.w - chosen.box.w);
    chosen.box.y = Math.min(Math.max(chosen.box.y, inner.y), inner.y + inner.h - chosen.box.h);
    this.placed.push({
      ...chosen.box,
      x: chosen.box.x - 1,
      y: chosen.box.y - 1,
      w: chosen.box.w + 2,
      h: chosen.box.h + 2,
    });
    return chosen;
  }
}

type ViewGeometry = {
  kind: ViewKind;
  outline: V2[];
  cog: V2;
  hook: V2;
  liftPoints: Array<{ label: string; at: V2; used: boolean }>;
  /** Leg lines with the figures they carry. */
  legs: Array<{ name: string; from: V2; to: V2; leg: PlanLeg | null; note?: string }>;
  beam: Seg | null;
  /** Points that do not carry figures (the beam's lug). */
  extra: V2[];
};

function viewGeometry(plan: PrintablePlan, view: ViewKind): ViewGeometry {
  const { snapshot, arrangement, results } = plan;
  const outline = (view === "elevation" ? snapshot.outlineElevation : snapshot.outlinePlan).map(([a, b]) => ({ a, b }));
  const used = new Set(arrangement.liftPointLabels);
  const liftPoints = snapshot.liftPoints.map((p) => ({
    label: p.label,
    at: project(p.position, view),
    used: used.has(p.label),
  }));
  const hook = project(results.hook, view);
  const cog = project(snapshot.cog, view);
  const legs: ViewGeometry["legs"] = [];
  let beam: Seg | null = null;
  const extra: V2[] = [];
  const point = (label: string) => snapshot.liftPoints.find((p) => p.label === label)?.position;
  if (arrangement.kind === "beam" && arrangement.beam) {
    const tops = results.legs.map((l) => point(l.liftPointId)).filter((p) => p !== undefined);
    const beamZ = Math.max(...tops.map((p) => p.z)) + arrangement.beam.dropLengthM;
    for (const l of results.legs) {
      const p = point(l.liftPointId);
      if (p)
        legs.push({
          name: `Drop ${l.liftPointId}`,
          from: project({ ...p, z: beamZ }, view),
          to: project(p, view),
          leg: l,
        });
    }
    const lug = project({ x: snapshot.cog.x, y: snapshot.cog.y, z: beamZ }, view);
    const ends = tops.map((p) => project({ ...p, z: beamZ }, view));
    if (view === "elevation") {
      const as = [...ends.map((e) => e.a), lug.a];
      beam = { from: { a: Math.min(...as), b: lug.b }, to: { a: Math.max(...as), b: lug.b } };
    } else if (ends.length > 0) {
      beam = { from: ends[0]!, to: ends.at(-1)! };
    }
    extra.push(lug);
    const top = results.beam?.topLegs[0] ?? null;
    legs.push({ name: "Top leg", from: hook, to: lug, leg: top });
  } else {
    for (const l of results.legs) {
      const p = point(l.liftPointId);
      if (p) legs.push({ name: `Leg ${l.liftPointId}`, from: hook, to: project(p, view), leg: l });
    }
  }
  return { kind: view, outline, cog, hook, liftPoints, legs, beam, extra };
}

function viewBounds(g: ViewGeometry) {
  const pts = [
    ...g.outline,
    g.cog,
    g.hook,
    ...g.liftPoints.map((p) => p.at),
    ...g.extra,
    ...g.legs.flatMap((l) => [l.from, l.to]),
  ];
  const as = pts.map((p) => p.a);
  const bs = pts.map((p) => p.b);
  return { minA: Math.min(...as), maxA: Math.max(...as), minB: Math.min(...bs), maxB: Math.max(...bs) };
}

const VIEW_GAP = 10;
const VIEW_W = (CONTENT_W - VIEW_GAP) / 2;
const VIEW_PAD = 22;
const VIEW_TITLE_H = 16;
const VIEW_FOOT_H = 16;
const VIEW_MAX_H = 300;
const VIEW_MIN_H = 170;

function legLabelLines(flow: Flow, name: string, leg: PlanLeg | null, units: Units): LabelLines {
  const bold = { font: flow.fonts.semibold, size: 7, color: INK };
  const small = { font: flow.fonts.regular, size: 6.5, color: INK };
  if (!leg) return [{ text: name, style: bold }];
  if (leg.slack) return [{ text: `${name}: slack`, style: bold }];
  return [
    {
      text: `${name}: ${knText(leg.tensionKn)} · ${tensionMassNumber(leg.tensionKg, units)} ${massUnitLabel(units)}`,
      style: bold,
    },
    { text: `${degText(leg.angleFromVerticalDeg)} from vertical`, style: small },
  ];
}

/** Both views to one scale, with the scale stated; moves the cursor below them. */
function riggingDrawing(flow: Flow, plan: PrintablePlan) {
  const views = [viewGeometry(plan, "elevation"), viewGeometry(plan, "plan")];
  const bounds = views.map(viewBounds);
  const drawW = VIEW_W - 2 * VIEW_PAD;
  const drawMaxH = VIEW_MAX_H - VIEW_TITLE_H - VIEW_FOOT_H - 2 * VIEW_PAD;
  const fit = Math.min(
    ...bounds.map((b) => Math.min(drawW / Math.max(b.maxA - b.minA, 1e-3), drawMaxH / Math.max(b.maxB - b.minB, 1e-3))),
  );
  const { denominator, ptPerM } = drawingScale(fit);
  const tallest = Math.max(...bounds.map((b) => (b.maxB - b.minB) * ptPerM));
  const frameH = Math.max(VIEW_MIN_H, tallest + VIEW_TITLE_H + VIEW_FOOT_H + 2 * VIEW_PAD);
  flow.ensure(frameH + 30);
  const frameTop = flow.y - 4;
  views.forEach((g, i) => {
    const frame = { x: LEFT + i * (VIEW_W + VIEW_GAP), y: frameTop - frameH, w: VIEW_W, h: frameH };
    drawView(flow, plan, g, bounds[i]!, frame, ptPerM);
  });
  flow.y = frameTop - frameH - 4;
  const scaleLine = `Both views to one scale: 1:${denominator.toLocaleString("en-GB")} on A4 printed at actual size (100 %, no fit to page). Check a dimension against the scale bar before measuring from the print.`;
  flow.paragraph(scaleLine, { font: flow.fonts.regular, size: 7, color: INK_SOFT }, { gapAfter: 2 });
}

function drawView(
  flow: Flow,
  plan: PrintablePlan,
  g: ViewGeometry,
  b: ReturnType<typeof viewBounds>,
  frame: Box,
  ptPerM: number,
) {
  const page = flow.page;
  const { semibold, regular } = flow.fonts;
  page.drawRectangle({
    x: frame.x,
    y: frame.y,
    width: frame.w,
    height: frame.h,
    borderColor: RULE,
    borderWidth: 0.8,
    color: WHITE,
  });
  const title = g.kind === "elevation" ? "Elevation, looking along y" : "Plan, looking down";
  flow.text(title, frame.x + 6, frame.y + frame.h - 11, { font: semibold, size: 8, color: STEEL });
  // Centre the drawing in the area between the title and the foot.
  const area = { x: frame.x, y: frame.y + VIEW_FOOT_H, w: frame.w, h: frame.h - VIEW_TITLE_H - VIEW_FOOT_H };
  const midA = (b.minA + b.maxA) / 2;
  const midB = (b.minB + b.maxB) / 2;
  const X = (a: number) => area.x + area.w / 2 + (a - midA) * ptPerM;
  const Y = (v: number) => area.y + area.h / 2 + (v - midB) * ptPerM;
  const P = (v: V2) => ({ x: X(v.a), y: Y(v.b) });

  // The floor under the load (elevation only): where the load stands before the lift.
  if (g.kind === "elevation" && g.outline.length > 0) {
    const floorZ = Math.min(...g.outline.map((p) => p.b));
    const x1 = X(Math.min(...g.outline.map((p) => p.a))) - 10;
    const x2 = X(Math.max(...g.outline.map((p) => p.a))) + 10;
    const y = Y(floorZ);
    page.drawLine({ start: { x: x1, y }, end: { x: x2, y }, thickness: 0.8, color: INK_SOFT });
    for (let x = x1 + 4; x < x2; x += 6)
      page.drawLine({ start: { x, y }, end: { x: x - 4, y: y - 4 }, thickness: 0.4, color: INK_SOFT });
  }

  // The outline of the load.
  if (g.outline.length >= 3) {
    page.drawSvgPath(svgPolygon(g.outline.map((v) => [X(v.a), Y(v.b)] as const)), {
      x: 0,
      y: 0,
      color: STEEL_FILL,
      borderColor: STEEL,
      borderWidth: 1,
    });
  }

  // Legs, drops, beam.
  const segments: Array<{ x1: number; y1: number; x2: number; y2: number }> = [];
  for (const l of g.legs) {
    const s = P(l.from);
    const e = P(l.to);
    segments.push({ x1: s.x, y1: s.y, x2: e.x, y2: e.y });
    page.drawLine({ start: s, end: e, thickness: 1.4, color: INK, dashArray: l.leg?.slack ? [4, 3] : undefined });
  }
  if (g.beam) {
    const s = P(g.beam.from);
    const e = P(g.beam.to);
    const pad = g.kind === "elevation" ? 6 : 0;
    page.drawLine({ start: { x: s.x - pad, y: s.y }, end: { x: e.x + pad, y: e.y }, thickness: 5, color: STEEL });
    segments.push(
      { x1: s.x - pad, y1: s.y - 3, x2: e.x + pad, y2: e.y - 3 },
      { x1: s.x - pad, y1: s.y + 3, x2: e.x + pad, y2: e.y + 3 },
    );
  }
  for (const v of g.extra) {
    const p = P(v);
    page.drawCircle({ x: p.x, y: p.y, size: 2.5, color: WHITE, borderColor: INK, borderWidth: 1 });
  }

  // The hook: a ring at the hook point and the crane's rope going up.
  const hook = P(g.hook);
  const hookR = g.kind === "plan" ? 8 : 3.5;
  if (g.kind === "elevation") {
    page.drawLine({
      start: { x: hook.x, y: hook.y + hookR },
      end: { x: hook.x, y: hook.y + hookR + 14 },
      thickness: 1.2,
      color: STEEL,
    });
    segments.push({ x1: hook.x, y1: hook.y, x2: hook.x, y2: hook.y + hookR + 14 });
  }
  page.drawCircle({
    x: hook.x,
    y: hook.y,
    size: hookR,
    borderColor: STEEL,
    borderWidth: 1.6,
    color: g.kind === "plan" ? undefined : WHITE,
  });

  // Lift points.
  const markers: Box[] = [{ x: hook.x - hookR - 1, y: hook.y - hookR - 1, w: 2 * hookR + 2, h: 2 * hookR + 2 }];
  for (const lp of g.liftPoints) {
    const p = P(lp.at);
    page.drawCircle({ x: p.x, y: p.y, size: 3, color: lp.used ? BRASS : WHITE, borderColor: BRASS, borderWidth: 1 });
    markers.push({ x: p.x - 4, y: p.y - 4, w: 8, h: 8 });
  }

  // The CoG: the usual quartered circle.
  const cog = P(g.cog);
  const r = 5;
  page.drawCircle({ x: cog.x, y: cog.y, size: r, color: WHITE, borderColor: INK, borderWidth: 1 });
  const quarter = (from: number) => {
    const pts: Array<[number, number]> = [[cog.x, cog.y]];
    for (let k = 0; k <= 8; k++) {
      const t = from + (k / 8) * (Math.PI / 2);
      pts.push([cog.x + r * Math.cos(t), cog.y + r * Math.sin(t)]);
    }
    return svgPolygon(pts);
  };
  page.drawSvgPath(quarter(0), { x: 0, y: 0, color: INK });
  page.drawSvgPath(quarter(Math.PI), { x: 0, y: 0, color: INK });
  markers.push({ x: cog.x - r - 1, y: cog.y - r - 1, w: 2 * r + 2, h: 2 * r + 2 });

  const outlinePts = g.outline.map(P);
  const outlineBox =
    outlinePts.length > 0
      ? (() => {
          const xs = outlinePts.map((p) => p.x);
          const ys = outlinePts.map((p) => p.y);
          return {
            x: Math.min(...xs),
            y: Math.min(...ys),
            w: Math.max(...xs) - Math.min(...xs),
            h: Math.max(...ys) - Math.min(...ys),
          };
        })()
      : null;
  const placer = new LabelPlacer(
    { x: frame.x, y: frame.y + VIEW_FOOT_H, w: frame.w, h: frame.h - VIEW_FOOT_H - VIEW_TITLE_H + 4 },
    segments,
    markers,
    outlineBox,
  );

  const drawLabel = (lines: LabelLines, candidatesFor: (w: number, h: number) => Candidate[], boxed: boolean) => {
    const w =
      Math.max(...lines.map((l) => flow.ts.width(flow.ts.clean(l.text), l.style.font, l.style.size))) + (boxed ? 6 : 2);
    const h = lines.reduce((s, l) => s + l.style.size * 1.2, 0) + (boxed ? 3 : 0);
    const { box, anchor } = placer.place({ w, h }, candidatesFor(w, h));
    // A leader from a label set away from what it names.
    const nx = Math.min(Math.max(anchor.x, box.x), box.x + box.w);
    const ny = Math.min(Math.max(anchor.y, box.y), box.y + box.h);
    if (boxed && Math.hypot(anchor.x - nx, anchor.y - ny) > 7) {
      page.drawLine({ start: { x: nx, y: ny }, end: anchor, thickness: 0.4, color: INK_SOFT });
      page.drawCircle({ x: anchor.x, y: anchor.y, size: 1, color: INK_SOFT });
    }
    if (boxed)
      page.drawRectangle({
        x: box.x,
        y: box.y,
        width: box.w,
        height: box.h,
        color: WHITE,
        borderColor: RULE,
        borderWidth: 0.5,
        opacity: 0.92,
        borderOpacity: 1,
      });
    let y = box.y + box.h - (boxed ? 1.5 : 0);
    for (const l of lines) {
      y -= l.style.size * 1.2;
      flow.text(l.text, box.x + (boxed ? 3 : 1), y + l.style.size * 0.25, l.style);
    }
  };
  const around =
    (p: Point, gap: number) =>
    (w: number, h: number): Candidate[] =>
      [gap, gap + 6, gap + 12].flatMap((d) => [
        { x: p.x + d, y: p.y + d * 0.5, anchor: p },
        { x: p.x - d - w, y: p.y + d * 0.5, anchor: p },
        { x: p.x + d, y: p.y - d * 0.5 - h, anchor: p },
        { x: p.x - d - w, y: p.y - d * 0.5 - h, anchor: p },
        { x: p.x - w / 2, y: p.y + d, anchor: p },
        { x: p.x - w / 2, y: p.y - d - h, anchor: p },
        { x: p.x + d, y: p.y - h / 2, anchor: p },
        { x: p.x - d - w, y: p.y - h / 2, anchor: p },
      ]);
  // Anywhere in the view, for when nothing near is free (the label then gets a leader).
  const anywhere =
    (anchor: Point) =>
    (w: number, h: number): Candidate[] => {
      const c: Candidate[] = [];
      for (let x = frame.x + 4; x + w <= frame.x + frame.w - 4; x += 10) {
        for (let y = frame.y + VIEW_FOOT_H + 2; y + h <= frame.y + frame.h - VIEW_TITLE_H; y += 8)
          c.push({ x, y, anchor });
      }
      return c;
    };

  const bold8 = { font: semibold, size: 8, color: INK };
  const small7 = { font: regular, size: 7, color: INK };
  // The small labels first, right beside what they name; the leg figures then find room, with a leader if need be.
  drawLabel(
    [{ text: g.kind === "plan" ? "Hook (above)" : "Hook", style: { font: semibold, size: 7, color: STEEL } }],
    around(hook, hookR + 2),
    false,
  );
  drawLabel([{ text: "CoG", style: small7 }], around(cog, r + 2), false);
  for (const lp of g.liftPoints) {
    drawLabel(
      [{ text: lp.label, style: lp.used ? bold8 : { ...small7, color: INK_SOFT } }],
      around(P(lp.at), 4),
      false,
    );
  }
  for (const l of g.legs) {
    const s = P(l.from);
    const e = P(l.to);
    const lines = legLabelLines(flow, l.name, l.leg, plan.units);
    drawLabel(
      lines,
      (w, h) => {
        const c: Candidate[] = [];
        const len = Math.hypot(e.x - s.x, e.y - s.y);
        if (len < 1) return [...around(e, 8)(w, h), ...anywhere(e)(w, h)];
        const ux = (e.x - s.x) / len;
        const uy = (e.y - s.y) / len;
        for (const t of [0.5, 0.4, 0.6, 0.3, 0.7, 0.2, 0.8]) {
          const m = { x: s.x + (e.x - s.x) * t, y: s.y + (e.y - s.y) * t };
          c.push(
            { x: m.x + 5, y: m.y - h / 2, anchor: m },
            { x: m.x - 5 - w, y: m.y - h / 2, anchor: m },
            { x: m.x - w / 2, y: m.y + 4, anchor: m },
            { x: m.x - w / 2, y: m.y - 4 - h, anchor: m },
          );
        }
        // Past the lift point along the leg's line, then to either side farther out: for short legs seen from above.
        for (const d of [14, 30, 50, 75]) {
          const m = { x: e.x + ux * d, y: e.y + uy * d };
          const cx = m.x + (ux >= 0 ? 0 : -w);
          const cy = m.y + (uy >= 0 ? 0 : -h);
          c.push(
            { x: cx, y: cy, anchor: e },
            { x: m.x - w / 2, y: m.y + 6, anchor: e },
            { x: m.x - w / 2, y: m.y - 6 - h, anchor: e },
          );
        }
        return [...c, ...anywhere({ x: (s.x + e.x) / 2, y: (s.y + e.y) / 2 })(w, h)];
      },
      true,
    );
  }

  // Scale bar (bottom left) and axis arrows (bottom right).
  const barM = scaleBarM((frame.w * 0.3) / ptPerM, plan.units);
  const barPt = barM * ptPerM;
  const bx = frame.x + 8;
  const by = frame.y + 7;
  const halves = 2;
  for (let k = 0; k < halves; k++) {
    page.drawRectangle({
      x: bx + (k * barPt) / halves,
      y: by,
      width: barPt / halves,
      height: 3,
      color: k % 2 === 0 ? INK : WHITE,
      borderColor: INK,
      borderWidth: 0.5,
    });
  }
  flow.text(formatLength(barM, plan.units).replace(/\.00 in$/, " in"), bx + barPt + 4, by - 0.5, {
    font: regular,
    size: 7,
    color: INK,
  });
  const ax = frame.x + frame.w - 34;
  const ay = frame.y + 6;
  const arrow = (x1: number, y1: number, x2: number, y2: number, label: string) => {
    page.drawLine({ start: { x: x1, y: y1 }, end: { x: x2, y: y2 }, thickness: 0.7, color: INK_SOFT });
    const ang = Math.atan2(y2 - y1, x2 - x1);
    const head = (d: number) => ({ x: x2 - 3.5 * Math.cos(ang + d), y: y2 - 3.5 * Math.sin(ang + d) });
    page.drawSvgPath(
      svgPolygon([
        [x2, y2],
        [head(0.45).x, head(0.45).y],
        [head(-0.45).x, head(-0.45).y],
      ]),
      { x: 0, y: 0, color: INK_SOFT },
    );
    flow.text(label, x2 + (x2 > x1 ? 2 : -2), y2 + (y2 > y1 ? 1 : -2), { font: regular, size: 6.5, color: INK_SOFT });
  };
  arrow(ax, ay, ax + 16, ay, "x");
  arrow(ax, ay, ax, ay + 12, g.kind === "elevation" ? "z" : "y");
}

// ----- the sections -----

function titleBlock(flow: Flow, plan: PrintablePlan, qr: PDFImage) {
  const { regular, semibold } = flow.fonts;
  heading(flow, 1, "Plan and approval", 200);
  const colW = (CONTENT_W - 16) / 2;
  const left: Fact[] = [
    ["Plan", plan.title],
    ["Site", [plan.site.name, plan.site.customer, plan.site.address].filter((s) => s.trim() !== "").join("\n")],
  ];
  const right: Fact[] = [
    ["Job", `${plan.job.workOrder}: ${plan.job.title}`],
    ["Revision", `Revision ${plan.revision}`],
    ["Status", statusWords(plan.status)],
    ["Planner", plan.planner.name],
  ];
  const h = Math.max(
    facts(flow, left, LEFT, colW, flow.y, false),
    facts(flow, right, LEFT + colW + 16, colW, flow.y, false),
  );
  flow.ensure(h + 4);
  facts(flow, left, LEFT, colW, flow.y, true);
  facts(flow, right, LEFT + colW + 16, colW, flow.y, true);
  flow.y -= h + 6;

  // The approval block: who approved, as what, when; the fingerprint and the QR code to check it.
  const qrSize = 92;
  const qrColW = 136;
  const fieldsW = CONTENT_W - qrColW - 20;
  const approval: Fact[] = [
    ["Approved by", plan.approval.name],
    ["Role", plan.approval.role],
    ["When", utcText(plan.approval.approvedAt)],
    ["Comment", plan.approval.comment.trim() || "No comment."],
  ];
  const selfText = plan.approval.selfApproved
    ? `${plan.approval.name} planned this lift and approved it themselves, under ${plan.organisationName}'s setting for one-person firms (no second person checked it).`
    : "";
  const statusNote =
    plan.status === "superseded"
      ? "A later revision has replaced this one: do not use this print for the lift."
      : plan.status === "cancelled"
        ? "This plan has been cancelled: do not use this print for the lift."
        : "";
  const fpStyle = { font: regular, size: 7.5, color: INK };
  const fingerprintLines = flow.ts.wrap(plan.fingerprint, fpStyle.font, fpStyle.size, fieldsW - 8);
  const noteStyle = { font: semibold, size: 8, color: TONE.warn };
  const selfLines = selfText ? flow.ts.wrap(selfText, noteStyle.font, noteStyle.size, fieldsW - 12) : [];
  const statusLines = statusNote ? flow.ts.wrap(statusNote, noteStyle.font, noteStyle.size, fieldsW - 12) : [];
  const fieldsH = facts(flow, approval, 0, fieldsW - 8, 0, false, 70);
  const notesH =
    (selfLines.length + statusLines.length) * 10.5 + (selfLines.length ? 6 : 0) + (statusLines.length ? 6 : 0);
  const fpH = 10 + fingerprintLines.length * 9.5;
  const captionStyle = { font: semibold, size: 7, color: INK };
  const urlStyle = { font: regular, size: 5.5, color: INK_SOFT };
  const caption = flow.ts.wrap(
    "Scan to check this is the current approved revision",
    captionStyle.font,
    captionStyle.size,
    qrColW - 8,
  );
  const urlLines = flow.ts.wrap(plan.verifyUrl, urlStyle.font, urlStyle.size, qrColW - 8);
  const qrColH = qrSize + 4 + caption.length * 8.5 + urlLines.length * 7 + 2;
  const boxH = Math.max(18 + fieldsH + notesH + fpH, qrColH + 12) + 6;
  flow.ensure(boxH + 4);
  const top = flow.y;
  const page = flow.page;
  page.drawRectangle({
    x: LEFT,
    y: top - boxH,
    width: CONTENT_W,
    height: boxH,
    borderColor: STEEL,
    borderWidth: 1,
    color: WHITE,
  });
  page.drawRectangle({ x: LEFT, y: top - 14, width: CONTENT_W - qrColW - 6, height: 14, color: STEEL_WASH });
  flow.text("APPROVAL", LEFT + 6, top - 10, { font: semibold, size: 7.5, color: BRASS });
  let y = top - 18;
  y -= facts(flow, approval, LEFT + 6, fieldsW - 8, y, true, 70);
  const note = (lines: string[]) => {
    if (lines.length === 0) return;
    const h = lines.length * 10.5 + 3;
    page.drawRectangle({
      x: LEFT + 6,
      y: y - h,
      width: fieldsW - 6,
      height: h,
      color: hex("#fbefd9"),
      borderColor: TONE.warn,
      borderWidth: 0.8,
    });
    lines.forEach((l, i) =>
      page.drawText(l, { x: LEFT + 11, y: y - 9.5 - i * 10.5, size: 8, font: semibold, color: TONE.warn }),
    );
    y -= h + 3;
  };
  note(selfLines);
  note(statusLines);
  y = Math.min(y - 2, top - boxH + fpH + 4);
  flow.text("FINGERPRINT (SHA-256) OF THIS REVISION", LEFT + 6, y - 7, { font: semibold, size: 6.5, color: STEEL });
  fingerprintLines.forEach((l, i) =>
    page.drawText(l, { x: LEFT + 6, y: y - 16.5 - i * 9.5, size: fpStyle.size, font: fpStyle.font, color: INK }),
  );

  const qrX = RIGHT - qrColW + (qrColW - qrSize) / 2 - 2;
  page.drawLine({
    start: { x: RIGHT - qrColW - 6, y: top - 4 },
    end: { x: RIGHT - qrColW - 6, y: top - boxH + 4 },
    thickness: 0.5,
    color: RULE,
  });
  page.drawImage(qr, { x: qrX, y: top - 6 - qrSize, width: qrSize, height: qrSize });
  let cy = top - 6 - qrSize - 2;
  for (const l of caption) {
    cy -= 8.5;
    flow.text(l, RIGHT - qrColW / 2 - 2, cy, captionStyle, "center");
  }
  for (const l of urlLines) {
    cy -= 7;
    flow.text(l, RIGHT - qrColW / 2 - 2, cy, urlStyle, "center");
  }
  flow.y = top - boxH - 4;
}

function loadSection(flow: Flow, plan: PrintablePlan) {
  const s = plan.snapshot;
  const units = plan.units;
  heading(flow, 2, "The load", 70);
  const withContingency = s.massKg * (1 + s.contingencyPct / 100);
  const colW = (CONTENT_W - 16) / 2;
  const left: Fact[] = [
    ["Component", s.name],
    [
      "Mass",
      `${formatMass(s.massKg, units)}, ${MASS_SOURCE_LABELS[s.massSource].toLowerCase()}${s.massNote.trim() ? ` (${s.massNote.trim()})` : ""}`,
    ],
    ["Contingency", `${s.contingencyPct.toLocaleString("en-GB")} %`],
    ["With contingency", loadText(withContingency, units)],
  ];
  const right: Fact[] = [
    [
      "CoG (x, y, z)",
      `${formatLength(s.cog.x, units)}, ${formatLength(s.cog.y, units)}, ${formatLength(s.cog.z, units)}`,
    ],
    ["CoG source", `${COG_SOURCE_LABELS[s.cogSource]}${s.cogNote.trim() ? ` (${s.cogNote.trim()})` : ""}`],
    [
      "Size (L × W × H)",
      `${formatLength(s.lengthM, units)} × ${formatLength(s.widthM, units)} × ${formatLength(s.heightM, units)}`,
    ],
  ];
  const h = Math.max(
    facts(flow, left, LEFT, colW, flow.y, false, 82),
    facts(flow, right, LEFT + colW + 16, colW, flow.y, false, 82),
  );
  flow.ensure(h);
  facts(flow, left, LEFT, colW, flow.y, true, 82);
  facts(flow, right, LEFT + colW + 16, colW, flow.y, true, 82);
  flow.y -= h + 2;
}

function legRows(plan: PrintablePlan): Array<{ name: string; leg: PlanLeg }> {
  const rows = plan.results.legs.map((leg) => ({
    name: `${plan.arrangement.kind === "beam" ? "Drop" : "Leg"} ${leg.liftPointId}`,
    leg,
  }));
  for (const [i, leg] of (plan.results.beam?.topLegs ?? []).entries())
    rows.push({ name: plan.results.beam!.topLegs.length > 1 ? `Top leg ${i + 1}` : "Top leg", leg });
  return rows;
}

function riggingSection(flow: Flow, plan: PrintablePlan) {
  const kind =
    plan.arrangement.kind === "beam"
      ? "lifting beam with vertical drops"
      : `${plan.results.legs.length}-leg bridle to one hook`;
  heading(flow, 3, `Rigging arrangement: ${kind}`, 200);
  riggingDrawing(flow, plan);
  const units = plan.units;
  const body = { font: flow.fonts.regular, size: 8, color: INK };
  const strong = { font: flow.fonts.semibold, size: 8, color: INK };
  const cols: Column[] = [
    { title: "Leg", width: 90 },
    { title: "Length", width: 80, align: "right" },
    { title: "Tension (kN)", width: 80, align: "right" },
    { title: `Tension (${massUnitLabel(units)})`, width: 90, align: "right" },
    { title: "Angle from vertical", width: 95, align: "right" },
    { title: "Vertical share", width: CONTENT_W - 435, align: "right" },
  ];
  const rows = legRows(plan).map(({ name, leg }) => ({
    cells: [
      cell(flow, cols[0]!.width, [{ text: name, style: strong }]),
      cell(flow, cols[1]!.width, [{ text: formatLength(leg.lengthM, units), style: body }]),
      cell(flow, cols[2]!.width, [{ text: leg.slack ? "slack" : knText(leg.tensionKn), style: body }]),
      cell(flow, cols[3]!.width, [
        { text: leg.slack ? "slack" : tensionMassNumber(leg.tensionKg, units), style: body },
      ]),
      cell(flow, cols[4]!.width, [{ text: degText(leg.angleFromVerticalDeg), style: body }]),
      cell(flow, cols[5]!.width, [{ text: `${ceilTo(leg.verticalShare * 100, 1).toFixed(1)} %`, style: body }]),
    ],
  }));
  flow.y -= 4;
  table(flow, cols, rows, "Leg loads", { keepTogether: true });
  const beam = plan.arrangement.kind === "beam" && plan.arrangement.beam;
  const notes = [
    `Leg loads are for the mass as entered (${formatMass(plan.snapshot.massKg, units)}), without contingency, rounded up; the checks below add the ${plan.snapshot.contingencyPct.toLocaleString("en-GB")} % contingency.`,
    plan.arrangement.mode === "level"
      ? `Hook set ${formatLength(plan.results.hook.z, units)} above the load's datum (z = 0), plumb over the CoG.`
      : `Legs of the given lengths; the load hangs ${degText(plan.results.tiltDeg)} from level.`,
    beam
      ? `Beam: own mass ${formatMass(beam.massKg, units)}, marked WLL ${formatMass(beam.wllKg, units)}, drops ${formatLength(beam.dropLengthM, units)}; the hook carries ${loadText(plan.results.beam?.hookMassKg ?? 0, units)}.`
      : "",
    `${plan.results.method === "elastic" ? "Shared between the legs elastically (a rigid load on equal slings)" : "Found by statics alone (the legs' share is fixed by the geometry)"}. ${plan.results.rating.rule}`,
  ].filter((s) => s !== "");
  for (const n of notes) flow.paragraph(n, { font: flow.fonts.regular, size: 7, color: INK_SOFT }, { gapAfter: 1 });
  if (plan.results.warnings.length > 0) {
    flow.y -= 3;
    for (const w of plan.results.warnings)
      flow.paragraph(`Note: ${w.message}`, { font: flow.fonts.semibold, size: 7.5, color: TONE.warn }, { gapAfter: 1 });
  }
}

function scheduleSection(flow: Flow, plan: PrintablePlan) {
  heading(flow, 4, "Rigging schedule", 50);
  const units = plan.units;
  const body = { font: flow.fonts.regular, size: 8, color: INK };
  const strong = { font: flow.fonts.semibold, size: 8, color: INK };
  const cols: Column[] = [
    { title: "Position", width: 78 },
    { title: "Item id", width: 72 },
    { title: "Description", width: 155 },
    { title: "WLL", width: 58, align: "right" },
    { title: "Load", width: 58, align: "right" },
    { title: "Utilisation", width: 50, align: "right" },
    { title: "Exam due", width: CONTENT_W - 471, align: "right" },
  ];
  if (plan.schedule.length === 0) {
    flow.paragraph("No gear is allocated in this plan.", body);
    return;
  }
  const rows = plan.schedule.map((r) => ({
    cells: [
      cell(flow, cols[0]!.width, [{ text: r.position, style: body }]),
      cell(flow, cols[1]!.width, [{ text: r.itemCode, style: strong }]),
      cell(flow, cols[2]!.width, [{ text: r.description, style: body }]),
      cell(flow, cols[3]!.width, [{ text: formatMass(r.wllKg, units), style: body }]),
      cell(flow, cols[4]!.width, [{ text: r.loadKg === null ? "–" : loadText(r.loadKg, units), style: body }]),
      cell(flow, cols[5]!.width, [
        {
          text: percentUp(r.utilisation),
          style: r.utilisation !== null && r.utilisation > 1 ? { ...strong, color: TONE.fail } : strong,
        },
      ]),
      cell(flow, cols[6]!.width, [{ text: r.nextDueOn ?? "none on record", style: body }]),
    ],
  }));
  table(flow, cols, rows, "Rigging schedule");
  flow.paragraph(
    "Load: what the item carries in this plan, with contingency where its check applies it, rounded up. Utilisation: load / WLL (derated for angle and hitch where the check says so), rounded up.",
    { font: flow.fonts.regular, size: 7, color: INK_SOFT },
  );
}

function checksSection(flow: Flow, plan: PrintablePlan) {
  heading(flow, 5, "Checks", 50);
  // Worst first, so a failure or a warning is never buried under passes; otherwise as computed.
  const rank = { fail: 0, warn: 1, pass: 2 };
  const checks = [...(plan.results.checks ?? [])].sort((a, b) => rank[a.status] - rank[b.status]);
  const body = { font: flow.fonts.regular, size: 8, color: INK };
  const strong = { font: flow.fonts.semibold, size: 8, color: INK };
  const small = { font: flow.fonts.regular, size: 6.5, color: INK_SOFT };
  const counts = { pass: 0, warn: 0, fail: 0 };
  for (const c of checks) counts[c.status]++;
  flow.paragraph(
    checks.length === 0
      ? "No gear was allocated, so no item was checked."
      : `${checks.length} checks: ${counts.pass} pass, ${counts.warn} warn, ${counts.fail} fail. Utilisations are rounded up.`,
    strong,
    { gapAfter: 3 },
  );
  if (checks.length > 0) {
    const cols: Column[] = [
      { title: "Verdict", width: 44 },
      { title: "Item", width: 130 },
      { title: "Utilisation", width: 50, align: "right" },
      { title: "Finding, rule and source", width: CONTENT_W - 224 },
    ];
    const rows = checks.map((c) => ({
      accent: c.status === "pass" ? undefined : TONE[c.status],
      cells: [
        cell(flow, cols[0]!.width, [], { tag: { text: VERDICT[c.status], tone: c.status } }),
        cell(flow, cols[1]!.width, [{ text: c.item, style: strong }]),
        cell(flow, cols[2]!.width, [{ text: percentUp(c.utilisation), style: strong }]),
        cell(flow, cols[3]!.width, [
          { text: c.message, style: body },
          { text: `Rule: ${c.rule}  Source: ${c.source}`, style: small },
        ]),
      ],
    }));
    table(flow, cols, rows, "Checks");
  }
  if (plan.acknowledgements.length > 0) {
    flow.ensure(60);
    flow.y -= 6;
    flow.text("Warnings acknowledged before approval", LEFT, flow.y - 8, {
      font: flow.fonts.semibold,
      size: 9,
      color: STEEL,
    });
    flow.y -= 14;
    const cols: Column[] = [
      { title: "Check", width: 140 },
      { title: "Acknowledged by", width: 95 },
      { title: "When", width: 92 },
      { title: "Why it is acceptable", width: CONTENT_W - 327 },
    ];
    table(
      flow,
      cols,
      plan.acknowledgements.map((a) => ({
        cells: [
          cell(flow, cols[0]!.width, [{ text: a.checkItem, style: strong }]),
          cell(flow, cols[1]!.width, [{ text: a.by, style: body }]),
          cell(flow, cols[2]!.width, [{ text: utcText(a.at), style: body }]),
          cell(flow, cols[3]!.width, [{ text: a.reason, style: body }]),
        ],
      })),
      "Warnings acknowledged",
      { keepTogether: true },
    );
  }
}

function sequenceSection(flow: Flow, plan: PrintablePlan) {
  heading(flow, 6, "Lift sequence", 60);
  const holds = plan.details.sequence.filter((s) => s.holdPoint).length;
  flow.paragraph(
    holds > 0
      ? `${holds} hold point${holds === 1 ? "" : "s"}: stop at each, check, and carry on only when the lift supervisor releases it.`
      : "This sequence has no hold points.",
    { font: flow.fonts.regular, size: 8, color: INK },
    { gapAfter: 3 },
  );
  const cols: Column[] = [
    { title: "Step", width: 30, align: "right" },
    { title: "What to do", width: CONTENT_W - 30 },
  ];
  const title = { font: flow.fonts.semibold, size: 8.5, color: INK };
  const notes = { font: flow.fonts.regular, size: 8, color: INK };
  const rows = plan.details.sequence.map((s, i) => ({
    accent: s.holdPoint ? BRASS : undefined,
    cells: [
      cell(flow, cols[0]!.width, [{ text: `${i + 1}`, style: title }]),
      cell(
        flow,
        cols[1]!.width,
        [
          { text: s.title, style: title },
          { text: s.notes, style: notes },
        ],
        s.holdPoint ? { tag: { text: "HOLD POINT", tone: "hold" }, signoff: "Released by (name, time)" } : {},
      ),
    ],
  }));
  table(flow, cols, rows, "Lift sequence");
}

function hazardsSection(flow: Flow, plan: PrintablePlan) {
  heading(flow, 7, "Hazards and controls", 40);
  const body = { font: flow.fonts.regular, size: 8, color: INK };
  if (plan.details.hazards.length === 0) {
    flow.paragraph("No hazards recorded in this plan.", body);
    return;
  }
  const cols: Column[] = [
    { title: "#", width: 22, align: "right" },
    { title: "Hazard", width: 190 },
    { title: "Control", width: CONTENT_W - 212 },
  ];
  const rows = plan.details.hazards.map((h, i) => ({
    cells: [
      cell(flow, cols[0]!.width, [{ text: `${i + 1}`, style: body }]),
      cell(flow, cols[1]!.width, [{ text: h.hazard, style: { ...body, font: flow.fonts.semibold } }]),
      cell(flow, cols[2]!.width, [{ text: h.control, style: body }]),
    ],
  }));
  table(flow, cols, rows, "Hazards and controls");
}

function siteSection(flow: Flow, plan: PrintablePlan) {
  heading(flow, 8, "Exclusion zone, communication and people", 60);
  const body = { font: flow.fonts.regular, size: 8.5, color: INK };
  const label = { font: flow.fonts.semibold, size: 8, color: STEEL };
  flow.paragraph("Exclusion zone", label, { gapAfter: 0 });
  flow.paragraph(plan.details.exclusionZone.trim() || "Not stated: agree it at the briefing and write it here.", body, {
    gapAfter: 5,
  });
  flow.paragraph("Communication", label, { gapAfter: 0 });
  flow.paragraph(plan.details.communication.trim() || "Not stated: agree it at the briefing and write it here.", body, {
    gapAfter: 5,
  });
  flow.paragraph(
    `Floor clearance for the lift: ${formatLength(plan.details.floorClearanceM, plan.units)} under the load.`,
    body,
    { gapAfter: 6 },
  );
  const cols: Column[] = [
    { title: "Name", width: 200 },
    { title: "Role on the lift", width: CONTENT_W - 200 },
  ];
  if (plan.details.people.length === 0) {
    flow.paragraph("No people are named in this plan: name them at the briefing.", body);
    return;
  }
  table(
    flow,
    cols,
    plan.details.people.map((p) => ({
      cells: [
        cell(flow, 200, [{ text: p.name, style: { ...body, font: flow.fonts.semibold } }]),
        cell(flow, CONTENT_W - 200, [{ text: PERSON_ROLE_LABELS[p.role], style: body }]),
      ],
    })),
    "People",
    { keepTogether: true },
  );
}

const SIGNATORIES = ["Lift supervisor", "Slinger/signaller", "Crane operator"] as const;

function checklistSection(flow: Flow) {
  const rowH = 20;
  const signH = 30;
  heading(
    flow,
    9,
    "Pre-lift checklist and sign-off",
    PRE_LIFT_CHECKLIST.length * rowH + 40 + SIGNATORIES.length * signH,
  );
  const page = flow.page;
  const body = { font: flow.fonts.regular, size: 9, color: INK };
  const small = { font: flow.fonts.regular, size: 6.5, color: INK_SOFT };
  flow.text(
    "Tick each box on the day, before the lift. Do not lift until every box is ticked.",
    LEFT,
    flow.y - 9,
    small,
  );
  flow.text("Initials", RIGHT - 60, flow.y - 9, small);
  flow.y -= 12;
  // The same list the rigger ticks on the lift page, so the paper and the screen agree.
  for (const { text: item } of PRE_LIFT_CHECKLIST) {
    const y = flow.y - rowH;
    page.drawRectangle({ x: LEFT + 2, y: y + 5, width: 10, height: 10, borderColor: INK, borderWidth: 1 });
    flow.text(item, LEFT + 20, y + 7, body);
    const end = LEFT + 20 + flow.ts.width(flow.ts.clean(item), body.font, body.size) + 8;
    page.drawLine({
      start: { x: end, y: y + 6 },
      end: { x: RIGHT - 70, y: y + 6 },
      thickness: 0.3,
      color: RULE,
      dashArray: [1, 2],
    });
    page.drawLine({ start: { x: RIGHT - 60, y: y + 6 }, end: { x: RIGHT, y: y + 6 }, thickness: 0.6, color: INK_SOFT });
    flow.y = y;
  }
  flow.y -= 12;
  const cols = [
    { title: "Role", x: LEFT, w: 100 },
    { title: "Name", x: LEFT + 100, w: 150 },
    { title: "Signature", x: LEFT + 250, w: 160 },
    { title: "Date and time", x: LEFT + 410, w: CONTENT_W - 410 },
  ];
  page.drawRectangle({ x: LEFT, y: flow.y - 14, width: CONTENT_W, height: 14, color: STEEL_WASH });
  for (const c of cols) flow.text(c.title, c.x + 4, flow.y - 9.5, { font: flow.fonts.semibold, size: 7, color: STEEL });
  flow.y -= 14;
  for (const who of SIGNATORIES) {
    const y = flow.y - signH;
    flow.text(who, LEFT + 4, y + 10, { font: flow.fonts.semibold, size: 8.5, color: INK });
    for (const c of cols.slice(1))
      page.drawLine({
        start: { x: c.x + 4, y: y + 8 },
        end: { x: c.x + c.w - 6, y: y + 8 },
        thickness: 0.7,
        color: INK,
      });
    page.drawLine({ start: { x: LEFT, y }, end: { x: RIGHT, y }, thickness: 0.4, color: RULE });
    flow.y = y;
  }
}

// ----- header and footer on every page -----

function headerAndFooter(
  pdf: PDFDocument,
  pages: PDFPage[],
  fonts: Fonts,
  ts: Typesetter,
  plan: PrintablePlan,
  chrome: Chrome,
) {
  const n = pages.length;
  const { regular, semibold } = fonts;
  pages.forEach((page, i) => {
    const draw = (raw: string, x: number, y: number, style: Style, align: "left" | "right" | "center" = "left") => {
      const text = ts.clean(raw);
      const w = ts.width(text, style.font, style.size);
      page.drawText(text, {
        x: align === "left" ? x : align === "right" ? x - w : x - w / 2,
        y,
        size: style.size,
        font: style.font,
        color: style.color,
      });
    };
    // Header.
    let y = A4_HEIGHT_PT - MARGIN_TOP;
    draw(ts.fit(plan.organisationName, semibold, 8, CONTENT_W - 120), LEFT, y - 8, {
      font: semibold,
      size: 8,
      color: STEEL,
    });
    draw("LIFT PLAN", RIGHT, y - 8, { font: semibold, size: 8, color: BRASS }, "right");
    y -= 12;
    const tagText = chrome.statusTag;
    const tagW = tagWidth(ts, semibold, tagText, 8);
    chrome.titleLines.forEach((line) => {
      y -= 14;
      page.drawText(line, { x: LEFT, y: y + 3, size: 12, font: semibold, color: INK });
    });
    drawTag(page, ts, semibold, tagText, chrome.statusTone, RIGHT - tagW, A4_HEIGHT_PT - MARGIN_TOP - 14, 8);
    y -= 11;
    draw(chrome.metaLine, LEFT, y + 1, { font: regular, size: 8, color: INK });
    y -= 5;
    page.drawLine({ start: { x: LEFT, y }, end: { x: RIGHT, y }, thickness: 1.2, color: BRASS });

    // Footer: the caution, then print details, fingerprint and page number.
    let fy = MARGIN_BOTTOM;
    draw(`Printed ${utcText(plan.printedAt)} by ${plan.printedBy}`, LEFT, fy, {
      font: regular,
      size: 6.5,
      color: INK_SOFT,
    });
    draw(
      `Fingerprint ${plan.fingerprint.slice(0, 16)}…`,
      A4_WIDTH_PT / 2,
      fy,
      { font: regular, size: 6.5, color: INK_SOFT },
      "center",
    );
    draw(`Page ${i + 1} of ${n}`, RIGHT, fy, { font: semibold, size: 7, color: INK }, "right");
    fy += 11;
    for (const line of [...chrome.cautionLines].reverse()) {
      page.drawText(line, { x: LEFT, y: fy, size: CAUTION_SIZE, font: regular, color: INK });
      fy += CAUTION_SIZE * 1.25;
    }
    page.drawLine({ start: { x: LEFT, y: fy - 1 }, end: { x: RIGHT, y: fy - 1 }, thickness: 0.6, color: STEEL });

    if (plan.status === "superseded" || plan.status === "cancelled") {
      const word = ts.clean(PLAN_STATUS_LABELS[plan.status].toUpperCase());
      const size = 72;
      const w = ts.width(word, semibold, size);
      const c = Math.cos(Math.PI / 4);
      page.drawText(word, {
        x: A4_WIDTH_PT / 2 - (w / 2) * c + (size / 3) * c,
        y: A4_HEIGHT_PT / 2 - (w / 2) * c,
        size,
        font: semibold,
        color: TONE.fail,
        opacity: 0.12,
        rotate: degrees(45),
      });
    }
  });
  void pdf;
}

const CAUTION_SIZE = 7;

type Chrome = {
  titleLines: string[];
  metaLine: string;
  statusTag: string;
  statusTone: Tone;
  cautionLines: string[];
  headerH: number;
  footerH: number;
};

function chromeFor(plan: PrintablePlan, fonts: Fonts, ts: Typesetter): Chrome {
  const statusTag = statusWords(plan.status).toUpperCase();
  const tagW = tagWidth(ts, fonts.semibold, statusTag, 8);
  const titleW = CONTENT_W - tagW - 12;
  let titleLines = ts.wrap(plan.title, fonts.semibold, 12, titleW);
  if (titleLines.length > 2)
    titleLines = [titleLines[0]!, ts.fit(titleLines.slice(1).join(" "), fonts.semibold, 12, titleW)];
  const metaLine = ts.fit(
    `Job ${plan.job.workOrder} · ${plan.site.name} · Revision ${plan.revision} · ${statusWords(plan.status)}`,
    fonts.regular,
    8,
    CONTENT_W,
  );
  const cautionLines = ts.wrap(PLAN_CAUTION, fonts.regular, CAUTION_SIZE, CONTENT_W);
  const statusTone: Tone = plan.status === "approved" ? "pass" : plan.status === "completed" ? "neutral" : "fail";
  const headerH = 12 + titleLines.length * 14 + 11 + 5;
  const footerH = 11 + cautionLines.length * CAUTION_SIZE * 1.25 + 2;
  return { titleLines, metaLine, statusTag, statusTone, cautionLines, headerH, footerH };
}

// ----- the document -----

/** The printed plan as an A4 PDF (every page: header, the caution, page numbers, the fingerprint). */
export async function buildPlanPdf(plan: PrintablePlan): Promise<Uint8Array> {
  const files = loadFontFiles();
  const pdf = await PDFDocument.create();
  pdf.registerFontkit(cachingFontkit);
  const [regular, semibold] = await Promise.all([
    pdf.embedFont(files.regular, {
      subset: true,
      features: PLAIN_GLYPHS,
      customName: subsetName(plan.fingerprint, "Barlow-Regular"),
    }),
    pdf.embedFont(files.semibold, {
      subset: true,
      features: PLAIN_GLYPHS,
      customName: subsetName(plan.fingerprint, "Barlow-SemiBold"),
    }),
  ]);
  const fonts = { regular, semibold };
  const ts = new Typesetter(
    files.codePoints,
    new Map([
      [regular, files.regular],
      [semibold, files.semibold],
    ]),
  );
  const qrPng = await QRCode.toBuffer(plan.verifyUrl, { errorCorrectionLevel: "M", margin: 2, scale: 6 });
  const qr = await pdf.embedPng(qrPng);

  const printedAt = new Date(plan.printedAt);
  pdf.setTitle(ts.clean(`${plan.title} (revision ${plan.revision})`));
  pdf.setAuthor(ts.clean(plan.organisationName));
  pdf.setSubject(ts.clean(`Lift plan, job ${plan.job.workOrder}, ${plan.site.name}`));
  pdf.setCreator("Plumbline");
  pdf.setProducer("Plumbline");
  if (!Number.isNaN(printedAt.getTime())) {
    pdf.setCreationDate(printedAt);
    pdf.setModificationDate(printedAt);
  }

  const chrome = chromeFor(plan, fonts, ts);
  const top = A4_HEIGHT_PT - MARGIN_TOP - chrome.headerH - 4;
  const bottom = MARGIN_BOTTOM + chrome.footerH + 8;
  const flow = new Flow(pdf, fonts, ts, top, bottom);

  titleBlock(flow, plan, qr);
  loadSection(flow, plan);
  riggingSection(flow, plan);
  scheduleSection(flow, plan);
  checksSection(flow, plan);
  sequenceSection(flow, plan);
  hazardsSection(flow, plan);
  siteSection(flow, plan);
  checklistSection(flow);

  headerAndFooter(pdf, flow.pages, fonts, ts, plan, chrome);
  return pdf.save();
}
