// The corpus of bad and awkward parameter tables: each file, made here byte for byte, with the exact outcome it
// must have — imported (how many readings), quarantined rows (line and reason), or refused (the message).
import { describe, expect, it } from 'vitest';
import { parseSeamFile, type Reading, type SeamFile } from '../../../src/domain/index.js';
import {
  importTable,
  MAPPING_FORMAT,
  type ImportMapping,
  type TableOutcome,
} from '../../../src/domain/import/index.js';
import { buttSeam } from '../../support/seam-builder.js';

const seam = buttSeam();
const context = { importId: 'imp-1', seam, recordedAt: '2026-11-20T08:00:00Z' };
const HEADER = [
  'Position [mm]',
  'Angle L [deg]',
  'Angle R [deg]',
  'Height [mm]',
  'Width [mm]',
  'Undercut L [mm]',
];
const MAPPING: ImportMapping = {
  format: MAPPING_FORMAT,
  columns: {
    position: 'Position',
    'plate1.toeAngle': 'Angle L',
    'plate2.toeAngle': 'Angle R',
    reinforcementHeight: 'Height',
    reinforcementWidth: 'Width',
    'plate1.undercutDepth': 'Undercut L',
  },
};
const ROWS = [
  ['10', '150.5', '148', '2.1', '14', '0.1'],
  ['20', '151', '149', '2.0', '14.2', '0'],
];

const utf8 = (s: string) => new TextEncoder().encode(s);
function utf16(s: string, le: boolean, bom: boolean): Uint8Array {
  const out = new Uint8Array((s.length + (bom ? 1 : 0)) * 2);
  let at = 0;
  const put = (c: number) => {
    out[at++] = le ? c & 0xff : c >> 8;
    out[at++] = le ? c >> 8 : c & 0xff;
  };
  if (bom) put(0xfeff);
  for (let i = 0; i < s.length; i++) put(s.charCodeAt(i));
  return out;
}
const table = (rows: string[][], d = ',', nl = '\n', header = HEADER) =>
  [header, ...rows].map((r) => r.join(d)).join(nl) + nl;
const comma = (rows: string[][]) => rows.map((r) => r.map((c) => c.replace('.', ',')));

type Expected =
  | { readonly imported: number; readonly quarantined?: readonly (readonly [number, string])[] }
  | { readonly refused: string | RegExp };

interface Case {
  readonly name: string;
  readonly bytes: Uint8Array;
  readonly mapping?: ImportMapping;
  readonly expected: Expected;
  readonly check?: (o: TableOutcome) => void;
}

const values = (o: TableOutcome, id: string): Reading['values'] | undefined =>
  o.kind === 'read' ? o.readings.find((r) => r.id === id)?.values : undefined;

