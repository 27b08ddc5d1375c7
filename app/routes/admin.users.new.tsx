import { data, Form, redirect } from "react-router";
import { UniqueConstraintError } from "sequelize";
import { z } from "zod";
import type { Route } from "./+types/admin.users.new";
import { sendInvitation } from "~/accounts/account-mail.server";
import { RoleCheckboxes } from "~/components/role-checkboxes";
import { Button, Card, Field, PageHeader } from "~/components/ui/form";
import { parseForm, requiredText, requireFormData, safeText } from "~/utils/forms";
import { createUser, findUserByEmail } from "~/models/user.server";
import { ROLES } from "~/utils/roles";
import { runInBackground } from "~/utils/background.server";
import { flashNotice, requireUserWithRole } from "~/utils/session.server";

const schema = z.object({
  name: requiredText("name", 200),
  email: safeText({ error: "Enter an e-mail address." })
    .trim()
    .toLowerCase()
    .email("Enter a valid e-mail address.")
    .max(320),
  roles: z.array(z.enum(ROLES)).min(1, "Give the user at least one role."),
});

const INVITATION_NOT_SENT =
  "The invitation could not be sent to that address. Check it with the person, or use another address.";

export const meta: Route.MetaFunction = () => [{ title: "Add a user · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  await requireUserWithRole(request, "admin");
  return null;
}

export async function action({ request }: Route.ActionArgs) {
  const admin = await requireUserWithRole(request, "admin");
  const form = parseForm(schema, await requireFormData(request), ["roles"]);
  if (!form.ok) return data({ errors: form.errors }, { status: 400 });
  const refuse = (message: string) =>
    data({ errors: { email: [message] } as Record<string, string[]> }, { status: 400 });
  const existing = await findUserByEmail(form.data.email);
  // An address of another organisation gets no hint that it is registered: only that nothing was sent.
  if (existing && existing.organisationId === admin.organisationId)
    return refuse("That address already belongs to a user of your organisation; see the user list.");
  if (existing) return refuse(INVITATION_NOT_SENT);
  const user = await createUser({ organisationId: admin.organisationId, ...form.data }, admin.id).catch(
    (error: unknown) => {
      // Registered by someone else between the look-up and the insert.
      if (error instanceof UniqueConstraintError) return null;
      throw error;
    },
  );
  if (!user) return refuse(INVITATION_NOT_SENT);
  // The mail goes after the response, so answering takes as long whatever the address.
  runInBackground("the invitation mail", () => sendInvitation(user, admin.name, admin.organisationName, request));
  throw redirect("/admin", {
    headers: {
      "Set-Cookie": await flashNotice(
        request,
        `${user.name} is added; an invitation to set a password is on its way to ${user.email}.`,
      ),
    },
  });
}

export default function NewUser({ actionData }: Route.ComponentProps) {
  const errors: Record<string, string[] | undefined> = actionData?.errors ?? {};
  return (
    <>
      <PageHeader
        title="Add a user"
        lead="They get an e-mail with a single-use link (valid 72 hours) to choose their password."
      />
      <Card className="max-w-xl">
        <Form method="post" className="space-y-4">
          <Field label="Name" name="name" required autoComplete="off" errors={errors.name} />
          <Field label="E-mail" name="email" type="email" required autoComplete="off" errors={errors.email} />
          <RoleCheckboxes selected={[]} errors={errors.roles} />
          <div className="flex gap-2">
            <Button type="submit">Add and send invitation</Button>
            <a href="/admin" className="px-4 py-2 text-sm">
              Cancel
            </a>
          </div>
        </Form>
      </Card>
    </>
  );
}
