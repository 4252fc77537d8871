// An independent finite-difference beam-column for the misalignment checks: a plate strip of unit width, thickness
// t and modulus E, under a membrane stress σ (tension positive), held at both ends (pinned or clamped), with an
// initial mid-plane shape w0(x) measured from the line joining the ends (the load line). It solves for the extra
// deflection v under load and returns the secondary-bending ratio σ_b/σ_m at the joint, on either side of it.
//
// Equilibrium of a beam-column with an axial force P along the load line: the bending moment is
// M(x) = P·(w0 + v) + m0 + m1·x, with m0, m1 the end-moment terms (zero for pinned ends), and EI·v'' = M.
// Central differences on N intervals, Thomas algorithm, superposition for the two end-moment unknowns, and
// second-order one-sided differences for the clamped ends' zero slope. Second-order accurate in the node spacing.

export interface BeamColumn {
  readonly t: number;
  readonly E: number;
  readonly sigma: number;
  readonly l1: number;
  readonly l2: number;
  readonly ends: 'pinned' | 'clamped';
  /** Initial offset from the load line at x (0 ≤ x ≤ l1 + l2); `side` tells which plate at the joint itself. */
  readonly w0: (x: number, side: 1 | 2) => number;
}

function thomas(n: number, lower: number, diag: number, upper: number, rhs: Float64Array): Float64Array {
  const c = new Float64Array(n);
  const d = new Float64Array(n);
  c[0] = upper / diag;
  d[0] = (rhs[0] as number) / diag;
  for (let i = 1; i < n; i++) {
    const m = diag - lower * (c[i - 1] as number);
    c[i] = upper / m;
    d[i] = ((rhs[i] as number) - lower * (d[i - 1] as number)) / m;
  }
  const x = new Float64Array(n);
  x[n - 1] = d[n - 1] as number;
  for (let i = n - 2; i >= 0; i--) x[i] = (d[i] as number) - (c[i] as number) * (x[i + 1] as number);
  return x;
}

/** σ_b/σ_m at the joint on plate 1's and plate 2's side (positive: the root side, below the mid-plane, in tension). */
export function jointBendingRatio(b: BeamColumn, intervals = 8000): { plate1: number; plate2: number } {
  const L = b.l1 + b.l2;
  // The joint on a node: intervals split in proportion to the arms.
  const n1 = Math.round((intervals * b.l1) / L);
  const n = n1 + Math.round((intervals * b.l2) / L);
  const h1 = b.l1 / n1;
  const h2 = b.l2 / (n - n1);
  if (Math.abs(h1 - h2) > 1e-12 * L) throw new Error('choose arms that share a node spacing');
  const h = h1;
  const P = b.sigma * b.t;
  const EI = (b.E * b.t ** 3) / 12;
  const k2 = P / EI;
  const m = n - 1;
  const xs = (i: number): number => i * h;
  const w0At = (i: number): number =>
    i === n1 ? (b.w0(xs(i), 1) + b.w0(xs(i), 2)) / 2 : b.w0(xs(i), i < n1 ? 1 : 2);
  const lower = 1 / (h * h);
  const diag = -2 / (h * h) - k2;
  const rhsP = new Float64Array(m);
  const rhs0 = new Float64Array(m);
  const rhs1 = new Float64Array(m);
  for (let i = 1; i < n; i++) {
    rhsP[i - 1] = k2 * w0At(i);
    rhs0[i - 1] = 1;
    rhs1[i - 1] = xs(i);
  }
  const vP = thomas(m, lower, diag, lower, rhsP);
  const v0 = thomas(m, lower, diag, lower, rhs0);
  const v1 = thomas(m, lower, diag, lower, rhs1);
  let a0 = 0;
  let a1 = 0;
  if (b.ends === 'clamped') {
    // v'(0) = 0 and v'(L) = 0 with v = 0 at the ends: 4·v1 − v2 = 0 and 4·v_{n−1} − v_{n−2} = 0.
    const s0 = (v: Float64Array): number => 4 * (v[0] as number) - (v[1] as number);
    const sL = (v: Float64Array): number => 4 * (v[m - 1] as number) - (v[m - 2] as number);
    const A = [
      [s0(v0), s0(v1)],
      [sL(v0), sL(v1)],
    ] as const;
    const rhs = [-s0(vP), -sL(vP)] as const;
    const det = A[0][0] * A[1][1] - A[0][1] * A[1][0];
    a0 = (rhs[0] * A[1][1] - A[0][1] * rhs[1]) / det;
    a1 = (A[0][0] * rhs[1] - rhs[0] * A[1][0]) / det;
  }
  const vj = (vP[n1 - 1] as number) + a0 * (v0[n1 - 1] as number) + a1 * (v1[n1 - 1] as number);
  const xj = xs(n1);
  // M/P = w0 + v + (m0 + m1·x)/(P) with m0 = EI·a0, m1 = EI·a1; σ_b/σ_m = 6·(M/P)/t.
  const ratio = (side: 1 | 2): number => (6 * (b.w0(xj, side) + vj + (EI * (a0 + a1 * xj)) / P)) / b.t;
  return { plate1: ratio(1), plate2: ratio(2) };
}

/** A kink of total angle α (radians) at the joint, peaking toward the face side, measured from the load line. */
export function kink(alpha: number, l1: number, l2: number): (x: number) => number {
  const y = (alpha * l1 * l2) / (l1 + l2);
  return (x) => (x <= l1 ? (y * x) / l1 : (y * (l1 + l2 - x)) / l2);
}

/** A step: plate 2's mid-plane e above plate 1's, measured from the load line joining the ends. */
export function step(e: number, l1: number, l2: number): (x: number, side: 1 | 2) => number {
  const L = l1 + l2;
  return (x, side) => (x < l1 || (x === l1 && side === 1) ? (-e * x) / L : e - (e * x) / L);
}
