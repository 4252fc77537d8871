// What a table looks like, read from its first rows: delimiter, preamble, header, units row, decimal mark, and the
// columns with the units their headers name. A mapping may state any of these instead.
import type { ImportMapping } from './mapping.js';
import { looksNumeric } from './cells.js';
import { RowTokenizer, type Newline } from './row-tokenizer.js';
import { unitInText, type ImportUnit } from './units.js';

export type Delimiter = ',' | ';' | '\t' | '|';
export const DELIMITERS: readonly Delimiter[] = [',', ';', '\t', '|'];
export const DELIMITER_NAMES: Readonly<Record<Delimiter, string>> = {
  ',': 'comma',
  ';': 'semicolon',
  '\t': 'tab',
  '|': 'vertical bar',
};

export interface ColumnInfo {
  /** 1 = first column. */
  readonly index: number;
  readonly name: string;
  /** The unit the header or units row names, or null. */
  readonly unit: ImportUnit | null;
}

export interface TableLayout {
  readonly delimiter: Delimiter;
  readonly newline: Newline;
  readonly decimal: '.' | ',';
  readonly header: boolean;
  /** Lines before the data: preamble, header and units row. */
  readonly dataStartLine: number;
  readonly columns: readonly ColumnInfo[];
  /** Up to 20 data rows as written, with their lines. */
  readonly preview: readonly { readonly line: number; readonly cells: readonly string[] }[];
}

export type SniffResult =
  { readonly ok: true; readonly layout: TableLayout } | { readonly ok: false; readonly message: string };

interface Row {
  readonly cells: string[];
  readonly line: number;
}

const MAX_SNIFF_ROWS = 80;
const MAX_PREAMBLE = 30;

function rowsWith(sample: string, delimiter: string, newline: Newline, final: boolean): Row[] {
  const rows: Row[] = [];
  const tokenizer = new RowTokenizer(delimiter, newline);
  try {
    tokenizer.feed(sample, final, (cells, line) => {
      if (rows.length < MAX_SNIFF_ROWS && !(cells.length === 1 && (cells[0] as string).trim() === ''))
        rows.push({ cells, line });
    });
  } catch {
    // An unclosed quote in the sample: the rows before it still tell the layout; the full read reports it.
  }
  return rows;
}

function mode(counts: readonly number[]): number {
  const tally = new Map<number, number>();
  let best = 0;
  let bestN = 0;
  for (const c of counts) {
    const n = (tally.get(c) ?? 0) + 1;
    tally.set(c, n);
    if (n > bestN || (n === bestN && c > best)) {
      best = c;
      bestN = n;
    }
  }
  return best;
}

/** Reads the layout from the start of the file's text (a sample cut anywhere; `final` when it is the whole file). */
export function sniffLayout(
  sample: string,
  newline: Newline,
  final: boolean,
  mapping?: ImportMapping,
): SniffResult {
  interface Candidate {
    readonly d: Delimiter;
    readonly rows: Row[];
    readonly width: number;
    readonly score: number;
  }
  let best: Candidate | null = null;
  let stated: Candidate | null = null;
  for (const d of DELIMITERS) {
    const all = rowsWith(sample, d, newline, final);
    const rows = all.slice(mapping?.skipLines ? 0 : 0);
    if (!rows.length) continue;
    // The width most rows share; rows before the first of that width are preamble.
    const tail = rows.slice(Math.floor(rows.length / 5));
    const width = mode(tail.map((r) => r.cells.length));
    if (width < 2) continue;
    const consistent = rows.filter((r) => r.cells.length === width).length / rows.length;
    const cells = rows.slice(1).flatMap((r) => r.cells.filter((c) => c.trim() !== ''));
    const numeric = cells.length ? cells.filter(looksNumeric).length / cells.length : 0;
    const score = consistent + numeric;
    const candidate: Candidate = { d, rows, width, score };
    if (d === mapping?.delimiter) stated = candidate;
    if (!best || score > best.score + 1e-9) best = candidate;
  }
  if (mapping?.delimiter) {
    // A stated delimiter wins unless the file plainly uses another one.
    if (best && best.d !== mapping.delimiter && (!stated || best.score > stated.score + 0.3)) {
      return {
        ok: false,
        message: `The mapping says values are separated by ${DELIMITER_NAMES[mapping.delimiter]}s, but this file uses ${DELIMITER_NAMES[best.d]}s: check the mapping's delimiter.`,
      };
    }
    best = stated;
  }
  if (!best) {
    return {
      ok: false,
      message: mapping?.delimiter
        ? `The file has only one column when split at the ${DELIMITER_NAMES[mapping.delimiter]} the mapping names: check the mapping's delimiter.`
        : 'The file has only one column: no comma, semicolon, tab or vertical bar separates its values, so it is not a table this reader can map.',
    };
  }
  const { d: delimiter, width } = best;
  let rows = best.rows;
  const skip = mapping?.skipLines;
  if (skip !== undefined) rows = rows.filter((r) => r.line > skip);
  else {
    const first = rows.findIndex((r) => r.cells.length === width);
    if (first > MAX_PREAMBLE)
      return { ok: false, message: `No table found in the first ${MAX_PREAMBLE} rows.` };
    rows = rows.slice(Math.max(0, first));
  }
  const head = rows[0];
  if (!head) return { ok: false, message: 'The file holds no rows after its preamble.' };
  const headNumeric = head.cells.filter((c) => looksNumeric(c)).length;
  const header = mapping?.header ?? headNumeric < head.cells.length / 2;
  let dataAt = header ? 1 : 0;
  let units: (ImportUnit | null)[] = [];
  const unitsRow = header ? rows[1] : undefined;
  if (unitsRow && unitsRow.cells.every((c) => !looksNumeric(c))) {
    const found = unitsRow.cells.map((c) => unitInText(c));
    if (
      found.filter((u) => u !== null).length >= Math.max(1, unitsRow.cells.filter((c) => c.trim()).length / 2)
    ) {
      units = found;
      dataAt = 2;
    }
  }
  const data = rows.slice(dataAt);
  const dataStartLine = data[0]?.line ?? (rows[dataAt - 1]?.line ?? head.line) + 1;
  const names = header ? head.cells.map((c, i) => c.trim() || `column ${i + 1}`) : [];
  const columns: ColumnInfo[] = Array.from({ length: width }, (_, i) => {
    const name = names[i] ?? `column ${i + 1}`;
    return { index: i + 1, name, unit: units[i] ?? (header ? unitInText(name) : null) };
  });
  let decimal = mapping?.decimal;
  if (!decimal) {
    if (delimiter === ',') decimal = '.';
    else {
      let comma = 0;
      let point = 0;
      for (const r of data) {
        for (const c of r.cells) {
          if (/^\s*[+-]?\d*,\d+\s*$/.test(c)) comma++;
          else if (/^\s*[+-]?\d*\.\d+\s*$/.test(c)) point++;
        }
      }
      decimal = comma > point ? ',' : '.';
    }
  }
  return {
    ok: true,
    layout: {
      delimiter,
      newline,
      decimal,
      header,
      dataStartLine,
      columns,
      preview: data.slice(0, 20).map((r) => ({ line: r.line, cells: r.cells })),
    },
  };
}
