// The phone's own store (IndexedDB through Dexie): what the rigger is typing, work waiting to be sent, and the
// plans kept for use without signal. Browser only: import it from effects and event handlers, never on the server.
import { Dexie, type EntityTable } from "dexie";

/** A form as typed so far: its text fields and ticks as name/value pairs, and its photos. */
export type Draft = {
  key: string;
  fields: Array<[string, string]>;
  photos: File[];
  updatedAt: string;
};

export type OutboxState = "waiting" | "sent" | "refused" | "invalid";

/** A piece of work saved on the phone, sent to /api/sync in the order it was made. */
export type OutboxEntry = {
  seq?: number;
  clientId: string;
  kind: "lift" | "defect";
  planId: number | null;
  itemId: number | null;
  /** What the rigger sees in the list, e.g. "Lift record: Lift the pump". */
  label: string;
  madeAt: string;
  fields: Array<[string, string]>;
  photos: File[];
  state: OutboxState;
  attempts: number;
  lastTriedAt: string | null;
  /** The server's answer once it gave one. */
  answer: {
    message: string;
    field?: string | null;
    receivedAt?: string;
    changes?: Array<{ itemCode: string; kind: string; message: string }>;
  } | null;
};

/** A plan kept on the phone: the pages stored for it and when its gear was last checked current. */
export type KeptPlan = {
  planId: number;
  title: string;
  urls: string[];
  checkedAt: string;
  keptAt: string;
};

export const phoneStore = new Dexie("plumbline") as Dexie & {
  drafts: EntityTable<Draft, "key">;
  outbox: EntityTable<OutboxEntry, "seq">;
  kept: EntityTable<KeptPlan, "planId">;
};

phoneStore.version(1).stores({
  drafts: "key",
  outbox: "++seq, &clientId, state",
  kept: "planId",
});
