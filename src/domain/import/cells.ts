// One cell to one number, strictly: a digit string with at most one decimal mark (the file's), an optional sign and
// exponent. Anything else is a reason to quarantine the row, never a guess.

export type CellResult =
  | { readonly kind: 'empty' }
  | { readonly kind: 'number'; readonly value: number }
  | { readonly kind: 'nan' }
  | { readonly kind: 'otherMark' }
  | { readonly kind: 'text' };

const EMPTY: CellResult = { kind: 'empty' };
const NAN: CellResult = { kind: 'nan' };
const OTHER_MARK: CellResult = { kind: 'otherMark' };
const TEXT: CellResult = { kind: 'text' };
const NAN_WORDS = new Set([
  'nan',
  '-nan',
  '+nan',
  'na',
  'n/a',
  '#n/a',
  'null',
  'none',
  'inf',
  '-inf',
  'infinity',
  '-infinity',
]);

/** Reads a cell with the given decimal mark. Codes: 43 +, 45 -, 46 ., 44 ,, 48–57 digits, 69/101 e. */
export function readCell(raw: string, decimal: '.' | ','): CellResult {
  let s = raw;
  // Cheap trim: only when the ends are not digits (the common case has nothing to trim).
  const c0 = s.charCodeAt(0);
  const cN = s.charCodeAt(s.length - 1);
  if (!(c0 >= 48 && c0 <= 57) || !(cN >= 48 && cN <= 57)) {
    s = s.trim();
    if (s === '') return EMPTY;
  }
  const mark = decimal === '.' ? 46 : 44;
  const other = decimal === '.' ? 44 : 46;
  let i = 0;
  const n = s.length;
  let c = s.charCodeAt(0);
  if (c === 43 || c === 45) i++;
  let digits = 0;
  let marks = 0;
  let otherMarks = 0;
  for (; i < n; i++) {
    c = s.charCodeAt(i);
    if (c >= 48 && c <= 57) digits++;
    else if (c === mark) marks++;
    else if (c === other) otherMarks++;
    else break;
  }
  if (i < n && (c === 69 || c === 101) && digits > 0) {
    i++;
    c = s.charCodeAt(i);
    if (c === 43 || c === 45) i++;
    let expDigits = 0;
    for (; i < n; i++) {
      c = s.charCodeAt(i);
      if (c >= 48 && c <= 57) expDigits++;
      else break;
    }
    if (expDigits === 0) return TEXT;
  }
  if (i < n || digits === 0) return NAN_WORDS.has(s.toLowerCase()) ? NAN : TEXT;
  if (otherMarks > 0) return OTHER_MARK;
  if (marks > 1) return TEXT;
  const value = Number(marks && decimal === ',' ? s.replace(',', '.') : s);
  return Number.isFinite(value) ? { kind: 'number', value } : TEXT;
}

/** Whether a cell looks like a number with either decimal mark (for sniffing). */
export const looksNumeric = (s: string): boolean =>
  /^\s*[+-]?(\d+([.,]\d*)?|[.,]\d+)([eE][+-]?\d+)?\s*$/.test(s);

const POW10 = [1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15];

/**
 * The fast path of readCell for the common cell: an optional sign, digits and at most one decimal mark, nothing
 * else. Returns NaN for anything else (empty, spaces, exponent, text), which readCell then classifies. The digits
 * are read as one integer and divided by a power of ten: both exact (at most 15 digits), so the one rounding gives
 * the same double as Number() of the text.
 */
export function plainNumber(s: string, decimal: '.' | ','): number {
  return plainNumberIn(s, 0, s.length, decimal);
}

/** plainNumber of text[from, to), read in place so a row's cells need not become strings. */
export function plainNumberIn(text: string, from: number, to: number, decimal: '.' | ','): number {
  if (to <= from || to - from > 17) return NaN;
  const mark = decimal === '.' ? 46 : 44;
  let i = from;
  let c = text.charCodeAt(i);
  const negative = c === 45;
  if (negative || c === 43) i++;
  let mantissa = 0;
  let digits = 0;
  let frac = -1;
  for (; i < to; i++) {
    c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      mantissa = mantissa * 10 + (c - 48);
      digits++;
      if (frac >= 0) frac++;
    } else if (c === mark && frac < 0) frac = 0;
    else return NaN;
  }
  return exactDecimal(negative, mantissa, digits, frac);
}

/**
 * The number a sign, an integer of `digits` digits and `frac` of them after the mark make; NaN beyond 15 digits,
 * where the integer may not be exact (readCell's Number() takes over).
 */
export function exactDecimal(negative: boolean, mantissa: number, digits: number, frac: number): number {
  if (digits === 0 || digits > 15) return NaN;
  const v = frac > 0 ? mantissa / (POW10[frac] as number) : mantissa;
  return negative ? -v : v;
}
