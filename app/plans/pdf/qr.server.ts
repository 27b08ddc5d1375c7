// The verify QR code on page 1, drawn as vector shapes: each row's runs of dark modules are rectangles of one
// filled path, so it prints sharp at any size and costs no image to encode or decode.
import QRCode from "qrcode";
import { fill, popGraphicsState, pushGraphicsState, rectangle, setFillingGrayscaleColor, type PDFPage } from "pdf-lib";

/** Light modules around the code: the quiet zone readers need (ISO/IEC 18004 asks 4; 2 reads well on white paper, common practice). */
export const QR_QUIET_MODULES = 2;

export type QrCode = { size: number; dark: (row: number, col: number) => boolean };

/** The QR code of `text` at error correction level M (about 15 % of the code can be lost and still read). */
export function qrCode(text: string): QrCode {
  const { modules } = QRCode.create(text, { errorCorrectionLevel: "M" });
  return { size: modules.size, dark: (row, col) => Boolean(modules.get(row, col)) };
}

/** Draws `code` black on the page, its quiet zone included in the `side` points square at (x, y), bottom left. */
export function drawQrCode(page: PDFPage, code: QrCode, x: number, y: number, side: number) {
  const module = side / (code.size + 2 * QR_QUIET_MODULES);
  const left = x + QR_QUIET_MODULES * module;
  const top = y + side - QR_QUIET_MODULES * module;
  const ops = [pushGraphicsState(), setFillingGrayscaleColor(0)];
  for (let row = 0; row < code.size; row++) {
    for (let col = 0; col < code.size;) {
      if (!code.dark(row, col)) {
        col += 1;
        continue;
      }
      const start = col;
      while (col < code.size && code.dark(row, col)) col += 1;
      ops.push(rectangle(left + start * module, top - (row + 1) * module, (col - start) * module, module));
    }
  }
  ops.push(fill(), popGraphicsState());
  page.pushOperators(...ops);
}
