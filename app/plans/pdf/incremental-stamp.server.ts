// Each print of a kept sealed body as a PDF incremental update (ISO 32000-1 §7.5.6): the body is built with
// what every print fills already in place (the stamp's two fonts, embedded as their fixed base subset and named in
// every page's resources, and every page's content ending in one shared stamp stream, empty in the body), so a
// print appends only the new stamp stream, a new document information dictionary with the print's dates, an xref
// section for the two and a trailer pointing back to the body's (/Prev). No parsing or re-saving of the body: the
// bytes of the body go out as they are. Text the base subset cannot show (a name in another script) is left to the
// full stamp (build.server.ts), which draws the same band and line with fonts of its own.
import {
  cleanText,
  degrees,
  drawLinesOfText,
  drawRectangle,
  lineSplit,
  PDFDocument,
  PDFHexString,
  PDFName,
  PDFString,
  rgb,
  type PDFFont,
  type PDFOperator,
  type PDFPage,
  type PDFPageDrawRectangleOptions,
  type PDFPageDrawTextOptions,
  type PDFRef,
} from "pdf-lib";
import { chromeFor, liveHeaderAndFooter } from "~/plans/pdf/chrome.server";
import { loadFontFiles } from "~/plans/pdf/fonts.server";
import { Typesetter, type Fonts } from "~/plans/pdf/layout.server";
import type { StampCanvas } from "~/plans/pdf/live-band.server";
import { embedBaseSubset, STAMP_BASE_TEXT } from "~/plans/pdf/stamp-fonts.server";
import type { PrintablePlan } from "~/plans/printable";

/** The key in the dictionary of the body's stamp stream that marks it (a reader ignores a key it does not know). */
const STAMP_MARK = "PlumblineStamp";
/** The names the stamp's fonts go by in every page's resources. */
const FONT_KEYS = { regular: "PlumblineStampRegular", semibold: "PlumblineStampSemiBold" } as const;

/**
 * Makes room in a sealed body being built for the stamp of each print: the two stamp fonts with their base subset,
 * in every page's resources, and every page's content as [q, the page, Q, the stamp] so the stamp starts from the
 * page's initial graphics state. The body must be saved without object streams (a classic xref table and trailer).
 */
export async function reserveStamp(pdf: PDFDocument, pages: PDFPage[]) {
  const files = loadFontFiles();
  const regular = await embedBaseSubset(pdf, files.regular, "Barlow-Regular");
  const semibold = await embedBaseSubset(pdf, files.semibold, "Barlow-SemiBold");
  const context = pdf.context;
  const open = context.register(context.stream("q"));
  const close = context.register(context.stream("Q"));
  const stamp = context.register(context.stream("", { [STAMP_MARK]: true }));
  for (const page of pages) {
    const drawn = page.node.Contents();
    const contents: PDFRef[] = [];
    if (drawn && "asArray" in drawn) drawn.asArray().forEach((ref) => contents.push(ref as PDFRef));
    else if (drawn) contents.push(context.getObjectRef(drawn) ?? context.register(drawn));
    page.node.set(PDFName.of("Contents"), context.obj([open, ...contents, close, stamp]));
    page.node.setFontDictionary(PDFName.of(FONT_KEYS.regular), regular.ref);
    page.node.setFontDictionary(PDFName.of(FONT_KEYS.semibold), semibold.ref);
  }
}

/** Where a kept body's parts lie, read from its end: enough to append an update to it. */
type Frame = { prevXref: number; size: number; root: string; id: string | null; stampNum: number; infoNum: number };

function asBuffer(bytes: Uint8Array) {
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}

/** The body's trailer, its xref table's offsets and the marked stamp stream; null when it was not made for this. */
function readFrame(body: Buffer): Frame | null {
  const tail = body.subarray(Math.max(0, body.length - 1024)).toString("latin1");
  const end = /trailer\s*<<([\s\S]*?)>>\s*startxref\s+(\d+)\s+%%EOF\s*$/.exec(tail);
  if (!end) return null;
  const trailer = end[1]!;
  const size = /\/Size (\d+)/.exec(trailer);
  const root = /\/Root (\d+ \d+ R)/.exec(trailer);
  const info = /\/Info (\d+) 0 R/.exec(trailer);
  if (!size || !root || !info) return null;
  const mark = body.lastIndexOf(`/${STAMP_MARK} true`);
  const header = mark < 0 ? -1 : body.lastIndexOf(" 0 obj", mark);
  if (header < 0) return null;
  let start = header;
  while (start > 0 && body[start - 1]! >= 0x30 && body[start - 1]! <= 0x39) start--;
  const frame: Frame = {
    prevXref: Number(end[2]),
    size: Number(size[1]),
    root: root[1]!,
    id: /\/ID\s*(\[[^\]]*\])/.exec(trailer)?.[1] ?? null,
    stampNum: Number(body.subarray(start, header).toString("latin1")),
    infoNum: Number(info[1]),
  };
  // The marked stream must be the object the body's xref table names, not a look-alike inside some stream.
  return objectOffset(body, frame, frame.stampNum) === start ? frame : null;
}

