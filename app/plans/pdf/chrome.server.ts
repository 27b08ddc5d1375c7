// What every page of the printed plan carries: the header with the title and status, the caution,
// the page number, the short fingerprint and who printed it.
import { degrees, type PDFDocument, type PDFPage } from "pdf-lib";
import { PLAN_CAUTION, PLAN_STATUS_LABELS } from "~/plans/document";
import { statusWords, utcText } from "~/plans/pdf/format";
import {
  A4_HEIGHT_PT,
  A4_WIDTH_PT,
  BRASS,
  CONTENT_W,
  drawTag,
  INK,
  INK_SOFT,
  LEFT,
  MARGIN_BOTTOM,
  MARGIN_TOP,
  RIGHT,
  STEEL,
  tagWidth,
  TONE,
  type Fonts,
  type Style,
  type Tone,
  type Typesetter,
} from "~/plans/pdf/layout.server";
import { drawLiveBand, LIVE_BAND_H, liveBand, type LiveBand, type StampCanvas } from "~/plans/pdf/live-band.server";
import type { PrintablePlan } from "~/plans/printable";

/** Text drawn on `page` aligned at x. */
function drawer(page: StampCanvas, ts: Typesetter) {
  return (raw: string, x: number, y: number, style: Style, align: "left" | "right" | "center" = "left") => {
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
}

/** Where the rule under the header lies (pt from the bottom), the band's top sits 4 pt below it. */
function headerRuleY(chrome: Chrome) {
  return A4_HEIGHT_PT - MARGIN_TOP - 12 - chrome.titleLines.length * 14 - 11 - 5;
}

/** Every page's header and footer, with the live band and who printed it when. */
export function headerAndFooter(
  pdf: PDFDocument,
  pages: PDFPage[],
  fonts: Fonts,
  ts: Typesetter,
  plan: PrintablePlan,
  chrome: Chrome,
) {
  sealedHeaderAndFooter(pages, fonts, ts, plan, chrome);
  pages.forEach((page) => liveHeaderAndFooter(page, fonts, ts, plan, chrome));
  void pdf;
}

/**
 * What a page shows now rather than what was sealed: the live band under the header and the
 * "Printed <when> by <whom>" line at the foot. Drawn last, over the sealed page, in the places
 * the sealed layout leaves for them.
 */
export function liveHeaderAndFooter(
  page: StampCanvas,
  fonts: Fonts,
  ts: Typesetter,
  plan: PrintablePlan,
  chrome: Chrome,
) {
  if (chrome.band) drawLiveBand(page, chrome.band, headerRuleY(chrome) - 4, fonts);
  drawer(page, ts)(`Printed ${utcText(plan.printedAt)} by ${plan.printedBy}`, LEFT, MARGIN_BOTTOM, {
    font: fonts.regular,
    size: 6.5,
    color: INK_SOFT,
  });
}

/** Every page's header and footer without the live band and the printed line (the same on every print). */
export function sealedHeaderAndFooter(
  pages: PDFPage[],
  fonts: Fonts,
  ts: Typesetter,
  plan: PrintablePlan,
  chrome: Chrome,
) {
  const n = pages.length;
  const { regular, semibold } = fonts;
  pages.forEach((page, i) => {
    const draw = drawer(page, ts);
    // Header.
    let y = A4_HEIGHT_PT - MARGIN_TOP;
    draw(ts.fit(plan.organisationName, semibold, 8, CONTENT_W - 120), LEFT, y - 8, {
      font: semibold,
      size: 8,
      color: STEEL,
    });
    draw(chrome.documentName, RIGHT, y - 8, { font: semibold, size: 8, color: BRASS }, "right");
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

    // Footer: the caution, then (left to the live part) print details, fingerprint and page number.
    let fy = MARGIN_BOTTOM;
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
}

const CAUTION_SIZE = 7;

export type Chrome = {
  /** "LIFT PLAN", or "LIFT RECORD" on the record of a lift. */
  documentName: string;
  titleLines: string[];
  metaLine: string;
  statusTag: string;
  statusTone: Tone;
  cautionLines: string[];
  /** What the gear was like when printed (or when the lift was made), on every page under the header. */
  band: LiveBand | null;
  headerH: number;
  footerH: number;
};

export function chromeFor(plan: PrintablePlan, fonts: Fonts, ts: Typesetter, documentName = "LIFT PLAN"): Chrome {
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
  const band = liveBand(plan, fonts, ts);
  const headerH = 12 + titleLines.length * 14 + 11 + 5 + (band ? LIVE_BAND_H + 6 : 0);
  const footerH = 11 + cautionLines.length * CAUTION_SIZE * 1.25 + 2;
  return { documentName, titleLines, metaLine, statusTag, statusTone, cautionLines, band, headerH, footerH };
}
