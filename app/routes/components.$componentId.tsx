import { data, Form, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/components.$componentId";
import { ComponentViews } from "~/components/component-views";
import { Button, Card, PageHeader } from "~/components/ui/form";
import { COG_SOURCE_LABELS, MASS_SOURCE_LABELS } from "~/component-definition";
import { parseForm } from "~/forms";
import { getComponent, setComponentArchived, toDefinition } from "~/models/component.server";
import { hasAnyRole } from "~/roles";
import { flashNotice, requireUser, requireUserWithRole } from "~/session.server";
import { formatLength, formatMass } from "~/units-format";

const schema = z.object({ intent: z.enum(["archive", "restore"]) });

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.definition.name ?? "Component"} · Plumbline` }];

async function requireComponent(organisationId: number, rawId: string) {
  const id = Number(rawId);
  const component = Number.isInteger(id) ? await getComponent(organisationId, id) : null;
  if (!component) throw data({ message: "There is no such component in your organisation." }, { status: 404 });
  return component;
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const component = await requireComponent(user.organisationId, params.componentId);
  return {
    id: component.id,
    version: component.version,
    archived: component.archivedAt !== null,
    definition: toDefinition(component),
    units: user.units,
    canEdit: hasAnyRole(user, "planner", "admin"),
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const component = await requireComponent(user.organisationId, params.componentId);
  const form = parseForm(schema, await request.formData());
  if (!form.ok) return data({ errors: form.errors }, { status: 400 });
  await setComponentArchived(user.organisationId, component.id, form.data.intent === "archive", user.id);
  const notice = form.data.intent === "archive" ? `${component.name} is archived; plans made from it keep their copy.` : `${component.name} is back in the list.`;
  throw redirect(`/components/${component.id}`, { headers: { "Set-Cookie": await flashNotice(request, notice) } });
}

export default function ComponentPage({ loaderData }: Route.ComponentProps) {
  const { definition: d, units, canEdit, archived, id, version } = loaderData;
  const planMass = d.massKg * (1 + d.contingencyPct / 100);
  return (
    <>
      <PageHeader title={d.name} lead={`${archived ? "Archived · " : ""}version ${version}${d.description ? ` · ${d.description}` : ""}`}>
        {canEdit && !archived && (
          <a href={`/components/${id}/edit`} className="rounded bg-steel px-4 py-2 text-sm font-semibold text-white no-underline hover:no-underline">
            Edit
          </a>
        )}
        {canEdit && (
          <Form method="post">
            <input type="hidden" name="intent" value={archived ? "restore" : "archive"} />
            <Button type="submit" tone="secondary">
              {archived ? "Restore" : "Archive"}
            </Button>
          </Form>
        )}
      </PageHeader>
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_24rem]">
        <div className="space-y-6">
          <Card title="Load">
            <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2">
              <div>
                <dt className="text-ink-soft">Mass</dt>
                <dd className="font-semibold">{formatMass(d.massKg, units)}</dd>
                <dd>{MASS_SOURCE_LABELS[d.massSource]}{d.massNote ? ` · ${d.massNote}` : ""}</dd>
              </div>
              <div>
                <dt className="text-ink-soft">With contingency ({d.contingencyPct} %)</dt>
                <dd className="font-semibold">{formatMass(planMass, units)}</dd>
                <dd className="text-ink-soft">what the plans check the rigging and crane against</dd>
              </div>
              <div>
                <dt className="text-ink-soft">Centre of gravity (x, y, z)</dt>
                <dd className="font-semibold">
                  {formatLength(d.cog.x, units)}, {formatLength(d.cog.y, units)}, {formatLength(d.cog.z, units)}
                </dd>
                <dd>{COG_SOURCE_LABELS[d.cogSource]}{d.cogNote ? ` · ${d.cogNote}` : ""}</dd>
              </div>
              <div>
                <dt className="text-ink-soft">Overall size (L × W × H)</dt>
                <dd className="font-semibold">
                  {formatLength(d.lengthM, units)} × {formatLength(d.widthM, units)} × {formatLength(d.heightM, units)}
                </dd>
              </div>
            </dl>
          </Card>
          <Card title="Lift points">
            {d.liftPoints.length === 0 ? (
              <p className="text-sm text-ink-soft">No lift points yet.{canEdit ? " Edit the component to add its tapped holes or lugs." : ""}</p>
            ) : (
              <div className="overflow-x-auto">
                <table>
                  <thead>
                    <tr>
                      <th scope="col">Id</th>
                      <th scope="col">Position (x, y, z)</th>
                      <th scope="col">Axis</th>
                      <th scope="col">Thread</th>
                      <th scope="col">Engagement</th>
                    </tr>
                  </thead>
                  <tbody>
                    {d.liftPoints.map((p) => (
                      <tr key={p.label}>
                        <td className="font-semibold">{p.label}</td>
                        <td>
                          {formatLength(p.position.x, units)}, {formatLength(p.position.y, units)}, {formatLength(p.position.z, units)}
                        </td>
                        <td>
                          {p.axis.x.toFixed(2)}, {p.axis.y.toFixed(2)}, {p.axis.z.toFixed(2)}
                        </td>
                        <td>{p.thread || "—"}</td>
                        <td>{p.engagementMm === null ? "—" : formatLength(p.engagementMm / 1000, units)}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            )}
          </Card>
          {d.parts.length > 0 && (
            <Card title="Parts (composite)">
              <table>
                <thead>
                  <tr>
                    <th scope="col">Part</th>
                    <th scope="col">Mass</th>
                    <th scope="col">Position (x, y, z)</th>
                  </tr>
                </thead>
                <tbody>
                  {d.parts.map((p, i) => (
                    <tr key={i}>
                      <td>{p.name}</td>
                      <td>{formatMass(p.massKg, units)}</td>
                      <td>
                        {formatLength(p.position.x, units)}, {formatLength(p.position.y, units)}, {formatLength(p.position.z, units)}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </Card>
          )}
        </div>
        <aside>
          <ComponentViews data={d} units={units} />
        </aside>
      </div>
    </>
  );
}
