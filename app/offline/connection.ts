// Whether the phone has signal, and since when it has not: the browser's online flag, corrected by what the
// last request to the server found. "Offline since" survives reloads (localStorage).
const SINCE_KEY = "plumbline-offline-since";

export type Connection = { online: boolean; offlineSince: string | null };

const SERVER_SNAPSHOT: Connection = { online: true, offlineSince: null };
let snapshot: Connection = SERVER_SNAPSHOT;
let started = false;
const listeners = new Set<() => void>();

function set(online: boolean) {
  let since = localStorage.getItem(SINCE_KEY);
  if (online && since) localStorage.removeItem(SINCE_KEY);
  if (!online && !since) {
    since = new Date().toISOString();
    localStorage.setItem(SINCE_KEY, since);
  }
  const next = { online, offlineSince: online ? null : since };
  if (next.online === snapshot.online && next.offlineSince === snapshot.offlineSince) return;
  snapshot = next;
  for (const listener of listeners) listener();
}

function start() {
  if (started || typeof window === "undefined") return;
  started = true;
  set(navigator.onLine);
  window.addEventListener("online", () => set(true));
  window.addEventListener("offline", () => set(false));
}

/** For useSyncExternalStore. */
export function subscribeConnection(listener: () => void) {
  start();
  listeners.add(listener);
  return () => listeners.delete(listener);
}

export function connectionSnapshot(): Connection {
  start();
  return snapshot;
}

export function connectionServerSnapshot(): Connection {
  return SERVER_SNAPSHOT;
}

/** What a request just found: a network failure means no signal whatever the browser's flag says. */
export function reportReach(reached: boolean) {
  start();
  set(reached && navigator.onLine);
}
