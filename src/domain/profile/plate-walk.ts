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
  let departure = -1;
  // Only points off the line touch the run bookkeeping (where the current run began, the last point off the line,
  // how many were left out); the accepted point, nearly every one, does nothing but the test and the sums.
  let left = 0;
  let runStart = -1;
  let visited = n;
  // Two loops, one per direction, so each index runs with a constant step.
  if (dir === 1) {
    let lastOff = -2;
    for (let i = 0; i < n; i++) {
      const xa = x[i] as number;
      const za = z[i] as number;
      if (Math.abs(za - a - b * xa) > tau) {
        if (i !== lastOff + 1) runStart = i;
        lastOff = i;
        left++;
        if (i - runStart + 1 === run) {
          departure = runStart;
          visited = i + 1;
          break;
        }
        continue;
      }
      const xi = xa - x0;
      const zi = za - z0;
      sx += xi;
      sz += zi;
      sxx += xi * xi;
      sxz += xi * zi;
      szz += zi * zi;
    }
  } else {
    let lastOff = n + 1;
    for (let i = n - 1; i >= 0; i--) {
      const xa = x[i] as number;
      const za = z[i] as number;
      if (Math.abs(za - a - b * xa) > tau) {
        if (i !== lastOff - 1) runStart = i;
        lastOff = i;
        left++;
        if (runStart - i + 1 === run) {
          departure = runStart;
          visited = n - i;
          break;
        }
        continue;
      }
      const xi = xa - x0;
      const zi = za - z0;
      sx += xi;
      sz += zi;
      sxx += xi * xi;
      sxz += xi * zi;
      szz += zi * zi;
    }
  }
  const cnt = visited - left;
  walkSums[0] = cnt;
  walkSums[1] = sx;
  walkSums[2] = sz;
  walkSums[3] = sxx;
  walkSums[4] = sxz;
  walkSums[5] = szz;
  return departure;
}