/** The offset of object `num` from the body's xref table (one subsection from 0, as the builder writes it). */
function objectOffset(body: Buffer, frame: Frame, num: number): number {
  const head = /^xref\s*\n0 (\d+)\s*\n/.exec(body.subarray(frame.prevXref, frame.prevXref + 32).toString("latin1"));
  if (!head || Number(head[1]) !== frame.size || num <= 0 || num >= frame.size) return -1;
  const entry = body.subarray(
    frame.prevXref + head[0].length + 20 * num,
    frame.prevXref + head[0].length + 20 * num + 18,
  );
  const m = /^(\d{10}) (\d{5}) n$/.exec(entry.toString("latin1"));
  return m && m[2] === "00000" ? Number(m[1]) : -1;
}

/** The body's information dictionary with the print's dates in place of the body's. */
function infoWithDates(body: Buffer, frame: Frame, printedAt: string): string | null {
  const at = objectOffset(body, frame, frame.infoNum);
  if (at < 0) return null;
  const endobj = body.indexOf("endobj", at);
  if (endobj < 0) return null;
  const text = body.subarray(at, endobj).toString("latin1");
  const open = text.indexOf("<<");
  const close = text.lastIndexOf(">>");
  if (!text.startsWith(`${frame.infoNum} 0 obj`) || open < 0 || close < open) return null;
  const when = new Date(printedAt);
  if (Number.isNaN(when.getTime())) return text.slice(open, close + 2);
  const date = PDFString.fromDate(when).toString();
  const kept = text.slice(open + 2, close).replace(/\s*\/(CreationDate|ModDate)\s*\([^)]*\)/g, "");
  return `<<${kept.trimEnd()}\n/CreationDate ${date}\n/ModDate ${date}\n>>`;
}

/**
 * The stamp fonts of this process: the same base subsets as in every body, for measuring, and per weight the base
 * subset's glyph id (as 4 hex digits) of each character it holds, so a print encodes its text without shaping it.
 */
type Reference = {
  fonts: Fonts;
  ts: Typesetter;
  glyphs: Map<PDFFont, Map<string, string>>;
  keys: Map<PDFFont, PDFName>;
};
let reference: Promise<Reference | null> | null = null;

/**
 * Each base character's glyph id in the weight's base subset, as pdf-lib's shaping (features off) gives it; null
 * if the base text shaped whole differs from its characters one by one (then no character is encoded alone).
 */
function baseGlyphs(font: PDFFont, codePoints: ReadonlySet<number>): Map<string, string> | null {
  const chars = [...new Set(STAMP_BASE_TEXT)].filter((c) => codePoints.has(c.codePointAt(0)!));
  const glyphs = new Map(chars.map((c) => [c, font.encodeText(c).asString()]));
  const whole = font.encodeText(chars.join("")).asString();
  return whole === chars.map((c) => glyphs.get(c)).join("") && [...glyphs.values()].every((g) => g.length === 4)
    ? glyphs
    : null;
}

function referenceFonts(): Promise<Reference | null> {
  reference ??= (async () => {
    const files = loadFontFiles();
    const pdf = await PDFDocument.create({ updateMetadata: false });
    const regular = await embedBaseSubset(pdf, files.regular, "Barlow-Regular");
    const semibold = await embedBaseSubset(pdf, files.semibold, "Barlow-SemiBold");
    const fileOf = new Map([
      [regular, files.regular],
      [semibold, files.semibold],
    ]);
    const regularGlyphs = baseGlyphs(regular, files.codePoints);
    const semiboldGlyphs = baseGlyphs(semibold, files.codePoints);
    if (!regularGlyphs || !semiboldGlyphs) return null;
    const glyphs = new Map([
      [regular, regularGlyphs],
      [semibold, semiboldGlyphs],
    ]);
    const keys = new Map([
      [regular, PDFName.of(FONT_KEYS.regular)],
      [semibold, PDFName.of(FONT_KEYS.semibold)],
    ]);
    return { fonts: { regular, semibold }, ts: new Typesetter(files.codePoints, fileOf), glyphs, keys };
  })();
  return reference;
}

/** Thrown while recording when a text needs a glyph the base subset lacks. */
class BeyondBaseSubset extends Error {}

/** Records what liveHeaderAndFooter draws as the operators pdf-lib's page would write, in the base subset's glyphs. */
class StampRecorder implements StampCanvas {
  readonly operators: PDFOperator[] = [];
  constructor(private readonly ref: Reference) {}

  private encode(font: PDFFont, line: string): PDFHexString {
    const glyphs = this.ref.glyphs.get(font);
    let hex = "";
    for (const ch of line) {
      const glyph = glyphs?.get(ch);
      if (glyph === undefined) throw new BeyondBaseSubset();
      hex += glyph;
    }
    return PDFHexString.of(hex);
  }

