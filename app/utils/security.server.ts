import crypto from "node:crypto";
import net from "node:net";
import { createContext, type MiddlewareFunction } from "react-router";
import { env } from "~/utils/env.server";
import { SHARED_ADDRESS_KEY } from "~/models/sign-in-attempt.server";

/** The nonce of this request's inline scripts; set by `securityMiddleware`, read by entry.server.tsx. */
export const cspNonceContext = createContext<string>("");

const SAFE_METHODS = new Set(["GET", "HEAD"]);

const CROSS_SITE_MESSAGE =
  "Plumbline refused this request because it did not come from one of its own pages. If you sent a form, reload the page and send it again.";

/** The Content-Security-Policy of every response that does not set its own; `nonce` admits React Router's inline scripts. */
export function contentSecurityPolicy(nonce: string) {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}'`,
    // Tailwind's stylesheet is a file, but React `style` attributes and Konva's canvas wrappers are inline.
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    "connect-src 'self'",
    // The service worker (/sw.js) and the web app manifest, both from the app's own origin.
    "worker-src 'self'",
    "manifest-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

/**
 * The headers every response carries (Content-Security-Policy only where the response has none of its own).
 * Nothing is stored by browsers or proxies: pages show one organisation's data to one signed-in user and carry a
 * per-response nonce, API answers likewise.
 */
export function securityHeaders(nonce: string, isProduction = env.isProduction): Record<string, string> {
  return {
    "Content-Security-Policy": contentSecurityPolicy(nonce),
    "Cache-Control": "no-store",
    "X-Content-Type-Options": "nosniff",
    "Referrer-Policy": "same-origin",
    "X-Frame-Options": "DENY",
    "Permissions-Policy": "camera=(), microphone=(), geolocation=()",
    "Cross-Origin-Opener-Policy": "same-origin",
    // Only where Plumbline is served over https for real; the demo and development run on plain http.
    ...(isProduction ? { "Strict-Transport-Security": "max-age=31536000" } : {}),
  };
}

/** A fresh nonce for one response's inline scripts. */
export function newCspNonce() {
  return crypto.randomBytes(16).toString("base64");
}

/** Sets the security headers on `headers`, keeping a Content-Security-Policy or a no-store Cache-Control already there. */
export function setSecurityHeaders(headers: Headers, nonce: string) {
  for (const [name, value] of Object.entries(securityHeaders(nonce))) {
    if (name === "Content-Security-Policy" && headers.has(name)) continue;
    if (name === "Cache-Control" && /\bno-store\b/.test(headers.get(name) ?? "")) continue;
    headers.set(name, value);
  }
}

/** Methods every page takes; the JSON API's routes each answer other methods themselves (405 with their Allow). */
const PAGE_METHODS = ["GET", "HEAD", "POST"];

/**
 * The 405 answer to a method no page takes (PUT, DELETE, OPTIONS, PROPFIND...), before any action runs: React
 * Router would otherwise hand any method but GET to a form's action as if it were a POST.
 */
export function methodRefusal(request: Request): Response | null {
  const method = request.method.toUpperCase();
  if (PAGE_METHODS.includes(method) || new URL(request.url).pathname.startsWith("/api/")) return null;
  return new Response(
    `Plumbline's pages do not take ${method.slice(0, 20)} requests; use ${PAGE_METHODS.join(", ")}.`,
    {
      status: 405,
      headers: { Allow: PAGE_METHODS.join(", "), "Content-Type": "text/plain; charset=utf-8" },
    },
  );
}

/**
 * The Allow header of a 405 that React Router answered itself: a POST refused (which React Router renders as a GET)
 * is a route without an action, GET and HEAD only; any other method is one React Router refuses before the
 * middleware runs (OPTIONS, PROPFIND...).
 */
export function allowFor405(request: Request) {
  return ["GET", "HEAD", "POST"].includes(request.method.toUpperCase()) ? "GET, HEAD" : PAGE_METHODS.join(", ");
}

function withAllow(response: Response, request: Request) {
  if (response.status !== 405 || response.headers.has("Allow")) return response;
  // An API route without an action: React Router's own 405 says only "Unexpected Server Error".
  if (new URL(request.url).pathname.startsWith("/api/"))
    return Response.json(
      { error: `This address answers GET only, not ${request.method.toUpperCase().slice(0, 20)}.` },
      { status: 405, headers: { Allow: "GET, HEAD" } },
    );
  response.headers.set("Allow", allowFor405(request));
  return response;
}

function withSecurityHeaders(response: Response, nonce: string, request: Request): Response {
  let answer: Response;
  try {
    answer = withAllow(response, request);
    setSecurityHeaders(answer.headers, nonce);
  } catch {
    // A Response whose headers are immutable (one passed on from fetch): answer with a copy.
    answer = withAllow(new Response(response.body, response), request);
    setSecurityHeaders(answer.headers, nonce);
  }
  return answer;
}

function originOf(value: string): string | null {
  if (value === "null") return null;
  try {
    return new URL(value).origin;
  } catch {
    return null;
  }
}

/**
 * The one origin Plumbline's pages are served from: PUBLIC_URL's (or the listening address's). The request's URL
 * is built from its Host header, which the client writes, so it decides only in development without PUBLIC_URL.
 */
export function appOrigin(request?: Request): string {
  if (request && env.appEnv === "development" && !env.publicUrlIsSet) return new URL(request.url).origin;
  return env.publicUrl;
}

/**
 * Whether a request is a mutation from somewhere other than Plumbline's own pages. GET and HEAD never are.
 * Otherwise the Origin header (or, when a browser sent none, the Referer) must name Plumbline's origin; a request
 * with neither passes only if it carries no cookie, so nobody's session can be ridden. Browsers send Origin on
 * every POST, so a real page never meets this.
 */
