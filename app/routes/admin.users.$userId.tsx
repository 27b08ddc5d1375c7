import { data, Form, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/admin.users.$userId";
import { sendInvitation } from "~/accounts/account-mail.server";
import { RoleCheckboxes } from "~/components/role-checkboxes";
import { Button, Card, FormError, PageHeader } from "~/components/ui/form";
import { parseForm, requireFormData } from "~/utils/forms";
import { recordAudit } from "~/models/audit-event.server";
import { countUserSessions, endUserSessions } from "~/models/session.server";
import { countOtherActiveAdmins, getOrganisationUser, setUserActive, updateUserRoles } from "~/models/user.server";
import { ROLES } from "~/utils/roles";
import { runInBackground } from "~/utils/background.server";
import { flashNotice, requireUserWithRole, sessionLifetimes } from "~/utils/session.server";

const schema = z.discriminatedUnion("intent", [
  z.object({ intent: z.literal("roles"), roles: z.array(z.enum(ROLES)).min(1, "Give the user at least one role.") }),
  z.object({ intent: z.literal("deactivate") }),
  z.object({ intent: z.literal("reactivate") }),
  z.object({ intent: z.literal("invite") }),
  z.object({ intent: z.literal("end-sessions") }),
]);

export const meta: Route.MetaFunction = () => [{ title: "User · Plumbline" }];

async function requireTargetUser(organisationId: number, rawId: string) {
  const userId = Number(rawId);
  const user = Number.isInteger(userId) ? await getOrganisationUser(organisationId, userId) : null;
  if (!user) throw data({ message: "There is no such user in your organisation." }, { status: 404 });
  return user;
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const admin = await requireUserWithRole(request, "admin");
  const user = await requireTargetUser(admin.organisationId, params.userId);
  return {
    isSelf: user.id === admin.id,
    sessionCount: await countUserSessions(user.id, sessionLifetimes()),
    user: {
      id: user.id,
      name: user.name,
      email: user.email,
      active: user.active,
      hasPassword: !!user.passwordHash,
      roles: (user.userRoles ?? []).map((r) => r.role),
    },
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const admin = await requireUserWithRole(request, "admin");
  const user = await requireTargetUser(admin.organisationId, params.userId);
  const form = parseForm(schema, await requireFormData(request), ["roles"]);
  if (!form.ok) return data({ errors: form.errors }, { status: 400 });
  const fail = (message: string) => data({ errors: { _form: [message] } as Record<string, string[]> }, { status: 400 });
  const back = async (notice: string) =>
    redirect(`/admin/users/${user.id}`, { headers: { "Set-Cookie": await flashNotice(request, notice) } });

  switch (form.data.intent) {
    case "roles": {
      const keepsAdmin = form.data.roles.includes("admin");
      if (!keepsAdmin && (await countOtherActiveAdmins(admin.organisationId, user.id)) === 0) {
        return fail("The organisation must keep at least one active admin.");
      }
      await updateUserRoles(admin.organisationId, user.id, form.data.roles, admin.id);
      return back(`${user.name}'s roles are saved.`);
    }
    case "deactivate": {
      if (user.id === admin.id) return fail("You cannot deactivate yourself; ask another admin.");
      await setUserActive(admin.organisationId, user.id, false, admin.id);
      return back(`${user.name} is deactivated and can no longer sign in. Their records stay.`);
    }
    case "reactivate": {
      await setUserActive(admin.organisationId, user.id, true, admin.id);
      return back(`${user.name} is active again.`);
    }
    case "end-sessions": {
      const ended = await endUserSessions(user.id);
      await recordAudit({
        organisationId: admin.organisationId,
        userId: admin.id,
        entity: "user",
        entityId: user.id,
        action: "sessions ended",
        details: { sessions: ended },
      });
      const whom = user.id === admin.id ? "You are" : `${user.name} is`;
      return back(`${whom} signed out everywhere (${ended} ${ended === 1 ? "session" : "sessions"} ended).`);
    }
    case "invite": {
      if (!user.active) return fail("Reactivate the user before sending an invitation.");
      runInBackground("the invitation mail", () => sendInvitation(user, admin.name, admin.organisationName, request));
      return back(`A new link to set a password is on its way to ${user.email}.`);
    }
  }
}

export default function EditUser({ loaderData, actionData }: Route.ComponentProps) {
  const { user, isSelf, sessionCount } = loaderData;
  const errors: Record<string, string[] | undefined> = actionData?.errors ?? {};
  return (
    <>
      <PageHeader
        title={user.name}
        lead={`${user.email} · ${user.active ? (user.hasPassword ? "active" : "invited, no password yet") : "deactivated"}`}
      >
        <a href="/admin" className="px-2 py-2 text-sm">
          All users
        </a>
      </PageHeader>
      <div className="grid max-w-3xl gap-6 md:grid-cols-2">
        <Card title="Roles">
          <Form method="post" className="space-y-4">
            <input type="hidden" name="intent" value="roles" />
            <FormError message={errors._form?.join(" ")} />
            <RoleCheckboxes selected={user.roles} errors={errors.roles} />
            <Button type="submit">Save roles</Button>
          </Form>
        </Card>
        <Card title="Access">
          <div className="space-y-4 text-sm">
            {user.active ? (
              <>
                <Form method="post">
                  <input type="hidden" name="intent" value="invite" />
                  <p className="mb-2 text-ink-soft">Send a fresh single-use link to set a password (72 hours).</p>
                  <Button type="submit" tone="secondary">
                    Send a new password link
                  </Button>
                </Form>
                <Form method="post">
                  <input type="hidden" name="intent" value="end-sessions" />
                  <p className="mb-2 text-ink-soft">
                    {sessionCount === 0
                      ? "Not signed in anywhere."
                      : `Signed in on ${sessionCount} ${sessionCount === 1 ? "browser" : "browsers"}. Signing them out ends every one at once; they sign in again with their password.`}
                  </p>
                  <Button type="submit" tone="secondary" disabled={sessionCount === 0}>
                    Sign out everywhere
                  </Button>
                </Form>
                {!isSelf && (
                  <Form method="post">
                    <input type="hidden" name="intent" value="deactivate" />
                    <p className="mb-2 text-ink-soft">
                      A deactivated user cannot sign in; their plans, approvals and records stay.
                    </p>
                    <Button type="submit" tone="danger">
                      Deactivate
                    </Button>
                  </Form>
                )}
              </>
            ) : (
              <Form method="post">
                <input type="hidden" name="intent" value="reactivate" />
                <Button type="submit" tone="secondary">
                  Reactivate
                </Button>
              </Form>
            )}
          </div>
        </Card>
      </div>
    </>
  );
}
