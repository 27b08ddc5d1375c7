import { useEffect, useId, useRef, useState } from "react";
import { GEAR_ROLE_LABELS, type GearPick, type GearRole } from "~/plan-rigging";

function dueNote(pick: GearPick, today = new Date().toISOString().slice(0, 10)) {
  if (pick.status === "quarantined") return { text: "quarantined", bad: true };
  if (pick.status === "withdrawn") return { text: "withdrawn", bad: true };
  if (!pick.nextDueOn) return { text: "never examined", bad: true };
  if (pick.nextDueOn < today) return { text: `examination overdue since ${pick.nextDueOn}`, bad: true };
  return { text: `examined, next due ${pick.nextDueOn}`, bad: false };
}

/** Why an item does or does not fit a position, in words. */
export function fitNotes(pick: GearPick, thread: string | null, loadKg: number | null) {
  const notes: Array<{ text: string; bad: boolean }> = [];
  if (pick.role === "eyebolt" && thread) {
    const matches = (pick.thread ?? "").toUpperCase() === thread.toUpperCase();
    notes.push({ text: matches ? `thread ${thread} matches` : `thread ${pick.thread ?? "?"} ≠ hole ${thread}`, bad: !matches });
  }
  if (loadKg !== null) {
    const enough = pick.wllKg >= loadKg;
    notes.push({ text: enough ? "WLL covers the load" : `WLL below the ${Math.ceil(loadKg).toLocaleString("en-GB")} kg load`, bad: !enough });
  }
  notes.push(dueNote(pick));
  return notes;
}

/** A searchable picker over GET /api/gear for one position of the rigging. */
export function GearPicker({
  role,
  label,
  selected,
  thread,
  loadKg,
  disabled,
  onPick,
}: {
  role: GearRole;
  label: string;
  selected: GearPick | null;
  thread: string | null;
  loadKg: number | null;
  disabled?: boolean;
  onPick: (pick: GearPick | null) => void;
}) {
  const [open, setOpen] = useState(false);
  const [query, setQuery] = useState("");
  const [items, setItems] = useState<GearPick[] | null>(null);
  const [error, setError] = useState<string | null>(null);
  const listId = useId();
  const rootRef = useRef<HTMLDivElement>(null);

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

  const selectedNotes = selected ? fitNotes(selected, thread, loadKg).filter((n) => n.bad) : [];

  return (
    <div ref={rootRef} className="relative">
      <button
        type="button"
        className="w-full rounded border border-rule bg-white px-2 py-1 text-left text-sm disabled:opacity-60"
        aria-label={`Choose the ${label}`}
        aria-expanded={open}
        disabled={disabled}
        onClick={() => setOpen((o) => !o)}
      >
        {selected ? (
          <>
            <span className="font-semibold">{selected.itemCode}</span> <span className="text-ink-soft">{Math.round(selected.wllKg).toLocaleString("en-GB")} kg</span>
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
        <div className="absolute z-20 mt-1 w-80 rounded border border-rule bg-white p-2 shadow-lg">
          <label className="block text-xs text-ink-soft" htmlFor={`${listId}-q`}>
            Search {GEAR_ROLE_LABELS[role].toLowerCase()}s by id, description or thread
          </label>
          <input
            id={`${listId}-q`}
            autoFocus
            className="mt-1 w-full rounded border border-rule px-2 py-1 text-sm"
            value={query}
            onChange={(e) => setQuery(e.target.value)}
            onKeyDown={(e) => {
              if (e.key === "Escape") setOpen(false);
            }}
          />
          {error && <p className="mt-1 text-xs text-fail">{error}</p>}
          <ul className="mt-2 max-h-64 overflow-y-auto text-sm" role="listbox" aria-label={`${GEAR_ROLE_LABELS[role]}s in the register`}>
            {selected && (
              <li>
                <button type="button" className="w-full px-1 py-1 text-left text-fail hover:bg-paper" onClick={() => (onPick(null), setOpen(false))}>
                  Remove {selected.itemCode} from this position
                </button>
              </li>
            )}
            {items?.length === 0 && <li className="px-1 py-1 text-ink-soft">Nothing in the register matches.</li>}
            {items?.map((pick) => {
              const notes = fitNotes(pick, thread, loadKg);
              const fits = notes.every((n) => !n.bad);
              return (
                <li key={pick.id} role="option" aria-selected={selected?.id === pick.id}>
                  <button type="button" className="w-full rounded px-1 py-1 text-left hover:bg-paper" onClick={() => (onPick(pick), setOpen(false))}>
                    <span className="font-semibold">{pick.itemCode}</span> {pick.description} · {Math.round(pick.wllKg).toLocaleString("en-GB")} kg
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
