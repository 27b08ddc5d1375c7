import { useEffect, useId, useRef, useState } from "react";
import { nextListIndex } from "~/plans/editor-state";
import { GEAR_ROLE_LABELS, type GearPick, type GearRole } from "~/plans/rigging";
import type { CheckResult } from "~/statics/check-types";
import { formatCapacity, formatLoad, type Units } from "~/utils/format";

function dueNote(pick: GearPick, today = new Date().toISOString().slice(0, 10)) {
  if (pick.status === "quarantined") return { text: "quarantined", bad: true };
  if (pick.status === "withdrawn") return { text: "withdrawn", bad: true };
  if (!pick.nextDueOn) return { text: "never examined", bad: true };
  if (pick.nextDueOn < today) return { text: `examination overdue since ${pick.nextDueOn}`, bad: true };
  return { text: `examined, next due ${pick.nextDueOn}`, bad: false };
}

/**
 * Why an item does or does not fit a position, in words. With `judged` (the plan's own check of the item in
 * this position, see plans/pick-fit.ts) the load note is that check's: its derated capacity against the design
 * load with contingency, so the picker and the plan's checks agree. Without it, the marked WLL against `loadKg`.
 */
export function fitNotes(
  pick: GearPick,
  thread: string | null,
  loadKg: number | null,
  units: Units = "metric",
  judged?: CheckResult | null,
) {
  const notes: Array<{ text: string; bad: boolean }> = [];
  if (pick.role === "eyebolt" && thread) {
    const matches = (pick.thread ?? "").toUpperCase() === thread.toUpperCase();
    notes.push({
      text: matches ? `thread ${thread} matches` : `thread ${pick.thread ?? "?"} ≠ hole ${thread}`,
      bad: !matches,
    });
  }
  if (judged !== undefined) {
    if (judged && judged.loadKg !== null && judged.capacityKg !== null) {
      const enough = judged.verdict !== "fail";
      const here = judged.kind === "eyebolt" || judged.kind === "shackle" ? " at this angle" : "";
      notes.push({
        text: enough
          ? `${formatCapacity(judged.capacityKg, units)}${here} covers the ${formatLoad(judged.loadKg, units)} design load`
          : `only ${formatCapacity(judged.capacityKg, units)}${here}, below the ${formatLoad(judged.loadKg, units)} design load`,
        bad: !enough,
      });
    }
  } else if (loadKg !== null) {
    const enough = pick.wllKg >= loadKg;
    notes.push({
      text: enough ? "WLL covers the load" : `WLL below the ${formatLoad(loadKg, units)} load`,
      bad: !enough,
    });
  }
  notes.push(dueNote(pick));
  return notes;
}

/**
 * A searchable picker over GET /api/gear for one position of the rigging. Keyboard: Enter or Space on the
 * button opens it with the search box focused; ↓ and ↑ move through the results, Enter picks one, Escape
 * closes it; focus goes back to the button either way, and tabbing out of it closes it.
 */
