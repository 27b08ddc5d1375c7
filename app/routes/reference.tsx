import type { Route } from "./+types/reference";
import { cellText, columnLabel } from "~/components/reference-headings";
import { Card, PageHeader } from "~/components/ui/form";
import { getReferenceTables } from "~/models/reference-row.server";
import { requireUser } from "~/utils/session.server";

export const meta: Route.MetaFunction = () => [{ title: "Reference tables · Plumbline" }];

const TITLES: Record<string, string> = {
  din580Eyebolts: "Collar eyebolts (DIN 580), kg per eyebolt",
  shoulderEyeboltAngles: "Shoulder eyebolts: percentage of rated load by angle from the shank axis",
  shackles: "Shackle WLL series",
  shackleSideLoad: "Shackle side load: percentage of WLL by angle",
  chainGrade8: "Grade 8 chain slings (EN 818-4), tonnes",
  chainGrade80Us: "Grade 80 chain (US), rated load in lb",
  wireRope: "Wire rope slings, single leg, tonnes",
  textileColours: "Textile slings: colour by WLL in a straight lift",
  hitchFactors: "Hitch factors, by rule set",
  modeFactors: "Multi-leg mode factors, by rule set",
  ruleSets: "Rule sets: angle limits, eyebolt tables and examination intervals",
};

export async function loader({ request }: Route.LoaderArgs) {
  await requireUser(request);
  const tables = await getReferenceTables();
  return {
    tables: Object.entries(tables).map(([name, rows]) => ({
      name,
      title: TITLES[name] ?? name,
      rows: (rows as ReadonlyArray<Record<string, unknown>>).map((row) =>
        Object.fromEntries(Object.entries(row).map(([k, v]) => [k, String(v)])),
      ),
    })),
  };
}

export default function Reference({ loaderData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader
        title="Reference tables"
        lead="The published tables the checks size and derate gear with, each row with its source. Rows marked (memory) are recalled, not read from print: check them against the standard before relying on them."
      />
      <div className="space-y-6">
        {loaderData.tables.map((table) => {
          const columns = Object.keys(table.rows[0] ?? {}).filter((k) => k !== "source");
          const sources = [...new Set(table.rows.map((r) => r.source))];
          return (
            <Card key={table.name} title={table.title}>
              <div className="overflow-x-auto" tabIndex={0} role="region" aria-label={table.title}>
                <table>
                  <thead>
                    <tr>
                      {columns.map((c) => (
                        <th key={c} scope="col">
                          {columnLabel(c)}
                        </th>
                      ))}
                      {sources.length > 1 && <th scope="col">Source</th>}
                    </tr>
                  </thead>
                  <tbody>
                    {table.rows.map((row, i) => (
                      <tr key={i}>
                        {columns.map((c) => (
                          <td key={c}>{cellText(c, row[c] ?? "")}</td>
                        ))}
                        {sources.length > 1 && <td className="text-xs text-ink-soft">{row.source}</td>}
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
              {sources.length === 1 && <p className="mt-2 text-xs text-ink-soft">Source: {sources[0]}</p>}
            </Card>
          );
        })}
      </div>
    </>
  );
}
