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
  /** Given lengths: each leg's length to hang level and the change from its given length (negative: shorten), m. */
  levelling?: {
    hookZM: number;
    legs: Array<{ liftPointId: string; givenLengthM: number; levelLengthM: number; changeM: number }>;
  } | null;
};

type Answer = { key: string; status: number; body: unknown } | { key: string; failed: string };

/**
 * Fetches /api/solve for the body, debounced; answers to superseded bodies are dropped. While a newer
 * body is on its way the last answer is shown marked stale (derived from the keys, not set in the effect).
 */
export function useLiveSolve(body: unknown | null): ResultState {
  const [answer, setAnswer] = useState<Answer | null>(null);
  const key = body === null ? null : JSON.stringify(body);
  const sequence = useRef(0);
  useEffect(() => {
    if (key === null) return;
    const id = ++sequence.current;
    const controller = new AbortController();
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
        setAnswer({ key, status: res.status, body: json });
      } catch (error) {
        if (controller.signal.aborted || id !== sequence.current) return;
        setAnswer({ key, failed: error instanceof Error ? error.message : "The figures could not be fetched." });
      }
    }, 180);
    return () => {
      clearTimeout(timer);
      controller.abort();
    };
  }, [key]);
  if (key === null) return { kind: "idle" };
  if (answer === null) return { kind: "loading" };
  if ("failed" in answer) return answer.key === key ? { kind: "failed", message: answer.failed } : { kind: "loading" };
  return { kind: "done", status: answer.status, body: answer.body, stale: answer.key !== key };
}