export function GearPicker({
  role,
  label,
  selected,
  thread,
  loadKg,
  disabled,
  onPick,
  units = "metric",
  judge,
}: {
  role: GearRole;
  /** What the position is, e.g. "Eyebolt for leg A"; read out before the chosen item. */
  label: string;
  selected: GearPick | null;
  thread: string | null;
  loadKg: number | null;
  disabled?: boolean;
  onPick: (pick: GearPick | null) => void;
  units?: Units;
  /** The plan's own check of an item in this position, so the fit note says what the check will say. */
  judge?: (pick: GearPick) => CheckResult | null;
}) {
  const [open, setOpen] = useState(false);
  const [query, setQuery] = useState("");
  const [items, setItems] = useState<GearPick[] | null>(null);
  const [error, setError] = useState<string | null>(null);
  const popupId = useId();
  const rootRef = useRef<HTMLDivElement>(null);
  const triggerRef = useRef<HTMLButtonElement>(null);
  const searchRef = useRef<HTMLInputElement>(null);
  const resultsRef = useRef<HTMLUListElement>(null);

  useEffect(() => {
    if (!open) return;
    const controller = new AbortController();
    const timer = setTimeout(async () => {
      try {
        const params = new URLSearchParams({ role, query });
        const res = await fetch(`/api/gear?${params}`, { signal: controller.signal });
        const json = (await res.json()) as { items?: GearPick[]; error?: string };
        if (!res.ok) setError(json.error ?? "The register could not be searched.");
        else {
          setItems(json.items ?? []);
          setError(null);
        }
      } catch {
        if (!controller.signal.aborted) setError("The register could not be searched.");
      }
    }, 150);
    return () => {
      clearTimeout(timer);
      controller.abort();
    };
  }, [open, query, role]);

  useEffect(() => {
    if (!open) return;
    const close = (e: MouseEvent) => {
      if (rootRef.current && !rootRef.current.contains(e.target as Node)) setOpen(false);
    };
    document.addEventListener("mousedown", close);
    return () => document.removeEventListener("mousedown", close);
  }, [open]);

  function closeAndReturnFocus() {
    setOpen(false);
    triggerRef.current?.focus();
  }

  function choose(pick: GearPick | null) {
    onPick(pick);
    closeAndReturnFocus();
  }

  // Arrow keys walk from the search box through the result buttons and back up to the search box.
  function onPopupKeyDown(e: React.KeyboardEvent) {
    if (e.key === "Escape") {
      e.preventDefault();
      closeAndReturnFocus();
      return;
    }
    const buttons = [...(resultsRef.current?.querySelectorAll<HTMLButtonElement>("button") ?? [])];
    const current = buttons.indexOf(document.activeElement as HTMLButtonElement);
    const next = nextListIndex(e.key, current === -1 ? null : current, buttons.length);
    if (next === undefined) return;
    e.preventDefault();
    if (next === null) searchRef.current?.focus();
    else buttons[next]?.focus();
  }

  const selectedNotes = selected
    ? fitNotes(selected, thread, loadKg, units, judge?.(selected)).filter((n) => n.bad)
    : [];
  const plural = `${GEAR_ROLE_LABELS[role].toLowerCase()}s`;

  return (
    <div
      ref={rootRef}
      className="relative"
      onBlur={(e) => {
        // Tabbing out closes the picker; a click on its own background moves focus nowhere and keeps it open.
        if (open && e.relatedTarget && !rootRef.current?.contains(e.relatedTarget as Node)) setOpen(false);
      }}
    >
      <button
        ref={triggerRef}
        type="button"
        className="w-full rounded border border-rule bg-white px-2 py-1 text-left text-sm disabled:opacity-60"
        aria-expanded={open}
        aria-controls={open ? popupId : undefined}
        disabled={disabled}
        onClick={() => setOpen((o) => !o)}
      >
        <span className="sr-only">{label}: </span>
        {selected ? (
          <>
            <span className="font-semibold">{selected.itemCode}</span>{" "}
            <span className="text-ink-soft">{formatCapacity(selected.wllKg, units)}</span>
          </>
        ) : (
          <span className="text-ink-soft">none · choose…</span>
        )}
      </button>
      {selectedNotes.map((n) => (
        <span key={n.text} className="block text-xs text-fail">
          ✗ {n.text}
        </span>
      ))}
      {open && (
        // In the page's flow rather than floating: the gear table scrolls sideways on narrow screens, and its scrolling box would clip a floating panel.
        <div id={popupId} className="mt-1 w-80 rounded border border-rule bg-white p-2" onKeyDown={onPopupKeyDown}>
          <label className="block text-xs text-ink-soft" htmlFor={`${popupId}-q`}>
            Search {plural} by id, description or thread
          </label>
          <input
            ref={searchRef}
            id={`${popupId}-q`}
            autoFocus
            className="mt-1 w-full rounded border border-rule px-2 py-1 text-sm"
            value={query}
            onChange={(e) => setQuery(e.target.value)}
          />
          {error && <p className="mt-1 text-xs text-fail">{error}</p>}
          <p className="sr-only" role="status">
            {items === null
              ? "Searching the register…"
              : `${items.length} ${items.length === 1 ? "item" : "items"} found; arrow down to the list.`}
          </p>
          <ul
            ref={resultsRef}
            className="mt-2 max-h-64 overflow-y-auto text-sm"
            aria-label={`${GEAR_ROLE_LABELS[role]}s in the register`}
          >
            {selected && (
              <li>
                <button
                  type="button"
                  className="w-full px-1 py-1 text-left text-fail hover:bg-paper focus-visible:-outline-offset-2"
                  onClick={() => choose(null)}
                >
                  Remove {selected.itemCode} from this position
                </button>
              </li>
            )}
            {items?.length === 0 && <li className="px-1 py-1 text-ink-soft">Nothing in the register matches.</li>}
            {items?.map((pick) => {
              const notes = fitNotes(pick, thread, loadKg, units, judge?.(pick));
              const fits = notes.every((n) => !n.bad);
              const chosen = selected?.id === pick.id;
              return (
                <li key={pick.id}>
                  <button
                    type="button"
                    className={`w-full rounded px-1 py-1 text-left hover:bg-paper focus-visible:-outline-offset-2 ${chosen ? "bg-steel-soft" : ""}`}
                    aria-current={chosen ? "true" : undefined}
                    onClick={() => choose(pick)}
                  >
                    <span className="font-semibold">{pick.itemCode}</span> {pick.description} ·{" "}
                    {formatCapacity(pick.wllKg, units)}
                    {chosen && <span className="ml-1 text-xs font-semibold">(chosen)</span>}
                    <span className={`block text-xs ${fits ? "text-pass" : "text-fail"}`}>
                      {fits ? "✓ fits" : "✗"} {notes.map((n) => n.text).join(" · ")}
                    </span>
                  </button>
                </li>
              );
            })}
          </ul>
        </div>
      )}
    </div>
  );
}
