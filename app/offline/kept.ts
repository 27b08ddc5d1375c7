// Plans kept on the phone for a plant room without signal: the lift page (its checklist and record form), its
// data for in-app navigation and the printed plan, stored in the page cache the service worker answers from.
// Browser only.
import { phoneStore, type KeptPlan } from "~/offline/store";

/** The cache the service worker (public/sw.js) stores pages in and answers from without signal. */
export const PAGE_CACHE = "plumbline-pages-v1";

export function keptUrls(planId: number): string[] {
  return [`/plans/${planId}/lift`, `/plans/${planId}/lift.data`, `/plans/${planId}/print.pdf`];
}

/** Stores the plan's pages now (they are fetched afresh) and notes when its gear was last checked current. */
export async function keepPlan(planId: number, title: string, checkedAt: string): Promise<KeptPlan> {
  const urls = keptUrls(planId);
  const cache = await caches.open(PAGE_CACHE);
  for (const url of urls) {
    const response = await fetch(url, { credentials: "same-origin" });
    if (!response.ok) throw new Error(`${url} answered ${response.status}`);
    await cache.put(url, response);
  }
  const kept: KeptPlan = { planId, title, urls, checkedAt, keptAt: new Date().toISOString() };
  await phoneStore.kept.put(kept);
  return kept;
}

/** Notes a fresh check of a plan already kept (the lift page opened with signal). */
export async function noteChecked(planId: number, title: string, checkedAt: string) {
  const kept = await phoneStore.kept.get(planId);
  if (kept && kept.checkedAt < checkedAt) await phoneStore.kept.update(planId, { title, checkedAt });
}

export async function forgetPlan(planId: number) {
  const kept = await phoneStore.kept.get(planId);
  const cache = await caches.open(PAGE_CACHE);
  for (const url of kept?.urls ?? keptUrls(planId)) await cache.delete(url, { ignoreSearch: true });
  await phoneStore.kept.delete(planId);
}
