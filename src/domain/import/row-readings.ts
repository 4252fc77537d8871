// One data row to readings, or to a quarantine reason. The checks are the grader's own rules for a reading
// (ranges and units from model/parameters, what goes together), applied per row so a bad row is set aside with
// its line and reason instead of failing the file; test/unit/import checks that every accepted row passes
// parseSeamFile.
import { PARAMETERS, type ParameterName } from '../model/parameters.js';
import type { Reading, Seam, Values } from '../model/seam-file.js';
import { readCell } from './cells.js';
import type { CompiledMapping, CompiledValue } from './compile-mapping.js';
import type { ImportMapping } from './mapping.js';

export interface ImportContext {
  /** Names this import in each reading's source; at most 40 characters so reading ids stay within 64. */
  readonly importId: string;
  /** When given, rows are checked against the seam (its length, joint and plates) as the grader would. */
  readonly seam?: Seam;
  readonly round?: number;
  readonly recordedAt: string;
  readonly examiner?: { readonly name: string; readonly qualification?: string };
  readonly device?: string;
}

export type QuarantineCode =
  'fields' | 'position' | 'notNumber' | 'nan' | 'decimalMark' | 'range' | 'toe' | 'pairing' | 'noValues';

export interface QuarantinedRow {
  readonly line: number;
  readonly code: QuarantineCode;
  readonly reason: string;
}

type RowOutcome =
  | { readonly ok: true; readonly readings: Reading[] }
  | { readonly ok: false; readonly code: QuarantineCode; readonly reason: string };

const fmt = (x: number) => String(Number(x.toPrecision(6)));

function unitLabel(p: ParameterName): string {
  return PARAMETERS[p].unit === 'deg' ? '°' : ' mm';
}

function rangeProblem(v: CompiledValue, value: number, raw: number): string | null {
  const spec = PARAMETERS[v.parameter];
  const low = spec.minExclusive ? value <= spec.min : value < spec.min;
  if (!low && value <= spec.max) return null;
  const u = unitLabel(v.parameter);
  const bound = low
    ? `${spec.minExclusive ? 'greater than' : 'at least'} ${spec.min}${u}`
    : `at most ${spec.max}${u}`;
  let hint = '';
  if (v.unit === 'deg' && v.parameter === 'toeAngle' && raw >= 0 && raw <= Math.PI)
    hint = ': the column looks like radians';
  else if (v.unit === 'mm' && !low && raw > spec.max && raw / 1000 <= spec.max)
    hint = ': the column looks like micrometres';
  const shown = v.flank
    ? `${v.parameter} (from flank angle ${fmt(raw)}${v.unit === 'deg' ? '°' : ` ${v.unit}`})`
    : v.parameter;
  return `"${v.name}": ${shown} ${fmt(value)}${u} must be ${bound}${hint}`;
}

export class RowReader {
  private readonly sampling: Reading['sampling'];
  private readonly side: 'face' | 'root';
  private readonly instrument: Reading['instrument'];
  private readonly source: Reading['source'];
  private readonly round: number;

  constructor(
    private readonly compiled: CompiledMapping,
    private readonly mapping: ImportMapping,
    private readonly ctx: ImportContext,
  ) {
    this.sampling = mapping.sampling ?? 'atPitch';
    this.side = mapping.side ?? 'face';
    const inst = mapping.instrument;
    this.instrument = {
      id: inst?.id ?? 'scanner',
      kind: 'scanner',
      ...(inst?.resolutionMm !== undefined ? { resolutionMm: inst.resolutionMm } : {}),
      ...(inst?.resolutionDeg !== undefined ? { resolutionDeg: inst.resolutionDeg } : {}),
    };
    this.source = { kind: 'import', importId: ctx.importId };
    this.round = ctx.round ?? 1;
  }

