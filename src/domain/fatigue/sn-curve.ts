/** The S-N curve shape of the IIW Recommendations, 2016 edition, for normal stress. */
export const SN_EDITION =
  'IIW Recommendations for Fatigue Design of Welded Joints and Components, 2016 edition';
export const N_REF = 2e6;
export const N_KNEE = 1e7;
export const SLOPE = 3;
export const SLOPE_AFTER_KNEE = 22;

// IIW 2016 §3.2 (recalled): N = 2·10⁶·(FAT/Δσ)³ down to the knee at 10⁷ cycles, then slope 22 (no fatigue limit).
export function cyclesToFailure(stressRange: number, fat: number): number {
  if (!(stressRange > 0)) return Infinity;
  const knee = fat * (N_REF / N_KNEE) ** (1 / SLOPE);
  return stressRange >= knee
    ? N_REF * (fat / stressRange) ** SLOPE
    : N_KNEE * (knee / stressRange) ** SLOPE_AFTER_KNEE;
}

/** The stress range at the knee, 0.5848·FAT (derived from the curve above). */
export const kneeStressRange = (fat: number): number => fat * (N_REF / N_KNEE) ** (1 / SLOPE);
