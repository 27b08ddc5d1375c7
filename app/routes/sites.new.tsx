import { data, redirect } from "react-router";
import type { Route } from "./+types/sites.new";
import { SiteForm } from "~/components/site-form";
import { Card, PageHeader } from "~/components/ui/form";
import { parseForm, requireFormData } from "~/utils/forms";
import { createSite } from "~/models/site.server";
import { flashNotice, requireUserWithRole } from "~/utils/session.server";
import { siteSchema } from "~/sites-and-jobs/site-schema";

export const meta: Route.MetaFunction = () => [{ title: "Add a site · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  await requireUserWithRole(request, "planner", "admin");
  return null;
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const form = parseForm(siteSchema, await requireFormData(request));
  if (!form.ok) return data({ errors: form.errors }, { status: 400 });
  const site = await createSite(user.organisationId, form.data, user.id);
  throw redirect(`/sites/${site.id}`, {
    headers: { "Set-Cookie": await flashNotice(request, `${site.name} is added.`) },
  });
}

export default function NewSite({ actionData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader title="Add a site" />
      <Card className="max-w-xl">
        <SiteForm errors={actionData?.errors ?? {}} submitLabel="Add site" />
      </Card>
    </>
  );
}
