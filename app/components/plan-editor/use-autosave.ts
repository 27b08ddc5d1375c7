import { useCallback, useEffect, useRef, useState } from "react";
import type { PlanResults } from "~/plans/document";

export type SaveState =
  | { kind: "saved"; version: number; at: Date | null }
  | { kind: "pending" | "saving"; version: number }
  | { kind: "conflict"; version: number; message: string }
  | { kind: "error"; version: number; message: string };

/**
 * Saves the plan a moment after the last change; a stale version stops saving and says so. Also
 * returns `saveNow`, which sends a waiting change at once (the Save now button, Ctrl+S).
 */
export function useAutosave(
  planId: number,
  initialVersion: number,
  doc: unknown,
  enabled: boolean,
  onSaved: (results: PlanResults | null) => void,
) {
  const [save, setSave] = useState<SaveState>({ kind: "saved", version: initialVersion, at: null });
  const versionRef = useRef(initialVersion);
  const first = useRef(true);
  const blocked = useRef(false);
  const flush = useRef<(() => void) | null>(null);
  const key = JSON.stringify(doc);
  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    if (!enabled || blocked.current) return;
    setSave({ kind: "pending", version: versionRef.current });
    const send = async () => {
      flush.current = null;
      setSave({ kind: "saving", version: versionRef.current });
      try {
        const res = await fetch(`/api/plans/${planId}`, {
          method: "PUT",
          headers: { "Content-Type": "application/json" },
          body: JSON.stringify({ ...(JSON.parse(key) as object), version: versionRef.current }),
        });
        const json = (await res.json()) as { version?: number; error?: string; results?: PlanResults | null };
        if (res.ok && typeof json.version === "number") {
          versionRef.current = json.version;
          setSave({ kind: "saved", version: json.version, at: new Date() });
          onSaved(json.results ?? null);
        } else if (res.status === 409) {
          blocked.current = true;
          setSave({
            kind: "conflict",
            version: versionRef.current,
            message: json.error ?? "Someone else saved this plan.",
          });
        } else {
          setSave({
            kind: "error",
            version: versionRef.current,
            message: json.error ?? `The plan could not be saved (${res.status}).`,
          });
        }
      } catch {
        setSave({
          kind: "error",
          version: versionRef.current,
          message: "The plan could not be saved: the server did not answer. It will try again on your next change.",
        });
      }
    };
    const timer = setTimeout(send, 900);
    flush.current = () => {
      clearTimeout(timer);
      void send();
    };
    return () => {
      clearTimeout(timer);
      flush.current = null;
    };
    // onSaved is stable enough; saving follows the document only.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key, enabled, planId]);
  const saveNow = useCallback(() => flush.current?.(), []);
  return [save, saveNow] as const;
}
