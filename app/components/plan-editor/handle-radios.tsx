// What the arrow keys move: one radio button per lift point and (level lifts) the hook.
import { memo } from "react";
import { handleKey, handleName, type Handle } from "~/plans/editor-state";

function HandleRadiosShown({
  handles,
  selectedKey,
  onSelect,
}: {
  handles: readonly Handle[];
  /** The key of the handle the arrows move, or null when there is none. */
  selectedKey: string | null;
  onSelect: (handle: Handle) => void;
}) {
  return (
    <fieldset className="no-print flex flex-wrap items-center gap-x-4 gap-y-1 text-sm">
      <legend className="float-left mr-2 font-semibold">The arrow keys move</legend>
      {handles.map((h) => (
        <label key={handleKey(h)} className="flex items-center gap-1">
          <input
            type="radio"
            name="moved-handle"
            value={handleKey(h)}
            checked={selectedKey === handleKey(h)}
            onChange={() => onSelect(h)}
          />
          {handleName(h)}
        </label>
      ))}
    </fieldset>
  );
}

const sameHandles = (a: readonly Handle[], b: readonly Handle[]) =>
  a.length === b.length && a.every((h, i) => handleKey(h) === handleKey(b[i]!));

/**
 * The radios are drawn again only when the set of handles or the chosen one changes: a move builds a new list
 * of the same handles, which leaves them as they are.
 */
export const HandleRadios = memo(
  HandleRadiosShown,
  (a, b) => a.selectedKey === b.selectedKey && a.onSelect === b.onSelect && sameHandles(a.handles, b.handles),
);
