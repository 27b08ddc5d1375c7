// The plan's history as people read it: the editor autosaves about a second after every change, so
// consecutive saves of one revision by one person, each within half an hour of the last, are one
// editing session, shown once with how many saves it made and what they changed. Pure and shared.

export type HistoryEvent = {
  id: number;
  at: string;
  userId: number | null;
  by: string;
  action: string;
  details: Record<string, unknown>;
};

/** Longest pause between two saves of one editing session. */
export const SESSION_GAP_MS = 30 * 60 * 1000;

/** What each changed part is called in the history. */
const PART_WORDS: Record<string, string> = {
  title: "the title",
  load: "the load's mass, CoG or lift points",
  arrangement: "the arrangement",
  gear: "the gear allocation",
  sequence: "the sequence",
  hazards: "the hazards",
  people: "the people",
  "site details": "the exclusion zone, communication or floor clearance",
};

function changedOf(e: HistoryEvent): string[] {
  return Array.isArray(e.details.changed) ? e.details.changed.filter((c): c is string => typeof c === "string") : [];
}

/** The events with each editing session's saves folded into one entry (the first save's id and time). */
export function collapseEditingSessions(events: readonly HistoryEvent[]): HistoryEvent[] {
  const out: HistoryEvent[] = [];
  let session: { entry: HistoryEvent; last: HistoryEvent; saves: number; changed: Set<string> } | null = null;
  const close = () => {
    if (!session) return;
    const { entry, last, saves, changed } = session;
    const known = Object.keys(PART_WORDS);
    const parts = [...known.filter((k) => changed.has(k)), ...[...changed].filter((c) => !known.includes(c))].map(
      (c) => PART_WORDS[c] ?? c,
    );
    out.push({
      ...entry,
      details: {
        revision: entry.details.revision,
        ...(saves > 1 ? { saves, until: last.at } : {}),
        changed: parts.length ? parts.join(", ") : "nothing (saved as it was)",
        resultStatus: last.details.resultStatus,
      },
    });
    session = null;
  };
  for (const e of events) {
    const continues =
      session !== null &&
      e.action === "saved" &&
      e.userId === session.last.userId &&
      e.details.revision === session.last.details.revision &&
      new Date(e.at).getTime() - new Date(session.last.at).getTime() <= SESSION_GAP_MS;
    if (continues) {
      session!.last = e;
      session!.saves++;
      for (const c of changedOf(e)) session!.changed.add(c);
      continue;
    }
    close();
    if (e.action === "saved") session = { entry: e, last: e, saves: 1, changed: new Set(changedOf(e)) };
    else out.push(e);
  }
  close();
  return out;
}
