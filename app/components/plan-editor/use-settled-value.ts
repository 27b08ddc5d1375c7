import { useEffect, useState } from "react";

/**
 * The value once it has stopped changing for `ms`: a run of moves updates what reads it once, when the planner
 * pauses, and never in the frame of a move. The first value is taken at once.
 */
export function useSettledValue<T>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    if (Object.is(value, settled)) return;
    const timer = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(timer);
  }, [value, settled, ms]);
  return settled;
}
