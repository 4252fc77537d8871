/** Range checks shared by the notch formulas: each failed check is one message naming the input and the range. */
export interface Bound {
  readonly name: string;
  readonly value: number;
  readonly min: number;
  readonly max: number;
  readonly minExclusive?: boolean;
}

const fmt = (x: number): string => String(Number(x.toPrecision(4)));

const isOutside = (b: Bound): boolean =>
  (b.minExclusive ? b.value <= b.min : b.value < b.min) || b.value > b.max || !Number.isFinite(b.value);

/** True when every input lies inside its range (the same test as outsideOf, without the messages). */
export function insideOf(bounds: readonly Bound[]): boolean {
  for (const b of bounds) if (isOutside(b)) return false;
  return true;
}

export function outsideOf(bounds: readonly Bound[]): string[] {
  const out: string[] = [];
  for (const b of bounds) {
    if (isOutside(b)) {
      const lo = b.minExclusive ? `> ${fmt(b.min)}` : `${fmt(b.min)}`;
      out.push(`${b.name} = ${fmt(b.value)} lies outside ${lo} … ${fmt(b.max)}`);
    }
  }
  return out;
}
