import { useMemo } from "react";
import type { ResultState } from "~/components/live-results";
import type { AnyCheck } from "~/plans/check-text";
import { solveArrangement, type ArrangementInput } from "~/statics/arrangement";
import type { ReferenceTables } from "~/statics/reference";

/** The parts of a solved arrangement's body the editor draws and works from. */
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

/** The input solved and checked in the browser by the statics core, with the reference tables. */
export function solveLive(input: ArrangementInput | null, tables: ReferenceTables | null): ResultState {
  if (input === null || input.liftPoints.length === 0) return { kind: "idle" };
  if (tables === null) return { kind: "failed", message: "The reference tables did not arrive: reload the editor." };
  try {
    const outcome = solveArrangement(input, tables);
    return { kind: "done", status: outcome.status, body: outcome.body, stale: false };
  } catch (error) {
    return {
      kind: "failed",
      message: `The figures could not be worked out: ${error instanceof Error ? error.message : String(error)}`,
    };
  }
}

/**
 * Live figures worked out in the render that follows a change: the same core and tables as the server's
 * results, so a move and its figures land in one frame with nothing on the network in between.
 */
export function useLiveSolve(input: ArrangementInput | null, tables: ReferenceTables | null): ResultState {
  return useMemo(() => solveLive(input, tables), [input, tables]);
}