  read(cells: readonly string[], line: number): RowOutcome {
    const c = this.compiled;
    if (cells.length !== c.width) {
      const extraEmpty = cells.length > c.width && cells.slice(c.width).every((x) => x.trim() === '');
      if (!extraEmpty) {
        return {
          ok: false,
          code: 'fields',
          reason: `has ${cells.length} field${cells.length === 1 ? '' : 's'} where the table has ${c.width}`,
        };
      }
    }
    const posCell = readCell(cells[c.position.column] ?? '', this.mapping.decimal ?? '.');
    if (posCell.kind !== 'number') {
      return {
        ok: false,
        code: 'position',
        reason: `"${c.position.name}": ${describe(posCell.kind, cells[c.position.column] ?? '', 'a position')}`,
      };
    }
    const position = posCell.value * c.position.factor + (this.mapping.positionOffset ?? 0);
    const seamLength = this.ctx.seam?.length;
    if (!(position >= 0) || (seamLength !== undefined && position > seamLength)) {
      return {
        ok: false,
        code: 'position',
        reason: `"${c.position.name}": position ${fmt(position)} mm lies ${position < 0 ? 'before the start mark' : `beyond the seam's length of ${seamLength} mm`}`,
      };
    }
    let rowPlate: 1 | 2 | 0 = this.mapping.toe?.plate ?? 0;
    if (c.toeColumn) {
      const code = (cells[c.toeColumn.column] ?? '').trim().toLowerCase();
      const plate = c.toeCodes.get(code);
      if (!plate) {
        return {
          ok: false,
          code: 'toe',
          reason: `"${c.toeColumn.name}": "${code}" names no toe; known codes: ${[...c.toeCodes.keys()].join(', ')}`,
        };
      }
      rowPlate = plate;
    }
    const byPlate: [
      Partial<Record<ParameterName, number>>,
      Partial<Record<ParameterName, number>>,
      Partial<Record<ParameterName, number>>,
    ] = [{}, {}, {}];
    const decimal = this.mapping.decimal ?? '.';
    let count = 0;
    for (const v of c.values) {
      const raw = cells[v.column] ?? '';
      const cell = readCell(raw, decimal);
      if (cell.kind === 'empty') continue;
      if (cell.kind !== 'number') {
        return {
          ok: false,
          code: cell.kind === 'nan' ? 'nan' : cell.kind === 'otherMark' ? 'decimalMark' : 'notNumber',
          reason: `"${v.name}": ${describe(cell.kind, raw, 'a number', decimal)}`,
        };
      }
      let value = cell.value * v.factor;
      if (v.flank) value = 180 - value;
      const problem = rangeProblem(v, value, cell.value);
      if (problem) return { ok: false, code: 'range', reason: problem };
      const slot =
        v.plate !== 0
          ? v.plate
          : PARAMETERS[v.parameter].per === 'toe'
            ? rowPlate
            : c.toeColumn || this.mapping.toe
              ? rowPlate
              : 0;
      byPlate[slot][v.parameter] = value;
      count++;
    }
    if (count === 0) return { ok: false, code: 'noValues', reason: 'holds no measured value' };
    const all = { ...byPlate[0], ...byPlate[1], ...byPlate[2] };
    if (all.reinforcementHeight !== undefined && all.reinforcementWidth === undefined) {
      return {
        ok: false,
        code: 'pairing',
        reason: 'has a reinforcement height without its width (the limit uses the width b)',
      };
    }
    if ((all.leg1 === undefined) !== (all.leg2 === undefined)) {
      return { ok: false, code: 'pairing', reason: 'has one leg length without the other' };
    }
    const readings: Reading[] = [];
    // A plain literal, then the optional fields: spreading per row made every reading a slow dictionary object.
    const make = (suffix: string, values: Values, toe: Reading['toe']): Reading => {
      const r: { -readonly [K in keyof Reading]: Reading[K] } = {
        id: `${this.ctx.importId}-${line}${suffix}`,
        round: this.round,
        position,
        sampling: this.sampling,
        values,
        instrument: this.instrument,
        source: this.source,
        recordedAt: this.ctx.recordedAt,
      };
      if (toe) r.toe = toe;
      else r.side = this.side;
      if (this.ctx.seam) r.seamId = this.ctx.seam.id;
      if (values.linearMisalignment !== undefined && this.mapping.misalignmentBasis) {
        r.misalignmentBasis = this.mapping.misalignmentBasis;
      }
      if (this.ctx.examiner) r.examiner = this.ctx.examiner;
      if (this.ctx.device) r.device = this.ctx.device;
      return r;
    };
    if (hasAny(byPlate[1])) readings.push(make('a', byPlate[1], { plate: 1, side: this.side }));
    if (hasAny(byPlate[2])) readings.push(make('b', byPlate[2], { plate: 2, side: this.side }));
    if (hasAny(byPlate[0])) readings.push(make('s', byPlate[0], undefined));
    return { ok: true, readings };
  }
}

function hasAny(o: object): boolean {
  for (const _ in o) return true;
  return false;
}

function describe(
  kind: 'empty' | 'nan' | 'otherMark' | 'text',
  raw: string,
  what: string,
  decimal: '.' | ',' = '.',
): string {
  const shown = raw.trim().length > 40 ? `${raw.trim().slice(0, 40)}…` : raw.trim();
  switch (kind) {
    case 'empty':
      return `is empty; it needs ${what}`;
    case 'nan':
      return `holds "${shown}": the scanner found no value`;
    case 'otherMark':
      return `holds "${shown}" with a decimal ${decimal === '.' ? 'comma' : 'point'}, but this file's decimal mark is the ${decimal === '.' ? 'point' : 'comma'}`;
    default:
      return `holds "${shown}", which is not ${what}`;
  }
}