const CASES: Case[] = [
  { name: 'clean comma-separated table', bytes: utf8(table(ROWS)), expected: { imported: 6 } },
  {
    name: 'semicolons with decimal commas',
    bytes: utf8(table(comma(ROWS), ';')),
    expected: { imported: 6 },
    check: (o) => expect(values(o, 'imp-1-2a')?.toeAngle).toBe(150.5),
  },
  { name: 'tab-separated', bytes: utf8(table(ROWS, '\t')), expected: { imported: 6 } },
  { name: 'vertical bars', bytes: utf8(table(ROWS, '|')), expected: { imported: 6 } },
  {
    name: 'UTF-8 with a byte-order mark',
    bytes: utf8(`\uFEFF${table(ROWS)}`),
    expected: { imported: 6 },
    check: (o) => expect(o.kind === 'read' && o.bom && o.layout.columns[0]?.name).toBe('Position [mm]'),
  },
  {
    name: 'UTF-16 little-endian with a mark',
    bytes: utf16(table(ROWS), true, true),
    expected: { imported: 6 },
    check: (o) => expect(o.kind === 'read' && o.encoding).toBe('utf-16le'),
  },
  {
    name: 'UTF-16 big-endian with a mark',
    bytes: utf16(table(ROWS), false, true),
    expected: { imported: 6 },
    check: (o) => expect(o.kind === 'read' && o.encoding).toBe('utf-16be'),
  },
  {
    name: 'UTF-16 little-endian without a mark',
    bytes: utf16(table(ROWS), true, false),
    expected: { imported: 6 },
    check: (o) => expect(o.kind === 'read' && o.encoding).toBe('utf-16le'),
  },
  {
    name: 'Windows-1252 header with a degree sign',
    bytes: Uint8Array.from(
      [
        ...table(ROWS, ';', '\r\n', [
          'Position [mm]',
          'Angle L [°]',
          'Angle R [°]',
          'Height',
          'Width',
          'Undercut L',
        ]),
      ].map((c) => c.charCodeAt(0)),
    ),
    expected: { imported: 6 },
    check: (o) => {
      expect(o.kind === 'read' && o.encoding).toBe('windows-1252');
      expect(o.kind === 'read' && o.layout.columns[1]).toEqual({
        index: 2,
        name: 'Angle L [°]',
        unit: 'deg',
      });
    },
  },
  { name: 'Windows line ends', bytes: utf8(table(ROWS, ',', '\r\n')), expected: { imported: 6 } },
  { name: 'old Mac line ends (CR only)', bytes: utf8(table(ROWS, ',', '\r')), expected: { imported: 6 } },
  {
    name: 'a quoted field with a line break: later rows keep their file line numbers',
    bytes: utf8(
      `${[...HEADER, 'Note'].join(',')}\n10,150,148,2,14,0,"spatter\nnear toe"\n20,151,149,2,14,abc,ok\n`,
    ),
    mapping: MAPPING,
    expected: { imported: 3, quarantined: [[4, '"Undercut L [mm]": holds "abc", which is not a number']] },
  },
  {
    name: 'quoted fields holding the delimiter',
    bytes: utf8(`${HEADER.join(';')};Note\n"10";"150,5";148;2;14;0;"a; b"\n`),
    expected: { imported: 3 },
  },
  {
    name: 'mixed decimal marks: a point in a comma file',
    bytes: utf8(table([...comma(ROWS), ['30', '150', '149', '1.5', '14', '0']], ';')),
    expected: {
      imported: 6,
      quarantined: [
        [4, '"Height [mm]": holds "1.5" with a decimal point, but this file\'s decimal mark is the comma'],
      ],
    },
  },
  {
    name: 'the mapping names the wrong delimiter',
    bytes: utf8(table(comma(ROWS), ';')),
    mapping: { ...MAPPING, delimiter: ',' },
    expected: {
      refused:
        "The mapping says values are separated by commas, but this file uses semicolons: check the mapping's delimiter.",
    },
  },
  {
    name: 'a row with a missing column',
    bytes: utf8(table([...ROWS, ['30', '150', '149', '2', '14']])),
    expected: { imported: 6, quarantined: [[4, 'has 5 fields where the table has 6']] },
  },
  {
    name: 'a row with an extra column',
    bytes: utf8(table([...ROWS, ['30', '150', '149', '2', '14', '0', '7']])),
    expected: { imported: 6, quarantined: [[4, 'has 7 fields where the table has 6']] },
  },
  {
    name: 'a trailing delimiter on every row',
    bytes: utf8(`${[...HEADER, ''].join(',')}\n${ROWS.map((r) => `${r.join(',')},`).join('\n')}\n`),
    expected: { imported: 6 },
  },
  {
    name: 'text in a number column',
    bytes: utf8(table([['10', '150', 'n.m.', '2', '14', '0'], ...ROWS])),
    expected: { imported: 6, quarantined: [[2, '"Angle R [deg]": holds "n.m.", which is not a number']] },
  },
  {
    name: 'NaN from the scanner',
    bytes: utf8(table([...ROWS, ['30', 'NaN', '149', '2', '14', '0']])),
    expected: { imported: 6, quarantined: [[4, '"Angle L [deg]": holds "NaN": the scanner found no value']] },
  },
  {
    name: 'a negative undercut depth',
    bytes: utf8(table([...ROWS, ['30', '150', '149', '2', '14', '-0.2']])),
    expected: {
      imported: 6,
      quarantined: [[4, '"Undercut L [mm]": undercutDepth -0.2 mm must be at least 0 mm']],
    },
  },
  {
    name: 'a negative height',
    bytes: utf8(table([['30', '150', '149', '-2', '14', '0'], ...ROWS])),
    expected: {
      imported: 6,
      quarantined: [[2, '"Height [mm]": reinforcementHeight -2 mm must be at least 0 mm']],
    },
  },
  {
    name: 'angles in radians under a degree header: every row is out of range, so the file is refused',
    bytes: utf8(table(ROWS.map((r) => [r[0] ?? '', '2.62', '2.6', r[3] ?? '', r[4] ?? '', r[5] ?? '']))),
    expected: {
      refused:
        'None of the 2 data rows could be read; the first, on line 2, "Angle L [deg]": toeAngle 2.62° must be at least 90°: the column looks like radians.',
    },
  },
  {
    name: 'angles in radians without a unit: detected from the values',
    bytes: utf8(
      table(
        [
          ['10', '2.618', '2.6', '2', '14', '0'],
          ['20', '2.5', '2.65', '2', '14', '0'],
          ['30', '2.55', '2.6', '2', '14', '0'],
        ],
        ',',
        '\n',
        ['Position', 'Angle L', 'Angle R', 'Height', 'Width', 'Undercut L'],
      ),
    ),
    expected: { imported: 9 },
    check: (o) => {
      expect(values(o, 'imp-1-2a')?.toeAngle).toBeCloseTo(150, 2);
      expect(o.kind === 'read' && o.compiled.values[0]?.unitSource).toBe('detected from values');
    },
  },
  {
    name: 'lengths in micrometres, stated in the header',
    bytes: utf8(
      table([['10', '150', '149', '2100', '14000', '100']], ',', '\n', [
        'Position [mm]',
        'Angle L',
        'Angle R',
        'Height [µm]',
        'Width [um]',
        'Undercut L [µm]',
      ]),
    ),
    expected: { imported: 3 },
    check: (o) => {
      expect(values(o, 'imp-1-2s')?.reinforcementHeight).toBeCloseTo(2.1, 9);
      expect(values(o, 'imp-1-2a')?.undercutDepth).toBeCloseTo(0.1, 9);
    },
  },
  {
    name: 'lengths in inches, stated in the header',
    bytes: utf8(
      table([['1', '150', '149', '0.08', '0.55', '0']], ',', '\n', [
        'Position [in]',
        'Angle L',
        'Angle R',
        'Height [in]',
        'Width [in]',
        'Undercut L [in]',
      ]),
    ),
    expected: { imported: 3 },
    check: (o) => {
      expect(o.kind === 'read' && o.readings[0]?.position).toBeCloseTo(25.4, 9);
      expect(values(o, 'imp-1-2s')?.reinforcementWidth).toBeCloseTo(13.97, 9);
    },
  },
  { name: 'an empty file', bytes: new Uint8Array(0), expected: { refused: 'The file is empty.' } },
  {
    name: 'blank space only',
    bytes: utf8(' \n\r\n \t\n'),
    expected: { refused: 'The file holds only blank space.' },
  },
  {
    name: 'a header and no rows',
    bytes: utf8(`${HEADER.join(',')}\n`),
    expected: { refused: 'The file has a header but no data rows.' },
  },
  {
    name: 'a one-column file',
    bytes: utf8('Position\n10\n20\n30\n'),
    expected: {
      refused:
        'The file has only one column: no comma, semicolon, tab or vertical bar separates its values, so it is not a table this reader can map.',
    },
  },
  {
    name: 'binary garbage',
    bytes: Uint8Array.from({ length: 4096 }, (_, i) => (i * 7919 + 13) % 256),
    expected: { refused: /^The file is not a text table: it holds binary data/ },
  },
  {
    name: 'preamble lines before the header',
    bytes: utf8(`Scanner export\nOperator: A\n${table(ROWS)}`),
    expected: { imported: 6, quarantined: [] },
    check: (o) => expect(o.kind === 'read' && o.readings[0]?.id).toBe('imp-1-4a'),
  },
  {
    name: 'a units row under the header',
    bytes: utf8(
      `Position,Angle L,Angle R,Height,Width,Undercut L\nmm,rad,rad,um,um,um\n10,2.618,2.618,2000,14000,50\n`,
    ),
    expected: { imported: 3 },
    check: (o) => {
      expect(values(o, 'imp-1-3a')?.toeAngle).toBeCloseTo(150, 2);
      expect(values(o, 'imp-1-3s')?.reinforcementHeight).toBeCloseTo(2, 9);
    },
  },
  {
    name: 'no header: columns mapped by number',
    bytes: utf8(ROWS.map((r) => r.join(',')).join('\n')),
    mapping: {
      format: MAPPING_FORMAT,
      columns: {
        position: 1,
        'plate1.toeAngle': 2,
        'plate2.toeAngle': 3,
        reinforcementHeight: 4,
        reinforcementWidth: 5,
      },
    },
    expected: { imported: 6 },
    check: (o) => expect(o.kind === 'read' && o.layout.header).toBe(false),
  },
  {
    name: 'the mapping names a column the file lacks',
    bytes: utf8(table(ROWS)),
    mapping: { ...MAPPING, columns: { ...MAPPING.columns, reinforcementHeight: 'Hieght' } },
    expected: {
      refused:
        'The mapping puts reinforcementHeight in column "Hieght", which the file does not have (its columns: "Position [mm]", "Angle L [deg]", "Angle R [deg]", "Height [mm]", "Width [mm]", "Undercut L [mm]").',
    },
  },
  {
    name: 'no position column mapped',
    bytes: utf8(table(ROWS)),
    mapping: { format: MAPPING_FORMAT, columns: { 'plate1.toeAngle': 'Angle L' } },
    expected: { refused: 'No column is mapped to the position along the seam (target "position").' },
  },
  {
    name: 'height mapped without width',
    bytes: utf8(table(ROWS)),
    mapping: { format: MAPPING_FORMAT, columns: { position: 'Position', reinforcementHeight: 'Height' } },
    expected: {
      refused:
        'reinforcementHeight is mapped but reinforcementWidth is not: its limit depends on the width b of the same cross-section.',
    },
  },
  {
    name: 'a position beyond the seam',
    bytes: utf8(table([...ROWS, ['1200', '150', '149', '2', '14', '0']])),
    expected: {
      imported: 6,
      quarantined: [[4, '"Position [mm]": position 1200 mm lies beyond the seam\'s length of 1000 mm']],
    },
  },
  {
    name: 'blank lines between rows',
    bytes: utf8(`${HEADER.join(',')}\n\n${ROWS[0]?.join(',')}\n\n\n${ROWS[1]?.join(',')}\n`),
    expected: { imported: 6 },
    check: (o) => expect(o.kind === 'read' && o.readings[3]?.id).toBe('imp-1-6a'),
  },
  {
    name: 'a quote that is never closed',
    bytes: utf8(`${table(ROWS)}30,"150,149,2,14,0\n40,150,149,2,14,0\n`),
    expected: {
      refused:
        'The file cannot be read: an opening quote on line 4 is never closed, so the rest of the file would be read as one field.',
    },
  },
  {
    name: 'one row per toe with a toe column, and an unknown code',
    bytes: utf8('Pos;Side;Angle;Radius\n10;L;150;1,2\n10;R;148;0,9\n20;X;150;1\n'),
    mapping: {
      format: MAPPING_FORMAT,
      columns: { position: 'Pos', toe: 'Side', toeAngle: 'Angle', toeRadius: 'Radius' },
    },
    expected: {
      imported: 2,
      quarantined: [
        [
          4,
          '"Side": "x" names no toe; known codes: l, left, 1, p1, plate1, plate 1, r, right, 2, p2, plate2, plate 2',
        ],
      ],
    },
    check: (o) => expect(o.kind === 'read' && o.readings.map((r) => r.toe?.plate)).toEqual([1, 2]),
  },
  {
    name: 'a flank-angle column is stored as the toe angle',
    bytes: utf8('Pos,Flank L [deg]\n10,30\n'),
    mapping: { format: MAPPING_FORMAT, columns: { position: 'Pos', 'plate1.flankAngle': 'Flank L' } },
    expected: { imported: 1 },
    check: (o) => expect(values(o, 'imp-1-2a')).toEqual({ toeAngle: 150 }),
  },
  {
    name: 'a toe angle below 90°',
    bytes: utf8(table([...ROWS, ['30', '75', '149', '2', '14', '0']])),
    expected: { imported: 6, quarantined: [[4, '"Angle L [deg]": toeAngle 75° must be at least 90°']] },
  },
  {
    name: 'a throat column on a butt seam',
    bytes: utf8('Pos,Throat\n10,5\n'),
    mapping: { format: MAPPING_FORMAT, columns: { position: 'Pos', throat: 'Throat' } },
    expected: { refused: 'Column "Throat" holds throat, which does not apply to a butt joint.' },
  },
  {
    name: 'a row with a position and no values',
    bytes: utf8(table([...ROWS, ['30', '', '', '', '', '']])),
    expected: { imported: 6, quarantined: [[4, 'holds no measured value']] },
  },
  {
    name: 'a height whose width is missing in its row',
    bytes: utf8(table([...ROWS, ['30', '150', '149', '2', '', '0']])),
    expected: {
      imported: 6,
      quarantined: [[4, 'has a reinforcement height without its width (the limit uses the width b)']],
    },
  },
  {
    name: 'two targets in one column',
    bytes: utf8(table(ROWS)),
    mapping: { ...MAPPING, columns: { ...MAPPING.columns, 'plate2.toeAngle': 'Angle L' } },
    expected: {
      refused: 'The mapping puts both plate1.toeAngle and plate2.toeAngle in column "Angle L [deg]".',
    },
  },
  {
    name: 'an empty position cell',
    bytes: utf8(table([...ROWS, ['', '150', '149', '2', '14', '0']])),
    expected: { imported: 6, quarantined: [[4, '"Position [mm]": is empty; it needs a position']] },
  },
  {
    name: 'thousands separators',
    bytes: utf8(table([...ROWS, ['1,000.5', '150', '149', '2', '14', '0']], ';')),
    expected: {
      imported: 6,
      quarantined: [
        [
          4,
          '"Position [mm]": holds "1,000.5" with a decimal comma, but this file\'s decimal mark is the point',
        ],
      ],
    },
  },
  {
    name: 'plates of different thickness and a misalignment column without a basis',
    bytes: utf8('Pos,Offset\n10,0.5\n'),
    mapping: { format: MAPPING_FORMAT, columns: { position: 'Pos', linearMisalignment: 'Offset' } },
    expected: { refused: /^The plates differ in thickness/ },
  },
];

