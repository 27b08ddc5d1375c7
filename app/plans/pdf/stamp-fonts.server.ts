// The fonts of what each print stamps over the kept sealed body (the live band, the printed line).
// Encoding a subset font program costs about 10 ms a weight, more than the rest of a print, so each
// weight is embedded as a subset that always holds the same glyphs (the printable ASCII letters and a
// few marks) and its program is encoded once per process. A print that needs a character beyond them
// (a name in another script) adds it to its subset, and that print's program is encoded afresh.
import { deflateSync } from "node:zlib";
import type { PDFContext, PDFDocument, PDFFont, PDFRef } from "pdf-lib";
import { cachingFontkit, loadFontFiles, PLAIN_GLYPHS, subsetName } from "~/plans/pdf/fonts.server";

const ASCII = Array.from({ length: 0x7f - 0x20 }, (_, i) => String.fromCharCode(0x20 + i)).join("");
/** Every glyph a stamp subset starts with, in a fixed order so the encoded program is the same each time. */
export const STAMP_BASE_TEXT = `${ASCII}…–—‘’“”°×`;

type Embedder = {
  embedFontStream(context: PDFContext): Promise<PDFRef>;
  subset: { glyphs: unknown[] };
};
/** Per font file: the deflated program of the base subset and how many glyphs it holds. */
const keptPrograms = new Map<Uint8Array, { glyphs: number; deflated: Uint8Array }>();

/**
 * A weight of Barlow embedded as the stamp's base subset: its glyphs are those of STAMP_BASE_TEXT, numbered in
 * that order, so the same character has the same glyph id in every document that embeds it this way.
 */
export async function embedBaseSubset(pdf: PDFDocument, file: Uint8Array, postscriptName: string): Promise<PDFFont> {
  pdf.registerFontkit(cachingFontkit);
  const font = await pdf.embedFont(file, {
    subset: true,
    features: PLAIN_GLYPHS,
    customName: subsetName("printed-stamp", postscriptName),
  });
  const codePoints = loadFontFiles().codePoints;
  font.encodeText([...STAMP_BASE_TEXT].filter((c) => codePoints.has(c.codePointAt(0)!)).join(""));
  return font;
}

async function embedStampFont(pdf: PDFDocument, file: Uint8Array, postscriptName: string): Promise<PDFFont> {
  const font = await embedBaseSubset(pdf, file, postscriptName);
  // pdf-lib's embedder: the font program is written when the document is saved, from the subset's glyphs.
  const embedder = (font as unknown as { embedder: Embedder }).embedder;
  const base = embedder.subset.glyphs.length;
  const embedFresh = embedder.embedFontStream.bind(embedder);
  embedder.embedFontStream = async (context: PDFContext) => {
    const glyphs = embedder.subset.glyphs.length;
    if (glyphs !== base) return embedFresh(context);
    let kept = keptPrograms.get(file);
    if (!kept || kept.glyphs !== glyphs) {
      const program = await (embedder as unknown as { serializeFont(): Promise<Uint8Array> }).serializeFont();
      kept = { glyphs, deflated: new Uint8Array(deflateSync(program)) };
      keptPrograms.set(file, kept);
    }
    return context.register(context.stream(kept.deflated, { Filter: "FlateDecode" }));
  };
  // Every page carries the same band and printed line: each text is shaped once per print, not once per page.
  const encodeFresh = font.encodeText.bind(font);
  const encoded = new Map<string, ReturnType<PDFFont["encodeText"]>>();
  font.encodeText = (text: string) => {
    let hex = encoded.get(text);
    if (!hex) encoded.set(text, (hex = encodeFresh(text)));
    return hex;
  };
  return font;
}

/** Both weights of Barlow for the stamp of one print, with what the typesetter needs to measure them. */
export async function embedStampFonts(pdf: PDFDocument) {
  const files = loadFontFiles();
  pdf.registerFontkit(cachingFontkit);
  const regular = await embedStampFont(pdf, files.regular, "Barlow-Regular");
  const semibold = await embedStampFont(pdf, files.semibold, "Barlow-SemiBold");
  const fileOf = new Map([
    [regular, files.regular],
    [semibold, files.semibold],
  ]);
  return { fonts: { regular, semibold }, codePoints: files.codePoints, files: fileOf };
}
