// Synthetic butt-weld surface profiles with known geometry, for checking profile extraction. The cap is a circular
// arc meeting circular toe arcs tangentially, which meet the plates tangentially (the construction used by the
// reference profiles in ../shared/data/butt-profiles); plates may carry a known offset and kink.

export interface WeldShape {
  /** Reinforcement height h, mm. */
  readonly height: number;
  /** Flank angle θ, degrees. */
  readonly flank: number;
  /** Toe radius ρ, mm. */
  readonly toeRadius: number;
  /** Plate 2's surface step above plate 1's at the weld centre, mm. */
  readonly offset?: number;
  /** Kink β, degrees, positive when the joint peaks towards the face. */
  readonly kink?: number;
  /** An undercut groove just outside plate 1's toe: depth and width, mm. */
  readonly undercut?: { readonly depth: number; readonly width: number };
  /** Half the profile's span, mm (default 30). */
  readonly halfSpan?: number;
  /** Point spacing, mm (default 0.05). */
  readonly spacing?: number;
  /** Gaussian noise σ, mm, from a seeded generator. */
  readonly noise?: number;
  readonly seed?: number;
}

/** x_toe = h·sin θ/(1 − cos θ), cap radius r₂ = h/(1 − cos θ) − ρ: tangency of cap, toe arcs and plate. */
export function toeHalfWidth(height: number, flankDeg: number): number {
  const t = (flankDeg * Math.PI) / 180;
  return (height * Math.sin(t)) / (1 - Math.cos(t));
}

/** Height of the weld above a flat plate at |x| from the centre-line. */
export function weldHeight(s: WeldShape, x: number): number {
  const t = (s.flank * Math.PI) / 180;
  const rho = s.toeRadius;
  const r2 = s.height / (1 - Math.cos(t)) - rho;
  const xToe = toeHalfWidth(s.height, s.flank);
  const ax = Math.abs(x);
  if (ax <= r2 * Math.sin(t)) return s.height - r2 + Math.sqrt(r2 * r2 - ax * ax);
  if (ax <= xToe) return rho - Math.sqrt(Math.max(0, rho * rho - (ax - xToe) ** 2));
  return 0;
}

export function seededNormal(seed: number): () => number {
  let state = seed >>> 0 || 1;
  const uniform = () => {
    // xorshift32
    state ^= state << 13;
    state >>>= 0;
    state ^= state >>> 17;
    state ^= state << 5;
    state >>>= 0;
    return (state + 0.5) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
}

/** The profile as x (ascending) and z arrays; plate 1 on the left. */
export function weldProfile(s: WeldShape): { x: Float64Array; z: Float64Array } {
  const span = s.halfSpan ?? 30;
  const dx = s.spacing ?? 0.05;
  const n = Math.round((2 * span) / dx) + 1;
  const x = new Float64Array(n);
  const z = new Float64Array(n);
  const half = (((s.kink ?? 0) / 2) * Math.PI) / 180;
  const e = s.offset ?? 0;
  const xToe = toeHalfWidth(s.height, s.flank);
  const plate1 = (xi: number) => Math.tan(half) * xi;
  const plate2 = (xi: number) => e - Math.tan(half) * xi;
  const normal = seededNormal(s.seed ?? 7);
  for (let i = 0; i < n; i++) {
    const xi = -span + i * dx;
    x[i] = xi;
    // Under the weld the base runs straight from toe to toe; outside, each plate's own line.
    let base: number;
    if (xi <= -xToe) base = plate1(xi);
    else if (xi >= xToe) base = plate2(xi);
    else base = plate1(-xToe) + ((plate2(xToe) - plate1(-xToe)) * (xi + xToe)) / (2 * xToe);
    let zi = base + weldHeight(s, xi);
    const u = s.undercut;
    if (u && xi < -xToe && xi > -xToe - u.width) {
      const m = (xi + xToe + u.width / 2) / (u.width / 2);
      zi -= u.depth * (1 - m * m);
    }
    z[i] = zi + (s.noise ? s.noise * normal() : 0);
  }
  return { x, z };
}
