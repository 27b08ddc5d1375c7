// Small pieces of the plan editor: the plan's editable part, a length field in the user's units and a width watcher.
import { useEffect, useRef, useState } from "react";
import type { EditorPlan } from "~/components/plan-editor";
import type { PlanEdit } from "~/plans/editor-state";
import { fromDisplayLength, inputNumber, toDisplayLength, type Units } from "~/utils/format";

export function toEdit(plan: EditorPlan): PlanEdit {
  return {
    cog: plan.snapshot.cog,
    override: plan.loadOverride,
    liftPoints: plan.snapshot.liftPoints.map((p) => ({
      label: p.label,
      position: p.position,
      axis: p.axis,
      thread: p.thread,
    })),
    arrangement: plan.arrangement,
    rigging: plan.rigging,
  };
}

/** The box of the two views must be this wide (CSS px) to show them side by side; narrower, they stack. */
const TWO_VIEWS_MIN_WIDTH = 900;
const VIEWS_GAP = 16; // Tailwind's gap-4

/**
 * How the elevation and the plan view share a box of the measured width: its grid columns and each canvas's width
 * come from the one measure, so a canvas is never laid out wider than the column that shows it.
 */
export function viewsLayout(width: number) {
  const twoUp = width >= TWO_VIEWS_MIN_WIDTH;
  return {
    style: { gridTemplateColumns: twoUp ? "repeat(2, minmax(0, 1fr))" : "minmax(0, 1fr)" },
    viewWidth: twoUp ? Math.floor((width - VIEWS_GAP) / 2) : width,
  };
}

export function useElementWidth<T extends HTMLElement>() {
  const ref = useRef<T>(null);
  const [width, setWidth] = useState(0);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const observer = new ResizeObserver(([entry]) => setWidth(Math.floor(entry!.contentRect.width)));
    observer.observe(el);
    return () => observer.disconnect();
  }, []);
  return [ref, width] as const;
}

export function NumberInput({
  label,
  valueM,
  units,
  onCommit,
  disabled,
}: {
  label: string;
  valueM: number;
  units: Units;
  onCommit: (valueM: number) => void;
  disabled?: boolean;
}) {
  const shown = inputNumber(toDisplayLength(valueM, units), units === "metric" ? 0 : 2);
  const [text, setText] = useState(shown);
  // A new value from outside (a drag, an undo) replaces what is typed: adjusted while rendering, not in an effect.
  const [lastShown, setLastShown] = useState(shown);
  if (lastShown !== shown) {
    setLastShown(shown);
    setText(shown);
  }
  const commit = () => {
    const n = Number(text.replace(/,/g, ""));
    if (text.trim() !== "" && Number.isFinite(n)) onCommit(fromDisplayLength(n, units));
    else setText(shown);
  };
  return (
    <label className="block text-xs">
      <span className="text-ink-soft">{label}</span>
      <input
        className="mt-0.5 block w-full rounded border border-rule px-2 py-1 text-sm"
        inputMode="decimal"
        value={text}
        disabled={disabled}
        onChange={(e) => setText(e.target.value)}
        onBlur={commit}
        onKeyDown={(e) => {
          if (e.key === "Enter") commit();
        }}
      />
    </label>
  );
}
