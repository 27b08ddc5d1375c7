import { randomUUID } from "node:crypto";
import { Organisation } from "~/models/organisation.server";
import { createUser, getActiveSessionUser, type SessionUser } from "~/models/user.server";
import type { Role } from "~/utils/roles";
import { startSession } from "~/models/session.server";
import { sessionLifetimes, sessionStorage } from "~/utils/session.server";

export const TEST_PASSWORD = "correct horse battery";

export async function makeOrganisation(name = `Test org ${randomUUID().slice(0, 8)}`) {
  return Organisation.create({ name });
}

/** A user of `organisationId` (a new organisation when omitted) with the given roles and TEST_PASSWORD. */
export async function makeUser(
  roles: Role[],
  options: { organisationId?: number; name?: string; email?: string; password?: string | null } = {},
) {
  const organisationId = options.organisationId ?? (await makeOrganisation()).id;
  const user = await createUser(
    {
      organisationId,
      email: options.email ?? `${roles.join("-")}-${randomUUID().slice(0, 8)}@test.invalid`,
      name: options.name ?? `Test ${roles.join(" ")}`,
      roles,
      password: options.password === null ? undefined : (options.password ?? TEST_PASSWORD),
    },
    null,
  );
  const sessionUser = await getActiveSessionUser(user.id);
  if (!sessionUser) throw new Error("factory user not found");
  return sessionUser;
}

/** The Cookie header of a new signed-in session for `user` (a row in the sessions table, as signing in makes). */
export async function sessionCookie(user: Pick<SessionUser, "id">) {
  const session = await sessionStorage.getSession();
  session.set(
    "sessionToken",
    await startSession({ userId: user.id, address: null, userAgent: null }, sessionLifetimes()),
  );
  const setCookie = await sessionStorage.commitSession(session);
  return setCookie.split(";")[0]!;
}

const BASE = "http://localhost:3000";

/** A GET request, signed in as `user` when given. */
export async function getRequest(pathname: string, user?: Pick<SessionUser, "id">) {
  return new Request(BASE + pathname, { headers: user ? { Cookie: await sessionCookie(user) } : {} });
}

/** A form POST, signed in as `user` when given. Arrays become repeated fields. */
export async function postForm(
  pathname: string,
  fields: Record<string, string | string[]>,
  user?: Pick<SessionUser, "id">,
) {
  const body = new URLSearchParams();
  for (const [key, value] of Object.entries(fields))
    for (const v of Array.isArray(value) ? value : [value]) body.append(key, v);
  return new Request(BASE + pathname, {
    method: "POST",
    body,
    headers: {
      "Content-Type": "application/x-www-form-urlencoded",
      Origin: BASE,
      ...(user ? { Cookie: await sessionCookie(user) } : {}),
    },
  });
}

/** Calls a loader or action as React Router would; thrown Responses (redirects, 4xx) are returned, not thrown. */
export async function callRoute(
  fn: (args: never) => unknown,
  request: Request,
  params: Record<string, string> = {},
): Promise<{ status: number; headers: Headers; data: unknown }> {
  try {
    const result = await (fn as (args: unknown) => unknown)({ request, params, context: {} });
    return normalise(result);
  } catch (thrown) {
    if (thrown instanceof Response || isDataWithResponseInit(thrown)) return normalise(thrown);
    throw thrown;
  }
}

type DataWithInit = { type: "DataWithResponseInit"; data: unknown; init: ResponseInit | null };

function isDataWithResponseInit(value: unknown): value is DataWithInit {
  return typeof value === "object" && value !== null && (value as { type?: unknown }).type === "DataWithResponseInit";
}

async function normalise(result: unknown) {
  if (result instanceof Response) {
    const text = await result.text();
    let body: unknown = text;
    try {
      body = JSON.parse(text);
    } catch {
      // not JSON
    }
    return { status: result.status, headers: result.headers, data: body };
  }
  if (isDataWithResponseInit(result)) {
    return { status: result.init?.status ?? 200, headers: new Headers(result.init?.headers), data: result.data };
  }
  return { status: 200, headers: new Headers(), data: result };
}
