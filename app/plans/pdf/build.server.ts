// The printed lift plan: an A4 PDF built from a PrintablePlan and nothing else; the figures are
// printed as the server decided them.
import { PDFDocument } from "pdf-lib";
import QRCode from "qrcode";
import { chromeFor, headerAndFooter } from "~/plans/pdf/chrome.server";
import { embedBarlow } from "~/plans/pdf/fonts.server";
import { A4_HEIGHT_PT, Flow, MARGIN_BOTTOM, MARGIN_TOP, Typesetter } from "~/plans/pdf/layout.server";
import { hazardsSection, checklistSection, sequenceSection, siteSection } from "~/plans/pdf/lift-sections.server";
import { checksSection, riggingSection, scheduleSection } from "~/plans/pdf/rigging-sections.server";
import { loadSection, titleBlock } from "~/plans/pdf/title-block.server";
import type { PrintablePlan } from "~/plans/printable";

/** The printed plan as an A4 PDF (every page: header, the caution, page numbers, the fingerprint). */
export async function buildPlanPdf(plan: PrintablePlan): Promise<Uint8Array> {
  const pdf = await PDFDocument.create();
  const { fonts, codePoints, files } = await embedBarlow(pdf, plan.fingerprint);
  const ts = new Typesetter(codePoints, files);
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
