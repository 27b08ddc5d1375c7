import { useEffect, useRef, useState } from "react";
import type { ResultState } from "~/components/live-results";
import type { AnyCheck } from "~/plans/check-text";

/** The parts of a 200 answer from /api/solve the editor draws and works from. */
export type LiveSolution = {
  hook: { x: number; y: number; z: number };
  legs: Array<{
    liftPointId: string;
    lengthM: number;
    tensionKn: number;
    tensionKg: number;
    angleFromVerticalDeg: number;
    slack: boolean;
  }>;
  checks?: AnyCheck[];
  tiltDeg: number;
};

/** Fetches /api/solve for the body, debounced; answers to superseded bodies are dropped. */
export function useLiveSolve(body: unknown | null): ResultState {
  const [state, setState] = useState<ResultState>({ kind: "idle" });
  const key = body === null ? null : JSON.stringify(body);
  const sequence = useRef(0);
  useEffect(() => {
    if (key === null) return;
    const id = ++sequence.current;
    const controller = new AbortController();
    setState((s) => (s.kind === "done" ? { ...s, stale: true } : { kind: "loading" }));
    const timer = setTimeout(async () => {
      try {
        const res = await fetch("/api/solve", {
          method: "POST",
          body: key,
          headers: { "Content-Type": "application/json" },
          signal: controller.signal,
        });
        const json = (await res.json()) as unknown;
        if (id !== sequence.current) return;
        setState({ kind: "done", status: res.status, body: json, stale: false });
      } catch (error) {
        if (controller.signal.aborted || id !== sequence.current) return;
        setState({
          kind: "failed",
          message: error instanceof Error ? error.message : "The figures could not be fetched.",
        });
      }
    }, 180);
    return () => {
      clearTimeout(timer);
      controller.abort();
    };
  }, [key]);
  return state;
}
