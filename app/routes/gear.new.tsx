import { data, redirect } from "react-router";
import type { Route } from "./+types/gear.new";
import { GearItemForm } from "~/components/gear-form";
import { Card, PageHeader } from "~/components/ui/form";
import { requireFormData } from "~/utils/forms";
import { parseGearItemForm } from "~/gear/form.server";
import { createGearItem } from "~/models/gear-item.server";
import { listSites } from "~/models/site.server";
import { flashNotice, requireUserWithRole } from "~/utils/session.server";

export const meta: Route.MetaFunction = () => [{ title: "Add gear · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUserWithRole(request, "admin");
  const sites = await listSites(user.organisationId);
  return { sites: sites.map((s) => ({ id: s.id, name: s.name })) };
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "admin");
  const form = await parseGearItemForm(user.organisationId, await requireFormData(request));
  if (!form.ok) return data({ errors: form.errors }, { status: 400 });
  const item = await createGearItem(user.organisationId, form.data, user.id);
  throw redirect(`/gear/${item.id}`, {
    headers: {
      "Set-Cookie": await flashNotice(
        request,
        `${item.itemCode} is in the register. Record its thorough examination next.`,
      ),
    },
  });
}

export default function NewGearItem({ loaderData, actionData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader title="Add an item of gear" lead="One physical item, with the id and WLL marked on it.">
        <a href="/gear" className="px-2 py-2 text-sm">
          Back to the register
        </a>
      </PageHeader>
      <Card className="max-w-2xl">
        <GearItemForm sites={loaderData.sites} errors={actionData?.errors ?? {}} submitLabel="Add to the register" />
      </Card>
    </>
  );
}
