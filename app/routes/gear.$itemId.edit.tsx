import { data, redirect } from "react-router";
import type { Route } from "./+types/gear.$itemId.edit";
import { GearItemForm } from "~/components/gear-form";
import { Card, PageHeader } from "~/components/ui/form";
import { requireFormData } from "~/utils/forms";
import { parseGearItemForm } from "~/gear/form.server";
import { toFormValues, updateGearItem } from "~/models/gear-item.server";
import { requireGearItem } from "./gear.$itemId.server";
import { listSites } from "~/models/site.server";
import { watchAllocatedGear } from "~/plans/live-state.server";
import { flashNotice, requireUserWithRole } from "~/utils/session.server";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Edit ${data?.item.itemCode ?? "gear"} · Plumbline` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUserWithRole(request, "admin");
  const item = await requireGearItem(user.organisationId, params.itemId);
  const sites = await listSites(user.organisationId);
  return {
    sites: sites.map((s) => ({ id: s.id, name: s.name })),
    item: toFormValues(item),
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "admin");
  const item = await requireGearItem(user.organisationId, params.itemId);
  const form = await parseGearItemForm(user.organisationId, await requireFormData(request), item.id);
  if (!form.ok) return data({ errors: form.errors }, { status: 400 });
  await watchAllocatedGear(
    user.organisationId,
    item.id,
    () => updateGearItem(user.organisationId, item.id, form.data, user.id),
    request,
  );
  throw redirect(`/gear/${item.id}`, {
    headers: { "Set-Cookie": await flashNotice(request, `${form.data.itemCode} saved.`) },
  });
}

export default function EditGearItem({ loaderData, actionData }: Route.ComponentProps) {
  const { item, sites } = loaderData;
  return (
    <>
      <PageHeader
        title={`Edit ${item.itemCode}`}
        lead="Status changes and examinations are made on the item's page, with their reasons."
      >
        <a href={`/gear/${item.id}`} className="px-2 py-2 text-sm">
          Back to the item
        </a>
      </PageHeader>
      <Card className="max-w-2xl">
        <GearItemForm sites={sites} values={item} errors={actionData?.errors ?? {}} submitLabel="Save item" />
      </Card>
    </>
  );
}
