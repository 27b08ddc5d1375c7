// Work saved on the phone and sent when there is signal: oldest first, one at a time, each with the id the
// phone gave it so the server records it once however often it is sent (an answer lost on the way back means
// the phone sends it again). Browser only.
import { liveQuery } from "dexie";
import { reportReach } from "~/offline/connection";
import { phoneStore, type OutboxEntry } from "~/offline/store";

/** A random id for a piece of work (crypto.randomUUID needs a secure context, which the app always has). */
export function newClientId(): string {
  if (typeof crypto.randomUUID === "function") return crypto.randomUUID();
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  return [...bytes].map((b) => b.toString(16).padStart(2, "0")).join("");
}

/** Saves a piece of work on the phone (it is safe from here on) and tries to send what is waiting. */
export async function queueWork(
  work: Omit<OutboxEntry, "seq" | "state" | "attempts" | "lastTriedAt" | "answer" | "clientId" | "madeAt">,
): Promise<OutboxEntry> {
  const entry: OutboxEntry = {
    ...work,
    clientId: newClientId(),
    madeAt: new Date().toISOString(),
    state: "waiting",
    attempts: 0,
    lastTriedAt: null,
    answer: null,
  };
  entry.seq = await phoneStore.outbox.add(entry);
  return entry;
}

type Answer = {
  outcome: "recorded" | "refused" | "invalid" | "busy";
  message: string;
  field?: string | null;
  receivedAt?: string;
  changes?: Array<{ itemCode: string; kind: string; message: string }>;
};

let running: Promise<void> | null = null;

/**
 * Sends every waiting piece of work, oldest first. Stops at the first piece the network or the session could
 * not carry (it is tried again later, still first in line); a piece the server answered is settled for good.
 */
export function sendWaitingWork(): Promise<void> {
  running ??= sendInOrder().finally(() => {
    running = null;
  });
  return running;
}

async function sendInOrder() {
  // Two tabs of the app must not send the same piece at once; the server would record it once anyway.
  const locks = typeof navigator !== "undefined" ? navigator.locks : undefined;
  if (locks) await locks.request("plumbline-outbox", () => sendAll());
  else await sendAll();
}

async function sendAll() {
  const waiting = await phoneStore.outbox.where("state").equals("waiting").sortBy("seq");
  for (const entry of waiting) {
    if (!(await sendOne(entry))) return;
  }
}

async function sendOne(entry: OutboxEntry): Promise<boolean> {
  const body = new FormData();
  body.set("clientId", entry.clientId);
  body.set("kind", entry.kind);
  body.set("madeAt", entry.madeAt);
  if (entry.planId !== null) body.set("planId", String(entry.planId));
  if (entry.itemId !== null) body.set("itemId", String(entry.itemId));
  for (const [name, value] of entry.fields) body.append(name, value);
  for (const photo of entry.photos) body.append("photos", photo, photo.name);
  const tried = { attempts: entry.attempts + 1, lastTriedAt: new Date().toISOString() };
  let response: Response;
  try {
    response = await fetch("/api/sync", { method: "POST", body, credentials: "same-origin" });
  } catch {
    reportReach(false);
    await phoneStore.outbox.update(entry.seq!, tried);
    return false;
  }
  reportReach(true);
  const answer = (await response.json().catch(() => null)) as Answer | null;
  // Signed out, the server busy with this very piece, or an answer that was not ours (a proxy's page): later.
  if (!answer || response.status === 401 || answer.outcome === "busy" || response.status >= 500) {
    await phoneStore.outbox.update(entry.seq!, {
      ...tried,
      answer: response.status === 401 ? { message: "Sign in again to send this." } : entry.answer,
    });
    return false;
  }
  const state = answer.outcome === "recorded" ? "sent" : answer.outcome === "refused" ? "refused" : "invalid";
  await phoneStore.outbox.update(entry.seq!, {
    ...tried,
    state,
    answer: { message: answer.message, field: answer.field, receivedAt: answer.receivedAt, changes: answer.changes },
  });
  return true;
}

// The list the rigger sees, kept current from the store for useSyncExternalStore.
let list: OutboxEntry[] = [];
const EMPTY: OutboxEntry[] = [];
const listeners = new Set<() => void>();
let subscription: { unsubscribe: () => void } | null = null;

export function subscribeOutbox(listener: () => void) {
  listeners.add(listener);
  subscription ??= liveQuery(() => phoneStore.outbox.orderBy("seq").toArray()).subscribe({
    next: (rows) => {
      list = rows;
      for (const l of listeners) l();
    },
  });
  return () => {
    listeners.delete(listener);
  };
}

export const outboxSnapshot = () => list;
export const outboxServerSnapshot = () => EMPTY;

/** Starts sending when signal returns, when the app opens, and every 30 s while work is waiting. */
export function startSending() {
  if (typeof window === "undefined") return;
  void sendWaitingWork();
  window.addEventListener("online", () => void sendWaitingWork());
  window.setInterval(() => {
    void phoneStore.outbox
      .where("state")
      .equals("waiting")
      .count()
      .then((n) => (n ? sendWaitingWork() : undefined));
  }, 30_000);
}
