import { buildPlanPdf } from "~/plan-pdf.server";
import { printablePlanFixture } from "./tests/support/printable-plan";
const plan = printablePlanFixture();
for (let i = 0; i < 10; i++) await buildPlanPdf(plan);
const t = performance.now();
for (let i = 0; i < 20; i++) await buildPlanPdf(plan);
console.log((performance.now() - t) / 20);
