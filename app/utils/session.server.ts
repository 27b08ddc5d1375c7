import { createCookieSessionStorage, data, redirect } from "react-router";
import { env } from "~/utils/env.server";
import { getActiveSessionUser, type SessionUser } from "~/models/user.server";
import { ROLE_LABELS, type Role } from "~/utils/roles";

/** The session cookie holds only the signed-in user's id. SESSION_SECRET may list several (newest first) to rotate. */
export const sessionStorage = createCookieSessionStorage<{ userId: number }, { flash: string }>({
  cookie: {
    name: "__plumbline_session",
    httpOnly: true,
    sameSite: "lax",
    path: "/",
    secure: env.isProduction,
    secrets: env.sessionSecrets,
    maxAge: 60 * 60 * 12,
  },
});

function isApiRequest(request: Request) {
  return new URL(request.url).pathname.startsWith("/api/");
}

// The root loader and the route's loader both ask for the user of one request; the second gets the first's answer.
const usersByRequest = new WeakMap<Request, Promise<SessionUser | null>>();

/** The signed-in, active user, or null (looked up once per request). */
export function getUser(request: Request): Promise<SessionUser | null> {
  let user = usersByRequest.get(request);
  if (!user) {
    user = lookUpUser(request);
    usersByRequest.set(request, user);
  }
  return user;
}

// A page's root loader reads the session twice (user, notice); the signature is checked once per request.
const sessionsByRequest = new WeakMap<Request, ReturnType<typeof sessionStorage.getSession>>();

function requestSession(request: Request) {
  let session = sessionsByRequest.get(request);
  if (!session) {
    session = sessionStorage.getSession(request.headers.get("Cookie"));
    sessionsByRequest.set(request, session);
  }
  return session;
}

async function lookUpUser(request: Request): Promise<SessionUser | null> {
  const session = await requestSession(request);
  const userId = session.get("userId");
  if (typeof userId !== "number") return null;
  return getActiveSessionUser(userId);
}

/** A same-site path to return to, or the fallback: never another origin (no open redirect). */
export function safeRedirectPath(value: unknown, fallback = "/"): string {
  if (typeof value !== "string" || !value.startsWith("/") || value.startsWith("//") || value.startsWith("/\\"))
    return fallback;
  try {
    const url = new URL(value, "http://plumbline.invalid");
    if (url.origin !== "http://plumbline.invalid") return fallback;
    return url.pathname + url.search + url.hash;
  } catch {
    return fallback;
  }
}

/** The signed-in user; anonymous page requests go to /login, anonymous /api requests get 401 JSON. */
export async function requireUser(request: Request): Promise<SessionUser> {
  const user = await getUser(request);
  if (user) return user;
  if (isApiRequest(request)) {
    throw Response.json({ error: "Sign in first: this API needs a signed-in session." }, { status: 401 });
  }
  const url = new URL(request.url);
  const params = new URLSearchParams({ redirectTo: url.pathname + url.search });
  throw redirect(`/login?${params}`);
}

/** The signed-in user holding at least one of `roles`; otherwise a 403 naming the role needed. */
export async function requireUserWithRole(request: Request, ...roles: Role[]): Promise<SessionUser> {
  const user = await requireUser(request);
  if (roles.some((role) => user.roles.includes(role))) return user;
  const needed = roles.map((r) => ROLE_LABELS[r]).join(" or ");
  const message = `This needs the ${needed} role. Ask your organisation's admin if you should have it.`;
  if (isApiRequest(request)) throw Response.json({ error: message }, { status: 403 });
  throw data({ message, roles }, { status: 403 });
}

export async function createUserSession(request: Request, userId: number, redirectTo: string) {
  const session = await sessionStorage.getSession(request.headers.get("Cookie"));
  session.unset("userId");
  session.set("userId", userId);
  return redirect(redirectTo, { status: 303, headers: { "Set-Cookie": await sessionStorage.commitSession(session) } });
}

export async function destroyUserSession(request: Request, redirectTo = "/login") {
  const session = await sessionStorage.getSession(request.headers.get("Cookie"));
  return redirect(redirectTo, { status: 303, headers: { "Set-Cookie": await sessionStorage.destroySession(session) } });
}

/** Sets a one-time notice shown on the next page, returning the Set-Cookie header value. */
export async function flashNotice(request: Request, message: string) {
  const session = await sessionStorage.getSession(request.headers.get("Cookie"));
  session.flash("flash", message);
  return sessionStorage.commitSession(session);
}

/** Reads (and so clears) the one-time notice. */
export async function readFlash(request: Request) {
  const session = await requestSession(request);
  const message = session.get("flash") ?? null;
  return { message, setCookie: message ? await sessionStorage.commitSession(session) : null };
}
