/** What a fatigue class already allows for misalignment, and what is left over once a seam's km is known. */

export type CoveredRow = 'buttShopFlat' | 'buttOther' | 'cruciform' | 'filletOneSurface';

/** IIW Recommendations §3.8.2 table (recalled; 1.30 and 1.45 with high confidence): km already in nominal FAT classes. */
export const KM_COVERED: Readonly<Record<CoveredRow, { readonly value: number; readonly label: string }>> = {
  buttShopFlat: { value: 1.15, label: 'butt joint made in shop in flat position' },
  buttOther: { value: 1.3, label: 'other butt joints' },
  cruciform: { value: 1.45, label: 'cruciform joints' },
  filletOneSurface: { value: 1.25, label: 'fillet welds on one plate surface' },
};

/** IIW Recommendations §3.8.2 (recalled): the S-N curves of hot-spot and effective notch stress include km = 1.05. */
export const KM_COVERED_LOCAL = 1.05;

// IIW Recommendations 2016 §3.8.2 (recalled): km,eff = km,calc / km,covered, never below 1.
export function kmEffective(kmCalc: number, covered: number): number {
  return Math.max(1, kmCalc / covered);
}

// BS 7910 Annex D (recalled): several misalignments at one toe add their secondary bending, km = 1 + Σ(km,i − 1).
export function combineKm(parts: readonly number[]): number {
  return 1 + parts.reduce((s, km) => s + (km - 1), 0);
}
