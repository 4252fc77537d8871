/** Range checks shared by the notch formulas: each failed check is one message naming the input and the range. */
export interface Bound {
  readonly name: string;
  readonly value: number;
  readonly min: number;
  readonly max: number;
  readonly minExclusive?: boolean;
}

const fmt = (x: number): string => String(Number(x.toPrecision(4)));

export function outsideOf(bounds: readonly Bound[]): string[] {
  const out: string[] = [];
  for (const b of bounds) {
    const low = b.minExclusive ? b.value <= b.min : b.value < b.min;
    if (low || b.value > b.max || !Number.isFinite(b.value)) {
      const lo = b.minExclusive ? `> ${fmt(b.min)}` : `${fmt(b.min)}`;
      out.push(`${b.name} = ${fmt(b.value)} lies outside ${lo} … ${fmt(b.max)}`);
    }
  }
  return out;
}
