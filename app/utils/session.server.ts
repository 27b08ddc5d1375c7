import { createCookieSessionStorage, data, redirect } from "react-router";
import { env } from "~/utils/env.server";
import { knownForPage, oncePerPage } from "~/utils/page-reads.server";
import { organisationSettingsKey } from "~/models/organisation.server";
import type { SessionUser } from "~/models/user.server";
import {
  endSessionByToken,
  findSession,
  startSession,
  touchSession,
  type SessionLifetimes,
} from "~/models/session.server";
import { ROLE_LABELS, type Role } from "~/utils/roles";
import { clientAddress } from "~/utils/security.server";
import { withoutControlCharacters } from "~/utils/forms";
import { isReturnPath } from "~/utils/return-paths";

/**
 * The session cookie holds a random session token (the server keeps only its hash, with the user) and a one-time
 * notice. SESSION_SECRET may list several (newest first) to rotate. Outside development over plain http the name
 * carries the __Host- prefix, which browsers accept only Secure, for this host and path /.
 */
export const sessionStorage = createCookieSessionStorage<{ sessionToken: string }, { flash: string }>({
  cookie: {
    name: env.isProduction ? "__Host-plumbline_session" : "__plumbline_session",
    httpOnly: true,
    sameSite: "lax",
    path: "/",
    secure: env.isProduction,
    secrets: env.sessionSecrets,
    maxAge: Math.floor(env.sessionMaxMs / 1000),
  },
});

/** The idle and absolute session lifetimes from the environment. */
export function sessionLifetimes(): SessionLifetimes {
  return { idleMs: env.sessionIdleMs, absoluteMs: env.sessionMaxMs };
}

function isApiRequest(request: Request) {
  return new URL(request.url).pathname.startsWith("/api/");
}

type SignedIn = { user: SessionUser; sessionId: number };

// Code that asks for the user several times with one Request gets the first answer; the loaders of one page share
// it through the page's scope (page-reads.server.ts).
const signedInByRequest = new WeakMap<Request, Promise<SignedIn | null>>();

function signedIn(request: Request): Promise<SignedIn | null> {
  let found = signedInByRequest.get(request);
  if (!found) {
    found = oncePerPage("signed-in", () => lookUpSession(request));
    signedInByRequest.set(request, found);
  }
  return found;
}

/** The signed-in, active user, or null (looked up once per request). */
export async function getUser(request: Request): Promise<SessionUser | null> {
  return (await signedIn(request))?.user ?? null;
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

async function lookUpSession(request: Request): Promise<SignedIn | null> {
  const session = await requestSession(request);
  const token = session.get("sessionToken");
  if (typeof token !== "string" || token.length === 0) return null;
  const found = await findSession(token, sessionLifetimes());
  if (!found) return null;
  await touchSession(found);
  knownForPage(organisationSettingsKey(found.organisation.id), found.organisation);
  return { user: found.user, sessionId: found.sessionId };
}

/**
 * Where to go after signing in: `value` resolved by the URL parser against Plumbline's own origin, accepted only when
 * it stays on that origin and names one of Plumbline's pages; anything else gives `fallback` (the dashboard). The
 * answer is the parsed path, never the raw text, so "/a/..//evil.example" (parsed to "//evil.example", which a
 * browser reads as another host) and "/\\evil.example" cannot leave the site.
 */
export function safeRedirectPath(value: unknown, fallback = "/"): string {
  if (typeof value !== "string" || value.length > 2000) return fallback;
  const origin = env.publicUrl;
  let url: URL;
  try {
    url = new URL(value, origin);
  } catch {
    return fallback;
  }
  if (url.origin !== origin || url.username || url.password) return fallback;
  if (!url.pathname.startsWith("/") || url.pathname.startsWith("//") || !isReturnPath(url.pathname)) return fallback;
  return url.pathname + url.search + url.hash;
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

/** The signed-in user and the id of this request's session; as requireUser otherwise. */
export async function requireUserSession(request: Request): Promise<SignedIn> {
  const user = await requireUser(request);
  const found = await signedIn(request);
  return { user, sessionId: found!.sessionId };
}

/** What a session row records of the browser: the client address where it can be trusted, and the user agent. */
function browserOf(request: Request) {
  const agent = request.headers.get("User-Agent");
  return { address: clientAddress(request), userAgent: agent ? withoutControlCharacters(agent).slice(0, 200) : null };
}

/**
 * Starts a new server-side session for `userId` and returns the Set-Cookie value carrying its token. The session
 * the request came with, if any, is ended first: a sign-in never reuses a token (no session fixation).
 */
export async function newSessionCookie(request: Request, userId: number, notice?: string) {
  const session = await sessionStorage.getSession(request.headers.get("Cookie"));
  const previous = session.get("sessionToken");
  if (typeof previous === "string" && previous) await endSessionByToken(previous);
  const token = await startSession({ userId, ...browserOf(request) }, sessionLifetimes());
  session.set("sessionToken", token);
  if (notice) session.flash("flash", notice);
  return sessionStorage.commitSession(session);
}

/** Signs out: ends this browser's session on the server and clears the cookie. */
export async function destroyUserSession(request: Request, redirectTo = "/login") {
  const session = await sessionStorage.getSession(request.headers.get("Cookie"));
  const token = session.get("sessionToken");
  if (typeof token === "string" && token) await endSessionByToken(token);
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
