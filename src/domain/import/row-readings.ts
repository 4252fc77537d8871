// One data row to readings, or to a quarantine reason. The checks are the grader's own rules for a reading
// (ranges and units from model/parameters, what goes together), applied per row so a bad row is set aside with
// its line and reason instead of failing the file; test/unit/import checks that every accepted row passes
// parseSeamFile.
import { PARAMETERS, type ParameterName } from '../model/parameters.js';
import type { Reading, Seam, Values } from '../model/seam-file.js';
import { readCell } from './cells.js';
import type { CompiledMapping, CompiledValue } from './compile-mapping.js';
import type { ImportMapping } from './mapping.js';
import type { RowCells } from './row-cells.js';

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

const ACCEPTED = { ok: true } as const;

type RowOutcome =
  typeof ACCEPTED | { readonly ok: false; readonly code: QuarantineCode; readonly reason: string };

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
  private readonly toe1: NonNullable<Reading['toe']>;
  private readonly toe2: NonNullable<Reading['toe']>;
  private readonly decimal: '.' | ',';
  private readonly idPrefix: string;
  private readonly toeByRaw = new Map<string, 0 | 1 | 2>();
  private readonly found: Float64Array;
  private readonly valueTemplates = new Map<number, Partial<Record<ParameterName, number>>>();
  private readonly readingTemplates: (Reading | undefined)[] = [];
  /** Per mapped value, what each row needs of its parameter's spec, looked up once instead of per cell. */
  private readonly specs: (typeof PARAMETERS)[ParameterName][];
  /** Per mapped value: its slot when fixed by the mapping (0, 1, 2), or -1 when it is the row's toe. */
  private readonly fixedSlot: Int8Array;
  /** Per mapped value: 1 height, 2 width, 3 a leg, 0 anything else (the pairs checked per row). */
  private readonly pairing: Uint8Array;

  constructor(
    private readonly compiled: CompiledMapping,
    private readonly mapping: ImportMapping,
    private readonly ctx: ImportContext,
  ) {
    this.sampling = mapping.sampling ?? 'atPitch';
    this.decimal = mapping.decimal ?? '.';
    this.idPrefix = `${ctx.importId}-`;
    // One bit per mapped value in the slot masks: a mapping names at most 30 targets.
    if (compiled.values.length > 31) throw new Error('a mapping maps at most 31 values');
    this.found = new Float64Array(compiled.values.length);
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
    this.toe1 = { plate: 1, side: this.side };
    this.toe2 = { plate: 2, side: this.side };
    const n = compiled.values.length;
    this.specs = compiled.values.map((v) => PARAMETERS[v.parameter]);
    this.fixedSlot = new Int8Array(n);
    this.pairing = new Uint8Array(n);
    const toeFromRow = Boolean(compiled.toeColumn) || Boolean(mapping.toe);
    for (let k = 0; k < n; k++) {
      const v = compiled.values[k] as CompiledValue;
      const spec = this.specs[k] as (typeof PARAMETERS)[ParameterName];
      this.fixedSlot[k] = v.plate !== 0 ? v.plate : spec.per === 'toe' || toeFromRow ? -1 : 0;
      const p = v.parameter;
      this.pairing[k] =
        p === 'reinforcementHeight'
          ? 1
          : p === 'reinforcementWidth'
            ? 2
            : p === 'leg1' || p === 'leg2'
              ? 3
              : 0;
    }
  }

  /** Appends the row's readings to `out`, or returns why the row is set aside (then `out` is untouched). */
  read(row: RowCells, line: number, out: Reading[]): RowOutcome {
    const c = this.compiled;
    const decimal = this.decimal;
    if (row.count !== c.width) {
      let extraEmpty = row.count > c.width;
      for (let i = c.width; extraEmpty && i < row.count; i++) extraEmpty = row.text(i).trim() === '';
      if (!extraEmpty) {
        return {
          ok: false,
          code: 'fields',
          reason: `has ${row.count} field${row.count === 1 ? '' : 's'} where the table has ${c.width}`,
        };
      }
    }
    let posValue = row.plainNumber(c.position.column, decimal);
    if (posValue !== posValue) {
      const posRaw = row.text(c.position.column);
      const posCell = readCell(posRaw, decimal);
      if (posCell.kind !== 'number') {
        return {
          ok: false,
          code: 'position',
          reason: `"${c.position.name}": ${describe(posCell.kind, posRaw, 'a position')}`,
        };
      }
      posValue = posCell.value;
    }
    const position = posValue * c.position.factor + (this.mapping.positionOffset ?? 0);
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
      const raw = row.text(c.toeColumn.column);
      // Most files repeat two or three codes: each raw spelling is normalised once.
      let plate = this.toeByRaw.get(raw);
      if (plate === undefined) {
        plate = c.toeCodes.get(raw.trim().toLowerCase()) ?? 0;
        if (this.toeByRaw.size < 64) this.toeByRaw.set(raw, plate);
      }
      if (!plate) {
        const code = raw.trim().toLowerCase();
        return {
          ok: false,
          code: 'toe',
          reason: `"${c.toeColumn.name}": "${code}" names no toe; known codes: ${[...c.toeCodes.keys()].join(', ')}`,
        };
      }
      rowPlate = plate;
    }
    // Values per slot (0: the cross-section, 1 and 2: the toes): which of the mapping's values each slot got
    // (bit k for c.values[k]), the numbers kept in this.found until the row is accepted.
    const found = this.found;
    let mask0 = 0;
    let mask1 = 0;
    let mask2 = 0;
    let count = 0;
    let hasHeight = false;
    let hasWidth = false;
    let legs = 0;
    for (let k = 0; k < c.values.length; k++) {
      const v = c.values[k] as CompiledValue;
      let num = row.plainNumber(v.column, decimal);
      if (num !== num) {
        const raw = row.text(v.column);
        const cell = readCell(raw, decimal);
        if (cell.kind === 'empty') continue;
        if (cell.kind !== 'number') {
          return {
            ok: false,
            code: cell.kind === 'nan' ? 'nan' : cell.kind === 'otherMark' ? 'decimalMark' : 'notNumber',
            reason: `"${v.name}": ${describe(cell.kind, raw, 'a number', decimal)}`,
          };
        }
        num = cell.value;
      }
      let value = num * v.factor;
      if (v.flank) value = 180 - value;
      const spec = this.specs[k] as (typeof PARAMETERS)[ParameterName];
      if ((spec.minExclusive ? value <= spec.min : value < spec.min) || value > spec.max) {
        return { ok: false, code: 'range', reason: rangeProblem(v, value, num) ?? 'out of range' };
      }
      const fixed = this.fixedSlot[k] as number;
      const slot = fixed >= 0 ? fixed : rowPlate;
      found[k] = value;
      if (slot === 1) mask1 |= 1 << k;
      else if (slot === 2) mask2 |= 1 << k;
      else mask0 |= 1 << k;
      const pair = this.pairing[k];
      if (pair === 1) hasHeight = true;
      else if (pair === 2) hasWidth = true;
      else if (pair === 3) legs++;
      count++;
    }
    if (count === 0) return { ok: false, code: 'noValues', reason: 'holds no measured value' };
    if (hasHeight && !hasWidth) {
      return {
        ok: false,
        code: 'pairing',
        reason: 'has a reinforcement height without its width (the limit uses the width b)',
      };
    }
    if (legs === 1) return { ok: false, code: 'pairing', reason: 'has one leg length without the other' };
    if (mask1) out.push(this.reading(`${line}a`, position, this.values(mask1), this.toe1));
    if (mask2) out.push(this.reading(`${line}b`, position, this.values(mask2), this.toe2));
    if (mask0) out.push(this.reading(`${line}s`, position, this.values(mask0), undefined));
    return ACCEPTED;
  }

  /**
   * The values object for the mapping's values in `mask`. Each combination is laid out once as a template (keys in
   * mapping order) and copied: a copy of a template keeps its properties inside the object, where adding them one
   * by one made a slower object with a separate property store, per row.
   */
  private values(mask: number): Values {
    const c = this.compiled;
    let template = this.valueTemplates.get(mask);
    if (!template) {
      template = {};
      // Numbers that are not small integers, so the template's fields are laid out for any measured value.
      for (let k = 0; k < c.values.length; k++)
        if ((mask >> k) & 1) template[(c.values[k] as CompiledValue).parameter] = 0.5;
      this.valueTemplates.set(mask, template);
    }
    const out: Partial<Record<ParameterName, number>> = { ...template };
    for (let k = 0; k < c.values.length; k++) {
      if ((mask >> k) & 1) out[(c.values[k] as CompiledValue).parameter] = this.found[k] as number;
    }
    return out;
  }

  /** The reading, copied from a template of its kind (see values) with its own id, position and values. */
  private reading(idTail: string, position: number, values: Values, toe: Reading['toe']): Reading {
    const withBasis = values.linearMisalignment !== undefined;
    const kind = (toe === this.toe1 ? 0 : toe === this.toe2 ? 1 : 2) + (withBasis ? 3 : 0);
    const template = (this.readingTemplates[kind] ??= this.layout(
      withBasis ? { linearMisalignment: 0.5 } : {},
      toe,
    ));
    const r: { -readonly [K in keyof Reading]: Reading[K] } = { ...template };
    r.id = this.idPrefix + idTail;
    r.position = position;
    r.values = values;
    return r;
  }

  // The template of a kind of reading: its fields in the order they are written, id, position and values as
  // placeholders.
  private layout(values: Values, toe: Reading['toe']): Reading {
    const r: { -readonly [K in keyof Reading]: Reading[K] } = {
      id: this.idPrefix,
      round: this.round,
      position: 0.5,
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
  }
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
