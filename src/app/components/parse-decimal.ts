/**
 * A number typed on a tablet keypad: a decimal comma is accepted as a point, spaces are ignored. Returns null for
 * anything that is not a plain decimal number (no units, no exponent), so the field can say what is wrong.
 */
export function parseDecimal(text: string): number | null {
  const cleaned = text.trim().replace(/\s+/g, '').replace(',', '.');
  if (!/^[-+]?(\d+(\.\d*)?|\.\d+)$/.test(cleaned)) return null;
  const n = Number(cleaned);
  return Number.isFinite(n) ? n : null;
}

/** Rounds to the instrument's resolution step, avoiding 0.1 + 0.2 artefacts. */
export function stepBy(value: number, step: number, direction: 1 | -1): number {
  const decimals = Math.max(0, Math.ceil(-Math.log10(step)) + 1);
  return Number((Math.round(value / step) * step + direction * step).toFixed(decimals));
}
