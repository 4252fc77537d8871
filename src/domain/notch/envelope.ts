/**
 * Monotone envelopes of fitted notch formulas. A parametric fit may turn over inside its own validity range
 * (Kiyak's butt formula falls again past a flank angle of 27°–58° depending on h/T and ρ/T; Anthes' butt formula
 * past 25°–85° depending on t/ρ), although a steeper flank or a sharper toe never lowers the real notch stress.
 * Where that happens the largest value at a flank angle up to the measured one (and t/ρ up to the measured one)
 * is used, which is never below the formula's own value, and the result says so.
 */

const GOLDEN = (Math.sqrt(5) - 1) / 2;
const SCAN = 12;

export interface Peak {
  readonly value: number;
  readonly at: number;
}

/** The largest value of f on [lo, x], for an f that rises then falls at most once there. */
export function maxUpTo(f: (x: number) => number, lo: number, x: number): Peak {
  const fx = f(x);
  if (!(x > lo)) return { value: fx, at: x };
  const step = Math.max(1e-7 * Math.abs(x), 1e-9);
  if (!(f(x - step) > fx)) return { value: fx, at: x };
  // Past a peak: scan coarsely for its neighbourhood, then narrow it by golden section.
  let best = lo;
  let bestValue = f(lo);
  const h = (x - lo) / SCAN;
  for (let i = 1; i < SCAN; i++) {
    const xi = lo + i * h;
    const v = f(xi);
    if (v > bestValue) {
      best = xi;
      bestValue = v;
    }
  }
  let a = Math.max(lo, best - h);
  let b = Math.min(x, best + h);
  let c = b - GOLDEN * (b - a);
  let d = a + GOLDEN * (b - a);
  let fc = f(c);
  let fd = f(d);
  for (let i = 0; i < 48; i++) {
    if (fc >= fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - GOLDEN * (b - a);
      fc = f(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + GOLDEN * (b - a);
      fd = f(d);
    }
  }
  const mid = (a + b) / 2;
  const candidates: Peak[] = [
    { value: fx, at: x },
    { value: bestValue, at: best },
    { value: fc, at: c },
    { value: fd, at: d },
    { value: f(mid), at: mid },
  ];
  return candidates.reduce((p, q) => (q.value > p.value ? q : p));
}

export interface Envelope {
  readonly value: number;
  /** Where the envelope's value comes from, when it is not the measured point itself. */
  readonly flankAt: number;
  readonly ratioAt: number;
}

/**
 * The largest value of f(t/ρ, θ) over t/ρ in [ratioLo, ratio] and θ in [flankLo, flank]: non-decreasing in θ
 * and in t/ρ (so non-increasing in ρ) by construction.
 */
export function envelope(
  f: (ratio: number, flankDeg: number) => number,
  ratioLo: number,
  ratio: number,
  flankLo: number,
  flank: number,
): Envelope {
  const inner = (r: number): Peak => maxUpTo((th) => f(r, th), flankLo, flank);
  const atMeasured = inner(ratio);
  const outer = maxUpTo((r) => (r === ratio ? atMeasured.value : inner(r).value), ratioLo, ratio);
  const flankAt = outer.at === ratio ? atMeasured.at : inner(outer.at).at;
  return { value: Math.max(outer.value, atMeasured.value), flankAt, ratioAt: outer.at };
}