function run(c: Case): TableOutcome {
  const ctx = c.name.startsWith('plates of different')
    ? { ...context, seam: buttSeam({ plate2: { thickness: 12 } }) }
    : context;
  return importTable(c.bytes, { mapping: c.mapping ?? MAPPING, context: ctx });
}

describe('parameter-table corpus', () => {
  it('holds at least 40 bad or awkward files', () => {
    expect(CASES.length).toBeGreaterThanOrEqual(40);
  });

  it.each(CASES.map((c) => [c.name, c] as const))('%s', (_name, c) => {
    const o = run(c);
    const e = c.expected;
    if ('refused' in e) {
      expect(o.kind).toBe('refused');
      const message = o.kind === 'refused' ? o.refusal.message : '';
      if (typeof e.refused === 'string') expect(message).toBe(e.refused);
      else expect(message).toMatch(e.refused);
    } else {
      expect(o.kind === 'refused' ? o.refusal.message : 'read').toBe('read');
      if (o.kind !== 'read') return;
      expect(o.readings.length).toBe(e.imported);
      expect(o.quarantine.map((q) => [q.line, q.reason])).toEqual(e.quarantined ?? []);
      expect(o.sha256).toMatch(/^[0-9a-f]{64}$/);
      for (const r of o.readings) expect(r.source).toEqual({ kind: 'import', importId: 'imp-1' });
    }
    c.check?.(o);
  });

  it("every reading an import accepts passes the grader's own validation with its seam", () => {
    let checked = 0;
    for (const c of CASES) {
      const o = run(c);
      if (o.kind !== 'read' || c.name.startsWith('plates of different')) continue;
      const file: SeamFile = {
        format: 'beadbook.seam/1',
        units: { length: 'mm', angle: 'deg' },
        seam,
        rounds: [{ number: 1, kind: 'first', checklist: {} }],
        readings: o.readings,
      };
      const parsed = parseSeamFile(file);
      expect(parsed.ok ? [] : parsed.problems, c.name).toEqual([]);
      checked += o.readings.length;
    }
    expect(checked).toBeGreaterThan(100);
  });
});
