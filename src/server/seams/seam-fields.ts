// A seam set-up from named text fields: the supervisor's "New seam" form and each row of an imported seam list
// (CSV, read with papaparse, its columns mapped to these fields). Missing optional fields take the defaults named
// here; the result is checked by the grading core's own rules (checkSeamSetup), and every problem is reported
// with the row it came from. Nothing is created from a row that has a problem.
import Papa from 'papaparse';
import { randomUuid } from '../../protocol/index.js';

export const SEAM_FIELDS = [
  { key: 'id', label: 'Seam id (made when empty)', required: false },
  { key: 'label', label: 'Label', required: true },
  { key: 'jointType', label: 'Joint (butt, filletT, cruciform, lap)', required: true },
  { key: 'preparation', label: 'Preparation (singleV, doubleV, fillet, …)', required: false },
  { key: 'sides', label: 'Sides (one, two; default one)', required: false },
  { key: 'setting', label: 'Setting (shopFlat, site; default shopFlat)', required: false },
  { key: 't1', label: 'Plate 1 thickness t1 (mm)', required: true },
  { key: 't2', label: 'Plate 2 thickness t2 (mm; default t1)', required: false },
  { key: 'nominalThroat', label: 'Nominal throat a (mm, fillet welds)', required: false },
  { key: 'length', label: 'Length (mm)', required: true },
  { key: 'material', label: 'Material', required: true },
  { key: 'materialGroup', label: 'ISO/TR 15608 group', required: false },
  { key: 'materialKind', label: 'Material kind (steel, aluminium; default steel)', required: false },
  {
    key: 'edition',
    label: 'Acceptance criteria (ISO 5817:2014 or ISO 5817:2023; default 2014)',
    required: false,
  },
  { key: 'level', label: 'Required level (B, C, D; default C)', required: false },
  { key: 'process', label: 'Welding process (ISO 4063 number)', required: false },
  { key: 'welder', label: 'Welder', required: false },
  { key: 'procedure', label: 'Procedure (WPS)', required: false },
  { key: 'drawing', label: 'Drawing', required: false },
  { key: 'drawingPosition', label: 'Position on the drawing', required: false },
  { key: 'area', label: 'Area', required: false },
  { key: 'organisation', label: 'Organisation', required: false },
  { key: 'tags', label: 'Tags (separated by ;)', required: false },
] as const;

export type SeamField = (typeof SEAM_FIELDS)[number]['key'];
export type SeamValues = Partial<Record<SeamField, string>>;

const num = (text: string | undefined): number | undefined => {
  if (text === undefined || text.trim() === '') return undefined;
  const n = Number(text.trim().replace(',', '.'));
  return Number.isFinite(n) ? n : Number.NaN;
};

const opt = <K extends string, V>(key: K, value: V | undefined): { [P in K]?: V } =>
  (value === undefined || value === '' ? {} : { [key]: value }) as { [P in K]?: V };

/**
 * The seam set-up the fields describe, before checking: unknown words are passed through for the check to name.
 * A number that is not one stays NaN, which the check refuses with the field's name.
 */
export function seamFromValues(values: SeamValues, newId: () => string = randomUuid): unknown {
  const v = (k: SeamField) => values[k]?.trim() || undefined;
  const t1 = num(v('t1'));
  const tags = v('tags')
    ?.split(';')
    .map((t) => t.trim())
    .filter(Boolean);
  return {
    id: v('id') ?? newId(),
    label: v('label') ?? '',
    joint: {
      type: v('jointType') ?? '',
      ...opt('preparation', v('preparation')),
      sides: v('sides') ?? 'one',
      setting: v('setting') ?? 'shopFlat',
    },
    plate1: { thickness: t1 },
    plate2: { thickness: num(v('t2')) ?? t1 },
    ...opt('nominalThroat', num(v('nominalThroat'))),
    material: {
      name: v('material') ?? '',
      ...opt('group', v('materialGroup')),
      kind: v('materialKind') ?? 'steel',
    },
    length: num(v('length')),
    circumferential: false,
    surface: 'asWelded',
    acceptance: { edition: v('edition') ?? 'ISO 5817:2014', level: v('level') ?? 'C' },
    ...opt('process', v('process')),
    ...opt('welder', v('welder')),
    ...opt('procedure', v('procedure')),
    ...opt('drawing', v('drawing')),
    ...opt('drawingPosition', v('drawingPosition')),
    ...opt('area', v('area')),
    ...opt('organisation', v('organisation')),
    ...(tags?.length ? { tags } : {}),
  };
}

export interface ParsedList {
  readonly headers: readonly string[];
  readonly rows: readonly Record<string, string>[];
  /** The line of the file each row starts on (1 is the header), so a problem names the line to look at. */
  readonly lines: readonly number[];
  readonly problems: readonly { readonly line: number; readonly message: string }[];
}

/** Reads a seam list: a header row, then one seam per row (a quoted value may span lines). */
export function parseSeamList(csv: string): ParsedList {
  const text = csv.replace(/^\uFEFF/, '');
  const rows: Record<string, string>[] = [];
  const lines: number[] = [];
  const problems: { line: number; message: string }[] = [];
  let headers: string[] | null = null;
  // Lines are counted incrementally up to where each row starts (papaparse reports where the last one ended).
  let counted = 0;
  let line = 1;
  let rowStart = 0;
  const lineAt = (index: number) => {
    for (; counted < index; counted++) if (text.charCodeAt(counted) === 10) line++;
    return line;
  };
  Papa.parse<string[]>(text, {
    skipEmptyLines: 'greedy',
    step: (result) => {
      let start = rowStart;
      // Blank lines before the row are skipped by the parser; the row starts at its first character.
      while (start < text.length && /[\r\n]/.test(text.charAt(start))) start++;
      const at = lineAt(start);
      rowStart = result.meta.cursor;
      for (const e of result.errors) problems.push({ line: at, message: e.message });
      const cells = result.data;
      if (headers === null) {
        headers = cells.map((h) => h.trim());
        const seen = new Set<string>();
        for (const h of headers) {
          if (h !== '' && seen.has(h))
            problems.push({ line: at, message: `the column "${h}" is named twice` });
          seen.add(h);
        }
        return;
      }
      const named = headers;
      if (cells.length > named.length && cells.slice(named.length).some((c) => c.trim() !== ''))
        problems.push({
          line: at,
          message: `${cells.length} values where the header names ${named.length} columns`,
        });
      rows.push(Object.fromEntries(named.map((h, i) => [h, cells[i] ?? ''])));
      lines.push(at);
    },
  });
  return { headers: (headers ?? ([] as string[])).filter((h) => h !== ''), rows, lines, problems };
}

const squash = (text: string) => text.toLowerCase().replace(/[^a-z0-9]/g, '');

/** A first guess at the mapping: a column whose name matches the field's key or the start of its label. */
export function guessMapping(headers: readonly string[]): Partial<Record<SeamField, string>> {
  const out: Partial<Record<SeamField, string>> = {};
  for (const f of SEAM_FIELDS) {
    const names = [squash(f.key), squash(f.label.split('(')[0] ?? '')];
    const hit = headers.find((h) => names.includes(squash(h)));
    if (hit) out[f.key] = hit;
  }
  return out;
}

/** The field values of one row under a mapping (field → column name). */
export function rowValues(
  row: Readonly<Record<string, string>>,
  mapping: Partial<Record<SeamField, string>>,
) {
  const values: SeamValues = {};
  for (const f of SEAM_FIELDS) {
    const column = mapping[f.key];
    if (column) values[f.key] = row[column] ?? '';
  }
  return values;
}
