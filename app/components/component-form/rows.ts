// The component form's repeated rows: lift points and composite parts, held as the text typed.

export type Errors = Record<string, string[] | undefined>;
export type LiftRow = {
  key: number;
  label: string;
  x: string;
  y: string;
  z: string;
  ax: string;
  ay: string;
  az: string;
  thread: string;
  engagement: string;
};
export type PartRow = { key: number; name: string; mass: string; x: string; y: string; z: string };

let nextKey = 1;

/** A key for a new row, unique across both lists for the life of the page. */
export function newRowKey() {
  return nextKey++;
}

/** The number typed in a field (commas as thousands separators allowed), or null for blank or not a number. */
export function toNumber(v: string) {
  const n = Number(v.replace(/,/g, ""));
  return v.trim() !== "" && Number.isFinite(n) ? n : null;
}
