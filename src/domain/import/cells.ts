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
