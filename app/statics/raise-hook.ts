// In a level lift a higher hook brings the legs nearer vertical, which lowers every leg load and lifts an
// eyebolt's derated capacity: for a leg item over its rating, the lowest hook height at which its own check
// passes. Pure.

/** Steps of the coarse scan upward, then halvings of the bracket it finds. */
const SCAN_STEPS = 40;
const HALVINGS = 30;

/**
 * The lowest hook height (m) in (fromZM, toZM] at which `passes` holds, found by scanning up and halving
 * the first bracket; the answer is the bracket's upper end, so the check passes there. Null when it does
 * not pass even at toZM. Assumes a check that passes at some height also passes higher (the loads fall as
 * the legs straighten); the scan finds the first passing height either way.
 */
export function lowestPassingHookZ(passes: (hookZM: number) => boolean, fromZM: number, toZM: number): number | null {
  if (!(toZM > fromZM)) return null;
  let below = fromZM;
  let above: number | null = null;
  for (let i = 1; i <= SCAN_STEPS; i++) {
    const z = fromZM + ((toZM - fromZM) * i) / SCAN_STEPS;
    if (passes(z)) {
      above = z;
      break;
    }
    below = z;
  }
  if (above === null) return null;
  let upper: number = above;
  for (let i = 0; i < HALVINGS; i++) {
    const mid: number = (below + upper) / 2;
    if (passes(mid)) upper = mid;
    else below = mid;
  }
  return upper;
}
