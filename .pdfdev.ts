import { writeFileSync } from "node:fs";
import { buildPlanPdf } from "~/plan-pdf.server";
import { printablePlanFixture, longPrintablePlan } from "./tests/support/printable-plan";
const t = performance.now();
const bytes = await buildPlanPdf(printablePlanFixture());
console.log("ms", performance.now() - t, "bytes", bytes.length);
writeFileSync("/tmp/pdf/plan.pdf", bytes);
writeFileSync("/tmp/pdf/long.pdf", await buildPlanPdf(longPrintablePlan()));
