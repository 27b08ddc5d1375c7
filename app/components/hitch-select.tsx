import { HITCH_LABELS, HITCHES, type LegRiggingAllocation } from "~/plans/document";
import type { GearPick } from "~/plans/rigging";
import { allowedHitches } from "~/statics/rule-sets";

type Hitch = (typeof HITCHES)[number];

/** The hitches a leg can make with what is allocated to it (the core's rule: rule-sets.ts allowedHitches). */
export function hitchesForLeg(leg: LegRiggingAllocation | undefined, picks: ReadonlyMap<number, GearPick>): Hitch[] {
  const pick = leg?.slingItemId !== undefined ? picks.get(leg.slingItemId) : undefined;
  const sling = pick?.spec.role === "sling" ? pick.spec.sling : { kind: "web" as const, assemblyLegs: 1 };
  return allowedHitches(sling, {
    ...(leg?.eyeboltItemId !== undefined ? { eyebolt: { family: "collar", thread: "" } } : {}),
    ...(leg?.shackleItemId !== undefined ? { shackle: { type: "bow" } } : {}),
  });
}

/** The hitch for a leg: only the hitches its sling and attachment can make are offered; one that cannot be made stays shown, marked. */
export function HitchSelect({
  label,
  hitch,
  allowed,
  disabled,
  onChange,
}: {
  label: string;
  hitch: Hitch;
  allowed: readonly Hitch[];
  disabled: boolean;
  onChange: (hitch: Hitch) => void;
}) {
  return (
    <select
      aria-label={`Hitch for leg ${label}`}
      className="rounded border border-rule px-2 py-1 text-sm"
      value={hitch}
      disabled={disabled}
      onChange={(e) => onChange(e.target.value as Hitch)}
    >
      {HITCHES.filter((h) => allowed.includes(h) || h === hitch).map((h) => (
        <option key={h} value={h} disabled={!allowed.includes(h)}>
          {allowed.includes(h) ? HITCH_LABELS[h] : `${HITCH_LABELS[h]} (cannot be made here)`}
        </option>
      ))}
    </select>
  );
}
