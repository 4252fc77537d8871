// The mapping file format, the first guess from header words, saved profiles matched by column layout, and units.
import { describe, expect, it } from 'vitest';
import {
  headerSignature,
  inspectTable,
  MAPPING_FORMAT,
  parseMapping,
  suggestColumns,
  unitInText,
} from '../../../src/domain/import/index.js';
import { choicesFrom, mappingFrom, targetLabel } from '../../../src/app/screens/import/import-view.js';

const utf8 = (s: string) => new TextEncoder().encode(s);

describe('mapping files', () => {
  it('accepts the documented example', () => {
    const r = parseMapping({
      format: MAPPING_FORMAT,
      source: 'line 3 seam scanner',
      delimiter: ';',
      decimal: ',',
      units: { length: 'mm', angle: 'deg' },
      toeCodes: { L: 1, R: 2 },
      columns: {
        position: 'Position',
        'plate2.toeAngle': { column: 'Angle R', unit: 'rad' },
        reinforcementHeight: 6,
        reinforcementWidth: 'Width',
      },
    });
    expect(r.ok).toBe(true);
  });

  it('names the field that is wrong: an unknown target, a bad unit, an unknown field, the wrong format', () => {
    const bad = (m: unknown) =>
      parseMapping(m).ok
        ? []
        : (parseMapping(m) as { problems: { path: string }[] }).problems.map((p) => p.path);
    expect(bad({ format: MAPPING_FORMAT, columns: { height: 'H' } })).toEqual(['columns.height']);
    expect(bad({ format: MAPPING_FORMAT, columns: { position: { column: 'P', unit: 'ft' } } })).toEqual([
      'columns.position',
    ]);
    expect(bad({ format: MAPPING_FORMAT, columns: {}, colour: 'red' })).toEqual(['colour']);
    expect(bad({ format: 'other/1', columns: {} })).toEqual(['format']);
  });
});

describe('first guess from header words', () => {
  it('maps common English headers, with the plate from L/R or 1/2', () => {
    expect(
      suggestColumns([
        'Pos [mm]',
        'Toe angle L',
        'Toe angle R',
        'Radius 1',
        'Radius 2',
        'Excess height',
        'Bead width',
        'Undercut left',
        'Misalignment',
      ]),
    ).toEqual({
      position: 1,
      'plate1.toeAngle': 2,
      'plate2.toeAngle': 3,
      'plate1.toeRadius': 4,
      'plate2.toeRadius': 5,
      reinforcementHeight: 6,
      reinforcementWidth: 7,
      'plate1.undercutDepth': 8,
      linearMisalignment: 9,
    });
  });

  it('reads units from headers and units rows', () => {
    expect(['Height [mm]', 'angle (rad)', 'h_um', 'µm', '°', 'Width [in]', 'Pos'].map(unitInText)).toEqual([
      'mm',
      'rad',
      'um',
      'um',
      'deg',
      'inch',
      null,
    ]);
  });
});

describe('inspectTable', () => {
  const file = utf8('Position;Angle L;Angle R\n10;150,5;148\n');

  it('suggests a mapping from the header words when no profile matches', () => {
    const r = inspectTable(file, true);
    expect(r.ok && r.suggested.columns).toEqual({
      position: 'Position',
      'plate1.toeAngle': 'Angle L',
      'plate2.toeAngle': 'Angle R',
    });
    expect(r.ok && r.fromProfile).toBe(false);
  });

  it('uses the saved profile of the same column layout, so the next file maps itself', () => {
    const saved = {
      format: MAPPING_FORMAT,
      source: 'line 3',
      columns: { position: 1, 'plate2.toeAngle': 2 },
    } as const;
    const r = inspectTable(file, true, {
      profiles: [{ signature: headerSignature(['Position', 'Angle L', 'Angle R']), mapping: saved }],
    });
    expect(r.ok && r.fromProfile).toBe(true);
    expect(r.ok && r.suggested).toEqual({ ...saved, delimiter: ';', decimal: ',', header: true });
  });

  it('refuses empty and binary heads with the same messages as the full read', () => {
    expect(inspectTable(new Uint8Array(0), true)).toEqual({ ok: false, message: 'The file is empty.' });
    expect(inspectTable(Uint8Array.from([0x50, 0x4b, 3, 4, 0, 0, 1, 2]), true)).toMatchObject({
      ok: false,
      message: /binary data/,
    });
  });
});

describe('Import screen mapping step', () => {
  it('turns the per-column choices into a mapping by column number, with units where chosen, and back', () => {
    const names = ['Position', 'Angle L', 'Angle R'];
    const base = {
      format: MAPPING_FORMAT,
      delimiter: ';',
      columns: { position: 'Position', 'plate1.toeAngle': 'angle l' },
    } as const;
    const choices = choicesFrom(base, names);
    expect(choices).toEqual([
      { target: 'position', unit: '' },
      { target: 'plate1.toeAngle', unit: '' },
      { target: '', unit: '' },
    ]);
    const edited = [...choices.slice(0, 2), { target: 'plate2.toeAngle' as const, unit: 'rad' as const }];
    const m = mappingFrom(base, edited);
    expect(m.columns).toEqual({
      position: 1,
      'plate1.toeAngle': 2,
      'plate2.toeAngle': { column: 3, unit: 'rad' },
    });
    expect(choicesFrom(m, names)).toEqual(edited);
    expect(targetLabel('plate2.toeRadius')).toBe('Toe radius, plate 2 toe');
  });
});
