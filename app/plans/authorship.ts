// Who counts as the author of a revision: anyone who created, started, saved, pulled a component
// version into, or submitted it. With self-approval off, none of them may approve it. Pure and shared.

export const AUTHOR_ACTS = ["created", "started", "saved", "pulled", "submitted"] as const;
export type AuthorAct = (typeof AUTHOR_ACTS)[number];

export type Authorship = { userId: number; act: AuthorAct; firstAt: Date | string; lastAt: Date | string };

const day = (at: Date | string) =>
  new Date(at).toLocaleDateString("en-GB", { day: "numeric", month: "long", year: "numeric", timeZone: "UTC" });

/** "you saved this revision on 12 May 2025" */
function phrase(a: Authorship): string {
  const on = day(a.lastAt);
  const from = day(a.firstAt);
  const span = from === on ? `on ${on}` : `between ${from} and ${on}`;
  switch (a.act) {
    case "created":
      return `you created this plan ${span}`;
    case "started":
      return `you started this revision ${span}`;
    case "saved":
      return `you saved this revision ${span}`;
    case "pulled":
      return `you pulled a new component version into it ${span}`;
    case "submitted":
      return "you submitted it";
  }
}

/** What `userId` did to the revision, in the order of AUTHOR_ACTS; empty when they are not an author. */
export function actsOf(authors: readonly Authorship[], userId: number): Authorship[] {
  return authors
    .filter((a) => a.userId === userId)
    .sort((a, b) => AUTHOR_ACTS.indexOf(a.act) - AUTHOR_ACTS.indexOf(b.act));
}

/** The sentence refusing an author's approval, naming what made them one; null when they are not an author. */
export function authorRefusal(authors: readonly Authorship[], userId: number): string | null {
  const acts = actsOf(authors, userId);
  if (acts.length === 0) return null;
  const parts = acts.map(phrase);
  const list = parts.length === 1 ? parts[0]! : `${parts.slice(0, -1).join(", ")} and ${parts.at(-1)}`;
  const sentence = list.charAt(0).toUpperCase() + list.slice(1);
  return `${sentence}, so you are an author of this revision: another appointed person must approve it.`;
}
