import { data, Form, redirect } from "react-router";
import { z } from "zod";
import { guardFileSize } from "~/components/ui/file-size";
import { MAX_UPLOAD_BYTES } from "~/utils/file-type";
import type { Route } from "./+types/components.$componentId";
import { ComponentViews } from "~/components/component-views";
import { Button, Card, FormError, PageHeader, SelectField } from "~/components/ui/form";
import { COG_SOURCE_LABELS, MASS_SOURCE_LABELS } from "~/loads/component-definition";
import { parseForm, safeText } from "~/utils/forms";
import { addComponentFile, removeComponentFile } from "~/loads/component-files.server";
import { getComponent, listComponentFiles, setComponentArchived, toDefinition } from "~/models/component.server";
import { checkUpload, readUploadForm, uploadedFile } from "~/utils/uploads.server";
import { hasAnyRole } from "~/utils/roles";
import { flashNotice, requireUser, requireUserWithRole } from "~/utils/session.server";
import { formatLength, formatMass } from "~/utils/format";
import { DEFAULT_FIT_TOLERANCE_DEG } from "~/statics/tilt";

const schema = z.discriminatedUnion("intent", [
  z.object({ intent: z.literal("archive") }),
  z.object({ intent: z.literal("restore") }),
  z.object({
    intent: z.literal("upload"),
    kind: z.enum(["drawing", "photo"], { error: "Say whether it is a drawing or a photo." }),
    caption: z.preprocess(
      (v) => (typeof v === "string" ? v.trim() : ""),
      safeText().max(200, "At most 200 characters."),
    ),
  }),
  z.object({ intent: z.literal("remove-file"), fileId: z.coerce.number().int().positive() }),
]);

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `${data?.definition.name ?? "Component"} · Plumbline` },
];

