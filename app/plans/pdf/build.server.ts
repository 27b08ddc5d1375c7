// The printed lift plan: an A4 PDF built from a PrintablePlan and nothing else; the figures are
// printed as the server decided them. It is made in two parts: the sealed body (everything the sealed
// record decides, the same on every print of the revision, so it is built once and kept) and the
// stamp of each print (the live band and who printed it when), drawn over the kept body.
import { PDFDocument } from "pdf-lib";
import { chromeFor, liveHeaderAndFooter, sealedHeaderAndFooter } from "~/plans/pdf/chrome.server";
import { embedBarlow } from "~/plans/pdf/fonts.server";
import { A4_HEIGHT_PT, Flow, MARGIN_BOTTOM, MARGIN_TOP, Typesetter } from "~/plans/pdf/layout.server";
import { hazardsSection, checklistSection, sequenceSection, siteSection } from "~/plans/pdf/lift-sections.server";
import { checksSection, riggingSection, scheduleSection } from "~/plans/pdf/rigging-sections.server";
import { reserveStamp, stampIncrementally } from "~/plans/pdf/incremental-stamp.server";
import { embedStampFonts } from "~/plans/pdf/stamp-fonts.server";
import { loadSection, titleBlock } from "~/plans/pdf/title-block.server";
import type { PrintablePlan } from "~/plans/printable";
import { qrCode } from "~/plans/pdf/qr.server";

/** How many sealed bodies this process has built (a print that reuses a kept body builds none). */
let bodiesBuilt = 0;
export const sealedBodiesBuilt = () => bodiesBuilt;

/**
 * The sealed body of the printed plan: every page with its header, the caution, page numbers and the
 * fingerprint, leaving blank the places of the live band and the printed line. Depends only on what
 * `sealedBodyKey` names.
 */
export async function buildSealedBody(plan: PrintablePlan): Promise<Uint8Array> {
  bodiesBuilt += 1;
  // No dates of its own: each print's are those of the print, so the body is the same bytes whenever it is built.
  const pdf = await PDFDocument.create({ updateMetadata: false });
  const { fonts, codePoints, files } = await embedBarlow(pdf, plan.fingerprint);
  const ts = new Typesetter(codePoints, files);
  const qr = qrCode(plan.verifyUrl);

  pdf.setTitle(ts.clean(`${plan.title} (revision ${plan.revision})`));
  pdf.setAuthor(ts.clean(plan.organisationName));
  pdf.setSubject(ts.clean(`Lift plan, job ${plan.job.workOrder}, ${plan.site.name}`));
  pdf.setCreator("Plumbline");
  pdf.setProducer("Plumbline");

  // The band's presence sets the header's height; what it says is stamped on each print.
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

  sealedHeaderAndFooter(flow.pages, fonts, ts, plan, chrome);
  await reserveStamp(pdf, flow.pages);
  // A classic xref table and trailer, which each print's incremental update follows.
  return pdf.save({ useObjectStreams: false });
}

/**
 * One print: the kept sealed body with the live band and the printed line on every page. As an incremental
 * update of the body when it can be (incremental-stamp.server.ts), else drawn in full.
 */
export async function stampPrint(body: Uint8Array, plan: PrintablePlan): Promise<Uint8Array> {
  return (await stampIncrementally(body, plan)) ?? stampPrintInFull(body, plan);
}

/**
 * One print drawn in full: the kept sealed body loaded, the live band and the printed line drawn on every page,
 * and the whole saved again. Its own subset of Barlow (only the characters stamped) is embedded once and shared by
 * the pages.
 */
export async function stampPrintInFull(body: Uint8Array, plan: PrintablePlan): Promise<Uint8Array> {
  const pdf = await PDFDocument.load(body, { updateMetadata: false });
  const { fonts, codePoints, files } = await embedStampFonts(pdf);
  const ts = new Typesetter(codePoints, files);
  const chrome = chromeFor(plan, fonts, ts);
  for (const page of pdf.getPages()) liveHeaderAndFooter(page, fonts, ts, plan, chrome);
  const printedAt = new Date(plan.printedAt);
  if (!Number.isNaN(printedAt.getTime())) {
    pdf.setCreationDate(printedAt);
    pdf.setModificationDate(printedAt);
  }
  // Without object streams: written as they are, the stamp's few objects cost no compressing of the rest.
  return pdf.save({ objectsPerTick: Infinity, useObjectStreams: false });
}

/** The printed plan as an A4 PDF (every page: header, the caution, page numbers, the fingerprint). */
export async function buildPlanPdf(plan: PrintablePlan): Promise<Uint8Array> {
  return stampPrint(await buildSealedBody(plan), plan);
}

/** A print from the kept body when there is one; otherwise the body is built and handed back to be kept. */
export async function printPlanPdf(
  plan: PrintablePlan,
  kept: Uint8Array | null,
): Promise<{ bytes: Uint8Array; body: Uint8Array | null }> {
  if (kept) return { bytes: await stampPrint(kept, plan), body: null };
  const body = await buildSealedBody(plan);
  return { bytes: await stampPrint(body, plan), body };
}
