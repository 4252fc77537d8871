// The walk along one plate, from its outer end towards the weld: points within τ of the first line join the plate's
// sums; the weld begins where `run` points in a row leave it. Kept apart from the plate logic so the engine
// optimises this loop on its own (inside the larger function it ran several times slower).

/** The accepted points' sums, x and z taken from (x0, z0): n, Σx, Σz, Σx², Σxz, Σz². Reused from walk to walk. */
export const walkSums = new Float64Array(6);

/**
 * The line z = a + b·x, the tolerance τ and the origin (x0, z0) of the sums, set by the caller before each walk.
 * Passed as arguments, a whole number among them (x0 = −30, z0 = 0) arrives untyped and the optimised loop
 * checked its kind at every point; read from here they are plain doubles from the start.
 */
export const walkLine = new Float64Array(5);

/**
 * On a profile of STEP_FROM points or more the walk steps over every other point: a run of `run` (≥ 2) points off the line always holds a point it lands on,
 * and from there it looks back at the point it stepped over and forward point by point, so the weld begins exactly
 * where a walk over every point finds it. The sums take the points it lands on that lie on the line: half of the
 * plate's points, which moves the refitted line by a factor √2 of its own scatter (under a micrometre for a plate
 * scatter of 0.01 mm over some 190 points) for half the summing.
 */
const STEP = 2;
/** Below this many points a profile's plates are short: every point is summed. */
const STEP_FROM = 400;

/** Returns the first index of the weld seen from this side, or −1 when the profile never leaves the line. */
export function walkPlate(
  x: ArrayLike<number>,
  z: ArrayLike<number>,
  n: number,
  dir: 1 | -1,
  run: number,
): number {
  const a = walkLine[0] as number;
  const b = walkLine[1] as number;
  const tau = walkLine[2] as number;
  const x0 = walkLine[3] as number;
  const z0 = walkLine[4] as number;
  let sx = 0;
  let sz = 0;
  let sxx = 0;
  let sxz = 0;
  let szz = 0;
  let cnt = 0;
  let departure = -1;
  const step = n >= STEP_FROM ? STEP : 1;
  const off = (k: number): boolean => Math.abs((z[k] as number) - a - b * (x[k] as number)) > tau;
  // Two loops, one per direction, so each index runs with a constant step.
  if (dir === 1) {
    // Every index up to `tested` was looked at; the stride steps over one point at most.
    let tested = -1;
    let i = 0;
    while (i < n) {
      const xa = x[i] as number;
      const za = z[i] as number;
      if (Math.abs(za - a - b * xa) <= tau) {
        const xi = xa - x0;
        const zi = za - z0;
        sx += xi;
        sz += zi;
        sxx += xi * xi;
        sxz += xi * zi;
        szz += zi * zi;
        cnt++;
        tested = i;
        i += step;
        continue;
      }
      let start = i;
      while (start - 1 > tested && off(start - 1)) start--;
      let j = i + 1;
      while (j < n && j - start < run && off(j)) j++;
      if (j - start >= run) {
        departure = start;
        break;
      }
      tested = j - 1;
      i = j;
    }
  } else {
    let tested = n;
    let i = n - 1;
    while (i >= 0) {
      const xa = x[i] as number;
      const za = z[i] as number;
      if (Math.abs(za - a - b * xa) <= tau) {
        const xi = xa - x0;
        const zi = za - z0;
        sx += xi;
        sz += zi;
        sxx += xi * xi;
        sxz += xi * zi;
        szz += zi * zi;
        cnt++;
        tested = i;
        i -= step;
        continue;
      }
      let start = i;
      while (start + 1 < tested && off(start + 1)) start++;
      let j = i - 1;
      while (j >= 0 && start - j < run && off(j)) j--;
      if (start - j >= run) {
        departure = start;
        break;
      }
      tested = j + 1;
      i = j;
    }
  }
  walkSums[0] = cnt;
  walkSums[1] = sx;
  walkSums[2] = sz;
  walkSums[3] = sxx;
  walkSums[4] = sxz;
  walkSums[5] = szz;
  return departure;
}
