/** Linear (axial) misalignment: the secondary-bending magnification at the weld of a plate loaded in tension. */

// IIW Recommendations 2016, App. 6.3 and BS 7910 Annex D, flat plates of equal t: km = 1 + λ·(e/t)·l_i/(l1 + l2), λ = 6.
export function kmAxialFlat(e: number, t: number, li: number, l1: number, l2: number): number {
  return 1 + 6 * (Math.abs(e) / t) * (li / (l1 + l2));
}

// IIW Recommendations 2016, App. 6.3 and BS 7910 Annex D, different thickness: km = 1 + (6e/t_i)·t_i^n/(t1^n + t2^n).
export function kmAxialThicknessStep(e: number, ti: number, tOther: number, n = 1.5): number {
  return 1 + ((6 * Math.abs(e)) / ti) * (ti ** n / (ti ** n + tOther ** n));
}

// IIW Recommendations 2016, App. 6.3 (recalled, low confidence), cruciform toe crack: km = 1 + λ·(e/t)·l_i/(l1 + l2).
export function kmAxialCruciform(e: number, t: number, li: number, l1: number, l2: number): number {
  return 1 + 6 * (Math.abs(e) / t) * (li / (l1 + l2));
}

/**
 * The share l_i/(l1 + l2) of the eccentricity moment a side takes. Pinned ends: statics. Clamped ends: a
 * beam-column solution shows each side tends to the equal-arm value (1 + 3e/t), so the share is never taken
 * below ½; the pinned share is kept where it is larger (conservative).
 */
export function armShare(li: number, l1: number, l2: number, restraint: 'clamped' | 'pinned'): number {
  const share = li / (l1 + l2);
  return restraint === 'clamped' ? Math.max(0.5, share) : share;
}

// DNV-RP-C203 (2016) Sec. 3.1, butt weld of equal t (recalled): SCF = 1 + 3·(δm − δ0)/t, δ0 = 0.1·t.
export function dnvButtScf(deltaM: number, t: number): number {
  return 1 + (3 * (Math.abs(deltaM) - 0.1 * t)) / t;
}

// DNV-RP-C203 (2016) Sec. 3.1, thickness transition (recalled): SCF = 1 + 6·(δt + δm − δ0)/(t·[1 + (T/t)^1.5]).
export function dnvThicknessTransitionScf(eMidPlane: number, t: number, T: number): number {
  return 1 + (6 * (Math.abs(eMidPlane) - 0.1 * t)) / (t * (1 + (T / t) ** 1.5));
}

// DNV-RP-C203 (2016), cruciform joint (recalled, low confidence): SCF = 1 + 6·δ·l_t/(t·(l_t + l_T)).
export function dnvCruciformScf(delta: number, t: number, lt: number, lT: number): number {
  return 1 + (6 * Math.abs(delta) * lt) / (t * (lt + lT));
}