  drawText(text: string, options: PDFPageDrawTextOptions = {}) {
    const font = options.font;
    const key = font && this.ref.keys.get(font);
    if (!font || !key || options.opacity !== undefined || options.maxWidth !== undefined || options.blendMode)
      throw new BeyondBaseSubset();
    const lines = lineSplit(cleanText(text)).map((line) => this.encode(font, line));
    this.operators.push(
      ...drawLinesOfText(lines, {
        color: options.color ?? rgb(0, 0, 0),
        font: key,
        size: options.size ?? 24,
        rotate: options.rotate ?? degrees(0),
        xSkew: options.xSkew ?? degrees(0),
        ySkew: options.ySkew ?? degrees(0),
        x: options.x ?? 0,
        y: options.y ?? 0,
        lineHeight: options.lineHeight ?? 24,
      }),
    );
  }

  drawRectangle(options: PDFPageDrawRectangleOptions = {}) {
    if (options.opacity !== undefined || options.borderOpacity !== undefined || options.blendMode)
      throw new BeyondBaseSubset();
    this.operators.push(
      ...drawRectangle({
        x: options.x ?? 0,
        y: options.y ?? 0,
        width: options.width ?? 150,
        height: options.height ?? 100,
        rotate: options.rotate ?? degrees(0),
        xSkew: options.xSkew ?? degrees(0),
        ySkew: options.ySkew ?? degrees(0),
        borderWidth: options.borderWidth ?? 0,
        color: options.color,
        borderColor: options.borderColor,
        borderDashArray: options.borderDashArray,
        borderDashPhase: options.borderDashPhase,
        borderLineCap: options.borderLineCap,
      }),
    );
  }
}

/** The stamp's content stream: the live band and the printed line, the same on every page. */
async function stampContent(plan: PrintablePlan): Promise<string | null> {
  const ref = await referenceFonts();
  if (!ref) return null;
  const recorder = new StampRecorder(ref);
  try {
    liveHeaderAndFooter(recorder, ref.fonts, ref.ts, plan, chromeFor(plan, ref.fonts, ref.ts));
  } catch (error) {
    if (error instanceof BeyondBaseSubset) return null;
    throw error;
  }
  return recorder.operators.map((op) => op.toString()).join("\n");
}

/**
 * One print as the kept body followed by an incremental update holding its stamp; null when the body has no room
 * made for one or the stamp needs a glyph outside the base subset (then the full stamp prints it).
 */
export async function stampIncrementally(kept: Uint8Array, plan: PrintablePlan): Promise<Uint8Array | null> {
  const body = asBuffer(kept);
  const frame = readFrame(body);
  if (!frame) return null;
  const info = infoWithDates(body, frame, plan.printedAt);
  const content = info === null ? null : await stampContent(plan);
  if (info === null || content === null) return null;

  let update = "\n";
  const offsets = new Map<number, number>();
  const add = (num: number, text: string) => {
    offsets.set(num, body.length + Buffer.byteLength(update, "latin1"));
    update += `${num} 0 obj\n${text}\nendobj\n`;
  };
  add(frame.stampNum, `<<\n/Length ${Buffer.byteLength(content, "latin1")}\n>>\nstream\n${content}\nendstream`);
  add(frame.infoNum, info);
  const xref = body.length + Buffer.byteLength(update, "latin1");
  update += "xref\n";
  for (const [num, at] of [...offsets].sort((a, b) => a[0] - b[0]))
    update += `${num} 1\n${String(at).padStart(10, "0")} 00000 n \n`;
  update += `trailer\n<<\n/Size ${frame.size}\n/Root ${frame.root}\n/Info ${frame.infoNum} 0 R\n`;
  if (frame.id) update += `/ID ${frame.id}\n`;
  update += `/Prev ${frame.prevXref}\n>>\nstartxref\n${xref}\n%%EOF\n`;
  return new Uint8Array(Buffer.concat([body, Buffer.from(update, "latin1")]));
}

/**
 * Readies this process's stamp before its first print needs it: the code and the fonts loaded, the reference
 * subsets made, and one stamp written onto a small marked document, so that the first prints run warm. Yields to
 * the event loop between the steps.
 */
export async function warmIncrementalStamp() {
  const turn = () => new Promise((resolve) => setImmediate(resolve));
  await referenceFonts();
  await turn();
  const pdf = await PDFDocument.create({ updateMetadata: false });
  pdf.addPage();
  pdf.setTitle("Stamp check");
  pdf.context.register(pdf.context.stream("", { [STAMP_MARK]: true }));
  const body = await pdf.save({ useObjectStreams: false });
  await turn();
  const problem = { itemId: 0, itemCode: "X-0", position: "A", kind: "quarantined" as const, since: null, detail: "" };
  const sample = {
    title: "Stamp check",
    status: "approved",
    revision: 1,
    job: { workOrder: "W-0" },
    site: { name: "Site" },
    printedAt: new Date(0).toISOString(),
    printedBy: "Stamp check",
    live: {
      fit: false,
      checkedAt: new Date(0).toISOString(),
      liftDate: "1970-01-01",
      problems: [{ ...problem, message: "X-0 (A) is quarantined." }],
    },
  } as unknown as PrintablePlan;
  await stampIncrementally(body, sample);
  await turn();
  await stampIncrementally(body, { ...sample, live: { ...sample.live!, fit: true, problems: [] } });
}
