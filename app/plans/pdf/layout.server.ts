// The page: A4 geometry, the palette, measuring and wrapping text exactly as drawn, and the flow
// of content down pages.
import { rgb, type PDFDocument, type PDFFont, type PDFPage, type RGB } from "pdf-lib";
import { advanceAt1pt, printableText } from "~/plans/pdf/fonts.server";

// ----- page geometry (pt) -----

export const A4_WIDTH_PT = 595.28;
export const A4_HEIGHT_PT = 841.89;
/** One point in millimetres (1/72 in). */
export const PT_MM = 25.4 / 72;
export const MARGIN_X = 36;
export const MARGIN_TOP = 26;
export const MARGIN_BOTTOM = 22;
export const CONTENT_W = A4_WIDTH_PT - 2 * MARGIN_X;
export const LEFT = MARGIN_X;
export const RIGHT = A4_WIDTH_PT - MARGIN_X;

// ----- palette -----

export const hex = (h: string) =>
  rgb(parseInt(h.slice(1, 3), 16) / 255, parseInt(h.slice(3, 5), 16) / 255, parseInt(h.slice(5, 7), 16) / 255);
export const INK = hex("#17212b");
export const INK_SOFT = hex("#4a5663");
export const BRASS = hex("#9a6a14");
export const STEEL = hex("#2f5d7c");
export const STEEL_FILL = hex("#dbe8f1");
export const STEEL_WASH = hex("#f1f5f8");
export const RULE = hex("#c5ced6");
export const WHITE = rgb(1, 1, 1);
export type Tone = "pass" | "warn" | "fail" | "hold" | "neutral";
export const TONE: Record<Tone, RGB> = {
  pass: hex("#2e7346"),
  warn: hex("#9a5b00"),
  fail: hex("#a8261d"),
  hold: BRASS,
  neutral: STEEL,
};

// ----- text measuring and wrapping -----

export type Style = { font: PDFFont; size: number; color: RGB };

export class Typesetter {
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

export type Fonts = { regular: PDFFont; semibold: PDFFont };

export class Flow {
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

export function tagWidth(ts: Typesetter, font: PDFFont, text: string, size = 6.5) {
  return ts.width(ts.clean(text), font, size) + 7;
}

/** A word in a box (the verdict or a hold point): the word carries the meaning, the colour only helps. */
export function drawTag(
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
export function svgPolygon(points: ReadonlyArray<readonly [number, number]>): string {
  return `${points.map(([x, y], i) => `${i === 0 ? "M" : "L"}${x.toFixed(2)},${(-y).toFixed(2)}`).join(" ")} Z`;
}
