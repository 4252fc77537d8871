/** The effective notch stress cross-check: a notch factor at the reference radius against the notch FAT. */
export interface NotchReference {
  readonly radiusMm: number;
  readonly fat: number;
  readonly basis: string;
}

// IIW Recommendations 2016 §2.2.4 / §3.3 (recalled): r_ref 1 mm and FAT 225 for t ≥ 5 mm, 0.05 mm and FAT 630 below (steel, principal stress).
export function notchReference(t: number, material: 'steel' | 'aluminium'): NotchReference {
  if (t >= 5) {
    return material === 'steel'
      ? { radiusMm: 1, fat: 225, basis: 'r_ref = 1 mm (t ≥ 5 mm), FAT 225, steel, maximum principal stress' }
      : {
          radiusMm: 1,
          fat: 71,
          basis: 'r_ref = 1 mm (t ≥ 5 mm), FAT 71, aluminium, principal stress (recalled, medium confidence)',
        };
  }
  return material === 'steel'
    ? {
        radiusMm: 0.05,
        fat: 630,
        basis: 'r_ref = 0.05 mm (t < 5 mm), FAT 630, steel, maximum principal stress',
      }
    : {
        radiusMm: 0.05,
        fat: 180,
        basis:
          'r_ref = 0.05 mm (t < 5 mm), FAT 180, aluminium, principal stress (recalled, medium confidence)',
      };
}
