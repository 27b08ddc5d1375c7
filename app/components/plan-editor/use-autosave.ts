import { useCallback, useEffect, useRef, useState } from "react";
import { createSaveCoalescer, type SaveCoalescer } from "~/components/plan-editor/save-coalescer";
import type { PlanResults } from "~/plans/document";

export type SaveState =
  | { kind: "saved"; version: number; at: Date | null }
  | { kind: "pending" | "saving"; version: number }
  | { kind: "conflict"; version: number; message: string }
  | { kind: "error"; version: number; message: string };

/** How long the planner pauses before the plan is saved, ms. */
export const AUTOSAVE_IDLE_MS = 800;

/** Bodies up to this size go with keepalive, so a save sent as the page goes away still arrives. */
const KEEPALIVE_LIMIT = 60_000;

/**
 * Saves the plan once the planner pauses, and at once when the page is left, hidden or loses focus: one
 * save for a run of moves or keypresses, never one each. A stale version stops saving and says so. Also
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
  const blocked = useRef(false);
  const key = JSON.stringify(doc);
  const keyRef = useRef(key);
  const savedKey = useRef(key);
  const onSavedRef = useRef(onSaved);
  const coalescer = useRef<SaveCoalescer | null>(null);

  useEffect(() => {
    onSavedRef.current = onSaved;
  }, [onSaved]);

  useEffect(() => {
    const send = async () => {
      const sending = keyRef.current;
      if (blocked.current || sending === savedKey.current) {
        setSave((s) => (s.kind === "pending" ? { kind: "saved", version: versionRef.current, at: null } : s));
        return;
      }
      setSave({ kind: "saving", version: versionRef.current });
      const body = JSON.stringify({ ...(JSON.parse(sending) as object), version: versionRef.current });
      try {
        const res = await fetch(`/api/plans/${planId}`, {
          method: "PUT",
          headers: { "Content-Type": "application/json" },
          body,
          keepalive: body.length < KEEPALIVE_LIMIT,
        });
        const json = (await res.json()) as { version?: number; error?: string; results?: PlanResults | null };
        if (res.ok && typeof json.version === "number") {
          versionRef.current = json.version;
          savedKey.current = sending;
          const more = coalescer.current?.pending ?? false;
          setSave(
            more
              ? { kind: "pending", version: json.version }
              : { kind: "saved", version: json.version, at: new Date() },
          );
          onSavedRef.current(json.results ?? null);
        } else if (res.status === 409) {
          blocked.current = true;
          coalescer.current?.cancel();
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
    const c = createSaveCoalescer(send, AUTOSAVE_IDLE_MS);
    coalescer.current = c;
    const flush = () => c.flush();
    const onVisibility = () => {
      if (document.visibilityState === "hidden") c.flush();
    };
    window.addEventListener("pagehide", flush);
    window.addEventListener("blur", flush);
    document.addEventListener("visibilitychange", onVisibility);
    return () => {
      window.removeEventListener("pagehide", flush);
      window.removeEventListener("blur", flush);
      document.removeEventListener("visibilitychange", onVisibility);
      // Leaving the editor inside the app: what waits is sent, not dropped.
      c.flush();
      c.cancel();
      coalescer.current = null;
    };
  }, [planId]);

  useEffect(() => {
    keyRef.current = key;
    if (!enabled || blocked.current || key === savedKey.current) return;
    // Already waiting: the same state, so a run of moves renders the editor once per move, not twice.
    setSave((s) =>
      s.kind === "saving" || (s.kind === "pending" && s.version === versionRef.current)
        ? s
        : { kind: "pending", version: versionRef.current },
    );
    coalescer.current?.changed();
  }, [key, enabled]);

  const saveNow = useCallback(() => coalescer.current?.flush(), []);
  return [save, saveNow] as const;
}
