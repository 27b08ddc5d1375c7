import { data, redirect } from "react-router";
import type { Route } from "./+types/components.new";
import { ComponentForm } from "~/components/component-form";
import { PageHeader } from "~/components/ui/form";
import { parseComponentForm } from "~/loads/component-input";
import { requireFormData } from "~/utils/forms";
import { createComponent } from "~/models/component.server";
import { flashNotice, requireUserWithRole } from "~/utils/session.server";

export const meta: Route.MetaFunction = () => [{ title: "New component · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  return { units: user.units };
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const form = parseComponentForm(await requireFormData(request), user.units);
  if (!form.ok) return data({ errors: form.errors }, { status: 400 });
  const component = await createComponent(user.organisationId, form.data, user.id);
  throw redirect(`/components/${component.id}`, {
    headers: { "Set-Cookie": await flashNotice(request, `${component.name} is saved.`) },
  });
}

export default function NewComponent({ loaderData, actionData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader
        title="New component"
        lead="Give the mass and CoG with where each figure comes from; the plans built on it carry them."
      />
      <ComponentForm
        definition={null}
        units={loaderData.units}
        errors={actionData?.errors ?? {}}
        submitLabel="Save component"
      />
    </>
  );
}
