// The printed plan's fonts: Barlow read once per process, embedded as a subset in each PDF, with
// stand-ins for characters it cannot draw.
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import fontkit from "@pdf-lib/fontkit";
import type { PDFDocument } from "pdf-lib";

export type FontFiles = { regular: Uint8Array; semibold: Uint8Array; codePoints: ReadonlySet<number> };
let fontFiles: FontFiles | null = null;
type ParsedFont = ReturnType<typeof fontkit.create>;
const parsedFonts = new Map<Uint8Array, ParsedFont>();

/**
 * fontkit with each font file parsed once per process: parsing and the lazily read tables are the
 * bulk of the cost of a PDF. pdf-lib only reads the parsed font (each PDF makes its own subset).
 */
export const cachingFontkit: Parameters<PDFDocument["registerFontkit"]>[0] = {
  create(bytes: Uint8Array, postscriptName?: string) {
    let font = parsedFonts.get(bytes);
    if (!font) parsedFonts.set(bytes, (font = withKeptLayouts(fontkit.create(bytes, postscriptName))));
    return font;
  },
};

/** Texts whose glyphs are kept per font; past this many the kept ones are dropped and kept afresh. */
const KEPT_LAYOUTS = 20_000;

/**
 * The font with the glyphs of each text laid out with PLAIN_GLYPHS kept: with every feature off a text's glyphs
 * are the same each time, and a plan prints the same labels, headings and figures on every page and in every
 * build. pdf-lib lays out each string it draws or measures; shaping was most of the font library's share of a build.
 */
function withKeptLayouts(font: ParsedFont): ParsedFont {
  type Run = ReturnType<ParsedFont["layout"]>;
  let kept = new Map<string, Run>();
  const layout = (text: string, features?: unknown, ...rest: unknown[]): Run => {
    if (features !== PLAIN_GLYPHS || rest.length > 0)
      return (font.layout as (...a: unknown[]) => Run)(text, features, ...rest);
    let run = kept.get(text);
    if (!run) {
      run = font.layout(text, PLAIN_GLYPHS);
      if (kept.size >= KEPT_LAYOUTS) kept = new Map();
      kept.set(text, run);
    }
    return run;
  };
  return new Proxy(font, { get: (target, key) => (key === "layout" ? layout : Reflect.get(target, key, target)) });
}

/**
 * Font features off: plain glyphs with their own advance widths (no kerning or ligatures), so
 * the text measures exactly as drawn from the advance table, copies out of the PDF letter for
 * letter, and shaping costs next to nothing.
 */
export const PLAIN_GLYPHS = {
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
export function subsetName(seed: string, postscriptName: string): string {
  const digest = createHash("sha256").update(`${seed}/${postscriptName}`).digest();
  const tag = Array.from(digest.subarray(0, 6), (b) => String.fromCharCode(65 + (b % 26))).join("");
  return `${tag}+${postscriptName}`;
}

export function loadFontFiles(): FontFiles {
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

export function advanceAt1pt(bytes: Uint8Array, codePoint: number): number {
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

/** Both weights of Barlow embedded in `pdf` as subsets named from `seed`, with the typesetter that measures them. */
export async function embedBarlow(pdf: PDFDocument, seed: string) {
  const files = loadFontFiles();
  pdf.registerFontkit(cachingFontkit);
  const [regular, semibold] = await Promise.all([
    pdf.embedFont(files.regular, {
      subset: true,
      features: PLAIN_GLYPHS,
      customName: subsetName(seed, "Barlow-Regular"),
    }),
    pdf.embedFont(files.semibold, {
      subset: true,
      features: PLAIN_GLYPHS,
      customName: subsetName(seed, "Barlow-SemiBold"),
    }),
  ]);
  const fonts = { regular, semibold };
  const fileOf = new Map([
    [regular, files.regular],
    [semibold, files.semibold],
  ]);
  return { fonts, codePoints: files.codePoints, files: fileOf };
}
