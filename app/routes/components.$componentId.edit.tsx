import { data, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/components.$componentId.edit";
import { ComponentForm } from "~/components/component-form";
import { PageHeader } from "~/components/ui/form";
import { parseComponentForm } from "~/loads/component-input";
import { requireFormData } from "~/utils/forms";
import { getComponent, toDefinition, updateComponent } from "~/models/component.server";
import { flashNotice, requireUserWithRole } from "~/utils/session.server";

const versionSchema = z.coerce.number().int().positive();

export const meta: Route.MetaFunction = () => [{ title: "Edit component · Plumbline" }];

async function requireComponent(organisationId: number, rawId: string) {
  const id = Number(rawId);
  const component = Number.isInteger(id) ? await getComponent(organisationId, id) : null;
  if (!component) throw data({ message: "There is no such component in your organisation." }, { status: 404 });
  return component;
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const component = await requireComponent(user.organisationId, params.componentId);
  return { id: component.id, version: component.version, definition: toDefinition(component), units: user.units };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const component = await requireComponent(user.organisationId, params.componentId);
  const formData = await requireFormData(request);
  const version = versionSchema.safeParse(formData.get("version"));
  if (!version.success)
    return data(
      {
        errors: { _form: ["The form is missing its version; reload the page and try again."] } as Record<
          string,
          string[]
        >,
      },
      { status: 400 },
    );
  const form = parseComponentForm(formData, user.units);
  if (!form.ok) return data({ errors: form.errors }, { status: 400 });
  const saved = await updateComponent(user.organisationId, component.id, form.data, version.data, user.id);
  if (saved === null) {
    return data(
      {
        errors: {
          _form: [
            "Someone else saved this component while you were editing. Your changes are not saved: reload to see theirs, then make yours again.",
          ],
        } as Record<string, string[]>,
      },
      { status: 409 },
    );
  }
  throw redirect(`/components/${component.id}`, {
    headers: { "Set-Cookie": await flashNotice(request, `${form.data.name} is saved (version ${saved}).`) },
  });
}

export default function EditComponent({ loaderData, actionData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader
        title={`Edit ${loaderData.definition.name}`}
        lead="Plans already made from this component keep their own copy; they change only when the planner pulls the new version in."
      >
        <a href={`/components/${loaderData.id}`} className="px-2 py-2 text-sm">
          Back
        </a>
      </PageHeader>
      <ComponentForm
        definition={loaderData.definition}
        units={loaderData.units}
        version={loaderData.version}
        errors={actionData?.errors ?? {}}
        submitLabel="Save changes"
      />
    </>
  );
}