async function requireComponent(organisationId: number, rawId: string) {
  const id = Number(rawId);
  const component = Number.isInteger(id) ? await getComponent(organisationId, id) : null;
  if (!component) throw data({ message: "There is no such component in your organisation." }, { status: 404 });
  return component;
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const component = await requireComponent(user.organisationId, params.componentId);
  const files = await listComponentFiles(component.id);
  return {
    files: files.map((f) => ({
      id: f.id,
      fileId: f.storedFileId,
      kind: f.kind,
      caption: f.caption,
      name: f.storedFile?.originalName ?? "",
      contentType: f.storedFile?.contentType ?? "",
    })),
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
  const upload = await readUploadForm(request, { maxFiles: 1 });
  if (!upload.ok)
    return data({ errors: { file: [upload.message] } as Record<string, string[]> }, { status: upload.status });
  const form = parseForm(schema, upload.formData);
  if (!form.ok) return data({ errors: form.errors }, { status: 400 });
  const back = async (notice: string) =>
    redirect(`/components/${component.id}`, { headers: { "Set-Cookie": await flashNotice(request, notice) } });
  switch (form.data.intent) {
    case "archive":
    case "restore": {
      await setComponentArchived(user.organisationId, component.id, form.data.intent === "archive", user.id);
      return back(
        form.data.intent === "archive"
          ? `${component.name} is archived; plans made from it keep their copy.`
          : `${component.name} is back in the list.`,
      );
    }
    case "upload": {
      const file = uploadedFile(upload.formData, "file");
      if (!file)
        return data(
          { errors: { file: ["Choose a drawing or photo to upload."] } as Record<string, string[]> },
          { status: 400 },
        );
      const checked = await checkUpload(file, ["png", "jpeg", "pdf"]);
      if (!checked.ok)
        return data({ errors: { file: [checked.message] } as Record<string, string[]> }, { status: 400 });
      await addComponentFile(
        user.organisationId,
        component.id,
        checked.upload,
        { kind: form.data.kind, caption: form.data.caption },
        user.id,
      );
      return back(`${checked.upload.originalName} is added.`);
    }
    case "remove-file": {
      const removed = await removeComponentFile(user.organisationId, component.id, form.data.fileId, user.id);
      if (!removed) throw data({ message: "That file is not attached to this component." }, { status: 404 });
      return back("The file is removed from the component.");
    }
  }
}

export default function ComponentPage({ loaderData, actionData }: Route.ComponentProps) {
  const { definition: d, units, canEdit, archived, id, version, files } = loaderData;
  const errors: Record<string, string[] | undefined> = actionData?.errors ?? {};
  const planMass = d.massKg * (1 + d.contingencyPct / 100);
  return (
    <>
      <PageHeader
        title={d.name}
        lead={`${archived ? "Archived · " : ""}version ${version}${d.description ? ` · ${d.description}` : ""}`}
      >
        {canEdit && !archived && (
          <a
            href={`/components/${id}/edit`}
            className="rounded bg-steel px-4 py-2 text-sm font-semibold text-white no-underline hover:no-underline"
          >
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
                <dd>
                  {MASS_SOURCE_LABELS[d.massSource]}
                  {d.massNote ? ` · ${d.massNote}` : ""}
                </dd>
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
                <dd>
                  {COG_SOURCE_LABELS[d.cogSource]}
                  {d.cogNote ? ` · ${d.cogNote}` : ""}
                </dd>
              </div>
              <div>
                <dt className="text-ink-soft">Fit tolerance (tilt along or across)</dt>
                <dd className="font-semibold">
                  {d.fitToleranceDeg ? `${d.fitToleranceDeg}°` : `${DEFAULT_FIT_TOLERANCE_DEG}° (common practice)`}
                </dd>
                <dd>{d.fitToleranceDeg ? d.fitToleranceSource : "none recorded for the component"}</dd>
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
              <p className="text-sm text-ink-soft">
                No lift points yet.{canEdit ? " Edit the component to add its tapped holes or lugs." : ""}
              </p>
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
                          {formatLength(p.position.x, units)}, {formatLength(p.position.y, units)},{" "}
                          {formatLength(p.position.z, units)}
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
                        {formatLength(p.position.x, units)}, {formatLength(p.position.y, units)},{" "}
                        {formatLength(p.position.z, units)}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </Card>
          )}
        </div>
        <aside className="space-y-6">
          <ComponentViews data={d} units={units} />
          <Card title="Drawings and photos">
            {files.length === 0 ? (
              <p className="text-sm text-ink-soft">
                None yet.{canEdit ? " Upload the general arrangement drawing or a photo of the lift points." : ""}
              </p>
            ) : (
              <ul className="space-y-3">
                {files.map((f) => (
                  <li key={f.id} className="text-sm">
                    {f.contentType.startsWith("image/") && (
                      <a href={`/files/${f.fileId}`}>
                        <img
                          src={`/files/${f.fileId}`}
                          alt={f.caption || f.name}
                          className="mb-1 max-h-40 rounded border border-rule"
                        />
                      </a>
                    )}
                    <a href={`/files/${f.fileId}`}>{f.name}</a>{" "}
                    <span className="text-ink-soft">({f.kind === "drawing" ? "drawing" : "photo"})</span>
                    {f.caption && <span className="block text-ink-soft">{f.caption}</span>}
                    {canEdit && (
                      <Form method="post" className="inline">
                        <input type="hidden" name="intent" value="remove-file" />
                        <input type="hidden" name="fileId" value={f.id} />
                        <button type="submit" className="ml-2 text-xs text-fail underline">
                          Remove
                        </button>
                      </Form>
                    )}
                  </li>
                ))}
              </ul>
            )}
            {canEdit && (
              <Form method="post" encType="multipart/form-data" className="mt-4 space-y-3 border-t border-rule pt-3">
                <input type="hidden" name="intent" value="upload" />
                <FormError message={errors.file?.join(" ")} />
                <div>
                  <label htmlFor="component-file" className="block text-sm font-medium">
                    File (PNG, JPEG or PDF, at most 10 MB)
                  </label>
                  <input
                    id="component-file"
                    name="file"
                    type="file"
                    accept="image/png,image/jpeg,application/pdf"
                    required
                    onChange={guardFileSize(MAX_UPLOAD_BYTES)}
                    className="mt-1 block w-full text-sm"
                  />
                </div>
                <SelectField
                  label="It is a"
                  name="kind"
                  errors={errors.kind}
                  options={[
                    { value: "drawing", label: "Drawing" },
                    { value: "photo", label: "Photo" },
                  ]}
                />
                <div>
                  <label htmlFor="component-file-caption" className="block text-sm font-medium">
                    Caption
                  </label>
                  <input
                    id="component-file-caption"
                    name="caption"
                    maxLength={200}
                    className="mt-1 block w-full rounded border border-rule px-3 py-1.5"
                  />
                </div>
                <Button type="submit" tone="secondary">
                  Upload
                </Button>
              </Form>
            )}
          </Card>
        </aside>
      </div>
    </>
  );
}
