// The walk along one plate, from its outer end towards the weld: points within τ of the first line join the plate's
// sums; the weld begins where `run` points in a row leave it. Kept apart from the plate logic so the engine
// optimises this loop on its own (inside the larger function it ran several times slower).

/** The accepted points' sums, x and z taken from (x0, z0): n, Σx, Σz, Σx², Σxz, Σz². Reused from walk to walk. */
export const walkSums = new Float64Array(6);

/** Returns the first index of the weld seen from this side, or −1 when the profile never leaves the line. */
export function walkPlate(
  x: ArrayLike<number>,
  z: ArrayLike<number>,
  n: number,
  dir: 1 | -1,
  a: number,
  b: number,
  tau: number,
  run: number,
  x0: number,
  z0: number,
): number {
  let sx = 0;
  let sz = 0;
  let sxx = 0;
  let sxz = 0;
  let szz = 0;
  let cnt = 0;
  let out = 0;
  let departure = -1;
  // Two loops, one per direction, so each index runs with a constant step.
  if (dir === 1) {
    for (let i = 0; i < n; i++) {
      const xa = x[i] as number;
      const za = z[i] as number;
      if (Math.abs(za - a - b * xa) > tau) {
        if (++out === run) {
          departure = i - (run - 1);
          break;
        }
        continue;
      }
      out = 0;
      const xi = xa - x0;
      const zi = za - z0;
      sx += xi;
      sz += zi;
      sxx += xi * xi;
      sxz += xi * zi;
      szz += zi * zi;
      cnt++;
    }
  } else {
    for (let i = n - 1; i >= 0; i--) {
      const xa = x[i] as number;
      const za = z[i] as number;
      if (Math.abs(za - a - b * xa) > tau) {
        if (++out === run) {
          departure = i + (run - 1);
          break;
        }
        continue;
      }
      out = 0;
      const xi = xa - x0;
      const zi = za - z0;
      sx += xi;
      sz += zi;
      sxx += xi * xi;
      sxz += xi * zi;
      szz += zi * zi;
      cnt++;
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
