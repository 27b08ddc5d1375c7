// axe-core in the browser tests: WCAG 2.1 A and AA plus axe's best practices, run on the page as
// it stands. The script is evaluated through the DevTools protocol, which the page's CSP does not
// govern, so the app's headers stay exactly as served.
import axe from "axe-core";
import type { Page } from "playwright-core";

export const AXE_TAGS = ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "best-practice"];

/** Impacts that fail a page; moderate and minor findings are reported by axe but do not fail. */
const FAILING_IMPACTS = new Set(["serious", "critical"]);

export type AxeFinding = { id: string; impact: string; help: string; targets: string[] };

/** The serious and critical axe violations on the page as it is now. */
export async function axeFindings(page: Page): Promise<AxeFinding[]> {
  const loaded = await page.evaluate(() => "axe" in window);
  if (!loaded) await page.evaluate(axe.source);
  const violations = await page.evaluate(async (tags) => {
    const runner = (window as unknown as { axe: typeof axe }).axe;
    const result = await runner.run(document, { runOnly: { type: "tag", values: tags }, resultTypes: ["violations"] });
    return result.violations.map((v) => ({
      id: v.id,
      impact: v.impact ?? "",
      help: v.help,
      targets: v.nodes.map((n) => n.target.join(" ")),
    }));
  }, AXE_TAGS);
  return violations.filter((v) => FAILING_IMPACTS.has(v.impact));
}

/** One readable block per failing rule: where, its impact and id, what it asks for and the elements that fail it. */
export function describeFindings(where: string, findings: AxeFinding[]) {
  return findings
    .map((f) => {
      const shown = f.targets
        .slice(0, 8)
        .map((t) => `\n    at ${t}`)
        .join("");
      const more = f.targets.length > 8 ? `\n    … and ${f.targets.length - 8} more` : "";
      return `${where}: [${f.impact}] ${f.id}: ${f.help}${shown}${more}`;
    })
    .join("\n");
}
