// Reads shared by the loaders of one page. React Router runs a page's root loader and its route's loader each with
// a Request object of its own, so a cache keyed by the Request shares nothing between them. The root middleware
// opens one scope per GET or HEAD instead, and a read asked twice within it (the session user, the organisation's
// settings) is made once. A POST gets no scope: its action may change what the loaders then read.
import { AsyncLocalStorage } from "node:async_hooks";
import type { MiddlewareFunction } from "react-router";

const pageScope = new AsyncLocalStorage<Map<string, Promise<unknown>>>();

export const pageReadsMiddleware: MiddlewareFunction<Response> = ({ request }, next) =>
  request.method === "GET" || request.method === "HEAD" ? pageScope.run(new Map(), next) : next();

/** `read()` once per page request under `key` (every call outside a page's scope reads afresh). */
export function oncePerPage<T>(key: string, read: () => Promise<T>): Promise<T> {
  const scope = pageScope.getStore();
  if (!scope) return read();
  let found = scope.get(key) as Promise<T> | undefined;
  if (!found) {
    found = read();
    scope.set(key, found);
  }
  return found;
}

/** Gives the page's later `oncePerPage(key, …)` calls `value`, read together with something else. */
export function knownForPage<T>(key: string, value: T): void {
  const scope = pageScope.getStore();
  if (scope && !scope.has(key)) scope.set(key, Promise.resolve(value));
}