export function isCrossSiteMutation(request: Request, ownOrigin: string = appOrigin(request)): boolean {
  if (SAFE_METHODS.has(request.method.toUpperCase())) return false;
  const source = request.headers.get("Origin") ?? request.headers.get("Referer");
  if (source === null) return request.headers.has("Cookie");
  const origin = originOf(source.trim());
  return origin === null || !(origin === ownOrigin || isLoopbackAlias(origin, ownOrigin));
}

const LOOPBACK_NAMES = new Set(["localhost", "127.0.0.1", "[::1]"]);

/**
 * Outside production proper, when Plumbline's own origin is a loopback address (the demo, a developer's machine),
 * the other names of the same loopback address and port are the same place: http://127.0.0.1:3000 and
 * http://localhost:3000 are one server that nobody else can reach. Fixed names, never the Host header.
 */
function isLoopbackAlias(origin: string, ownOrigin: string): boolean {
  if (env.isProduction) return false;
  const a = new URL(origin);
  const b = new URL(ownOrigin);
  return (
    a.protocol === b.protocol && a.port === b.port && LOOPBACK_NAMES.has(a.hostname) && LOOPBACK_NAMES.has(b.hostname)
  );
}

/** The 403 answer to a cross-site mutation: JSON under /api, a plain sentence elsewhere. */
export function crossSiteRefusal(request: Request): Response {
  if (new URL(request.url).pathname.startsWith("/api/"))
    return Response.json({ error: CROSS_SITE_MESSAGE }, { status: 403 });
  return new Response(CROSS_SITE_MESSAGE, { status: 403, headers: { "Content-Type": "text/plain; charset=utf-8" } });
}

/**
 * Runs first on every request React Router serves (pages, data requests, resource routes): refuses methods no page
 * takes and cross-site mutations before any loader or action, picks the request's CSP nonce and puts the security
 * headers on the answer.
 */
export const securityMiddleware: MiddlewareFunction<Response> = async ({ request, context }, next) => {
  const nonce = newCspNonce();
  context.set(cspNonceContext, nonce);
  const response = methodRefusal(request) ?? (isCrossSiteMutation(request) ? crossSiteRefusal(request) : await next());
  return withSecurityHeaders(response, nonce, request);
};

/** The eight 16-bit groups of an IPv6 address that `net.isIPv6` has accepted, or null. */
function ipv6Groups(address: string): number[] | null {
  let text = address;
  const tail: number[] = [];
  const dotted = text.match(/^(.*:)(\d+\.\d+\.\d+\.\d+)$/);
  if (dotted) {
    const octets = dotted[2]!.split(".").map(Number);
    tail.push((octets[0]! << 8) | octets[1]!, (octets[2]! << 8) | octets[3]!);
    text = dotted[1]!.endsWith("::") ? dotted[1]! : dotted[1]!.slice(0, -1);
  }
  const [head, rest] = text.split("::") as [string, string | undefined];
  const parse = (part: string) => (part === "" ? [] : part.split(":").map((g) => parseInt(g, 16)));
  const left = parse(head);
  const right = [...(rest === undefined ? [] : parse(rest)), ...tail];
  const missing = 8 - left.length - right.length;
  if (rest === undefined ? missing !== 0 : missing < 0) return null;
  return [...left, ...new Array<number>(rest === undefined ? 0 : missing).fill(0), ...right];
}

/** The key one client address counts under: an IPv4 address as is, an IPv6 address by its /64 (one site's network). */
export function addressKeyOf(raw: string): string | null {
  let address = raw.trim();
  if (address.startsWith("[")) address = address.slice(1, address.indexOf("]") > 0 ? address.indexOf("]") : undefined);
  address = address.replace(/%.*$/, "");
  const withPort = address.match(/^(\d+\.\d+\.\d+\.\d+):\d+$/);
  if (withPort) address = withPort[1]!;
  const mapped = address.match(/^::ffff:(\d+\.\d+\.\d+\.\d+)$/i);
  if (mapped) address = mapped[1]!;
  if (net.isIPv4(address)) return address;
  if (!net.isIPv6(address)) return null;
  const groups = ipv6Groups(address.toLowerCase());
  return groups
    ? `${groups
        .slice(0, 4)
        .map((g) => g.toString(16))
        .join(":")}::/64`
    : null;
}

/**
 * The client's address as our own proxy saw it, or null when it is not known. Loaders are not given the socket's
 * address, so it comes from X-Forwarded-For, and only when TRUST_PROXY says how many proxies in front append to
 * it: the entry that many places from the right is the one our own proxy wrote (entries to its left are the
 * client's say-so).
 */
export function clientAddress(request: Request, trustedProxyHops = env.trustedProxyHops): string | null {
  if (trustedProxyHops <= 0) return null;
  const hops = (request.headers.get("X-Forwarded-For") ?? "")
    .split(",")
    .map((h) => h.trim())
    .filter(Boolean);
  const entry = hops[hops.length - trustedProxyHops];
  return entry && addressKeyOf(entry) ? entry.slice(0, 64) : null;
}

/**
 * The client's address key for attempt limits (an IPv4 address, an IPv6 /64), or "direct" when the address cannot
 * be trusted (no TRUST_PROXY, or an unusable header): then every client looks the same and no limit may be keyed
 * on it alone.
 */
export function clientAddressKey(request: Request, trustedProxyHops = env.trustedProxyHops): string {
  const address = clientAddress(request, trustedProxyHops);
  return (address && addressKeyOf(address)) ?? SHARED_ADDRESS_KEY;
}
