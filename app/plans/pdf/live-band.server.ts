// The band under the header of every page that says what the gear was like when the copy was printed:
// FIT TO LIFT with the time it was checked, or NOT FIT TO LIFT naming the items and since when; on a
// completed plan, when the lift was made. Always the same height, so the sealed content below it
// lays out the same whatever the band says.
import type { PDFPage } from "pdf-lib";
import { utcText } from "~/plans/pdf/format";
import { CONTENT_W, hex, LEFT, STEEL, TONE, WHITE, type Fonts, type Typesetter } from "~/plans/pdf/layout.server";
import type { PrintablePlan } from "~/plans/printable";

/** The band's height, pt: a heading line and two lines of detail. */
export const LIVE_BAND_H = 36;
const PAD_X = 6;

/** What the live parts of a page are drawn on: a pdf-lib page, or the recorder of an incremental stamp. */
export type StampCanvas = Pick<PDFPage, "drawText" | "drawRectangle">;

export type LiveBand = { tone: "pass" | "fail" | "neutral"; heading: string; detail: string[] };

/** The band for the printed copy, or null when it has nothing to say (a print made without the live state). */
export function liveBand(plan: PrintablePlan, fonts: Fonts, ts: Typesetter): LiveBand | null {
  const width = CONTENT_W - 2 * PAD_X;
  const twoLines = (text: string) => {
    const lines = ts.wrap(text, fonts.regular, 7.5, width);
    return lines.length <= 2 ? lines : [lines[0]!, ts.fit(lines.slice(1).join(" "), fonts.regular, 7.5, width)];
  };
  if (plan.liftRecord) {
    return {
      tone: "neutral",
      heading: ts.fit(
        `LIFT COMPLETED ${utcText(plan.liftRecord.liftedAt)}, recorded by ${plan.liftRecord.by}`,
        fonts.semibold,
        8.5,
        width,
      ),
      detail: twoLines(
        "This copy is the record of the plan the lift was made to. It is not for a new lift: a new lift needs a new approved plan.",
      ),
    };
  }
  const live = plan.live;
  if (!live) return null;
  const checked = utcText(live.checkedAt);
  if (live.fit) {
    return {
      tone: "pass",
      heading: ts.fit(`FIT TO LIFT as checked ${checked}`, fonts.semibold, 8.5, width),
      detail: twoLines(
        `When this copy was printed every allocated item was in service, in date for thorough examination on ${live.liftDate} and as approved. Scan the QR code before the lift to check again: gear can change after printing.`,
      ),
    };
  }
  const shown = live.problems.map((p) => p.message);
  return {
    tone: "fail",
    heading: ts.fit(`NOT FIT TO LIFT as checked ${checked}: do not lift to this plan`, fonts.semibold, 8.5, width),
    detail: twoLines(`${shown.join(" ")} It needs a new revision, approved again. The QR code leads to the full list.`),
  };
}

/** Draws the band with its top at `yTop` (pt from the bottom of the page). */
export function drawLiveBand(page: StampCanvas, band: LiveBand, yTop: number, fonts: Fonts) {
  const fill = band.tone === "fail" ? TONE.fail : band.tone === "pass" ? hex("#e3f1e8") : hex("#e4edf3");
  const ink = band.tone === "fail" ? WHITE : band.tone === "pass" ? TONE.pass : STEEL;
  page.drawRectangle({
    x: LEFT,
    y: yTop - LIVE_BAND_H,
    width: CONTENT_W,
    height: LIVE_BAND_H,
    color: fill,
    borderColor: band.tone === "fail" ? TONE.fail : ink,
    borderWidth: band.tone === "fail" ? 0 : 0.8,
  });
  page.drawText(band.heading, { x: LEFT + PAD_X, y: yTop - 11, size: 8.5, font: fonts.semibold, color: ink });
  band.detail.forEach((line, i) =>
    page.drawText(line, {
      x: LEFT + PAD_X,
      y: yTop - 21.5 - i * 9.2,
      size: 7.5,
      font: fonts.regular,
      color: band.tone === "fail" ? WHITE : hex("#17212b"),
    }),
  );
}
