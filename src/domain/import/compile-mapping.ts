// A mapping resolved against one file's columns: column numbers, units and factors, the toe codes, and the checks
// that refuse the whole file before any row is read (an unknown column, no position, a value the seam cannot take).
import { jointFamily } from '../model/joint.js';
import { PARAMETERS, type ParameterName } from '../model/parameters.js';
import type { Seam } from '../model/seam-file.js';
import {
  isAngleTarget,
  parameterOf,
  TOE_TARGETS,
  type ColumnRef,
  type ImportMapping,
  type Target,
  type ValueTarget,
} from './mapping.js';
import type { ColumnInfo, TableLayout } from './sniff.js';
import { readCell } from './cells.js';
import { isAngleUnit, UNIT_FACTOR, type ImportUnit } from './units.js';

export interface CompiledValue {
  readonly target: ValueTarget;
  readonly parameter: ParameterName;
  /** 0-based column. */
  readonly column: number;
  readonly name: string;
  readonly unit: ImportUnit;
  readonly unitSource: 'mapping' | 'header' | 'file default' | 'detected from values' | 'default';
  readonly factor: number;
  /** 1 or 2 for a per-plate toe value; 0 for a value whose toe comes from the row's toe column or the mapping. */
  readonly plate: 0 | 1 | 2;
  readonly flank: boolean;
}

export interface CompiledMapping {
  readonly position: {
    readonly column: number;
    readonly name: string;
    readonly unit: ImportUnit;
    readonly factor: number;
  };
  readonly toeColumn: { readonly column: number; readonly name: string } | null;
  readonly toeCodes: ReadonlyMap<string, 1 | 2>;
  readonly values: readonly CompiledValue[];
  readonly width: number;
}

export type Compiled =
  | { readonly ok: true; readonly compiled: CompiledMapping }
  | { readonly ok: false; readonly message: string };

const DEFAULT_TOE_CODES: [string, 1 | 2][] = [
  ['l', 1],
  ['left', 1],
  ['1', 1],
  ['p1', 1],
  ['plate1', 1],
  ['plate 1', 1],
  ['r', 2],
  ['right', 2],
  ['2', 2],
  ['p2', 2],
  ['plate2', 2],
  ['plate 2', 2],
];

const bare = (s: string) =>
  s
    .toLowerCase()
    .replace(/[[(].*?[\])]/g, '')
    .trim();

function findColumn(ref: ColumnRef, columns: readonly ColumnInfo[]): ColumnInfo | string {
  const key = typeof ref === 'object' ? ref.column : ref;
  if (typeof key === 'number') {
    return columns[key - 1] ?? `column ${key}, but the file has ${columns.length} columns`;
  }
  const want = key.trim().toLowerCase();
  const hit =
    columns.find((c) => c.name.trim().toLowerCase() === want) ??
    columns.find((c) => bare(c.name) === bare(want));
  return (
    hit ??
    `column "${key}", which the file does not have (its columns: ${columns.map((c) => `"${c.name}"`).join(', ')})`
  );
}

/** Radians are taken from the values only for toe and flank angles without a stated unit, where degrees cannot be that small. */
function unitFromValues(target: ValueTarget, column: number, layout: TableLayout): ImportUnit | null {
  const base = target.replace(/^plate[12]\./, '');
  if (base !== 'toeAngle' && base !== 'flankAngle') return null;
  const values = layout.preview
    .map((r) => readCell(r.cells[column] ?? '', layout.decimal))
    .flatMap((c) => (c.kind === 'number' ? [c.value] : []));
  if (values.length < 3) return null;
  const max = Math.max(...values);
  const min = Math.min(...values);
  if (base === 'toeAngle' && max <= Math.PI && min >= Math.PI / 2) return 'rad';
  if (base === 'flankAngle' && max <= Math.PI / 2 && max > 0.02) return 'rad';
  return null;
}

export function compileMapping(mapping: ImportMapping, layout: TableLayout, seam?: Seam): Compiled {
  const refuse = (message: string): Compiled => ({ ok: false, message });
  const cols = mapping.columns;
  const entries = Object.entries(cols) as [Target, ColumnRef][];
  const used = new Map<number, Target>();
  const resolve = (target: Target, ref: ColumnRef): ColumnInfo | string => {
    const c = findColumn(ref, layout.columns);
    if (typeof c === 'string') return `The mapping puts ${target} in ${c}.`;
    const other = used.get(c.index);
    if (other) return `The mapping puts both ${other} and ${target} in column "${c.name}".`;
    used.set(c.index, target);
    return c;
  };
  const posRef = cols.position;
  if (posRef === undefined)
    return refuse('No column is mapped to the position along the seam (target "position").');
  const pos = resolve('position', posRef);
  if (typeof pos === 'string') return refuse(pos);
  const posUnit =
    (typeof posRef === 'object' ? posRef.unit : undefined) ?? pos.unit ?? mapping.units?.length ?? 'mm';
  if (isAngleUnit(posUnit))
    return refuse(`The position column "${pos.name}" is in ${posUnit}; it must be a length.`);

  let toeColumn: CompiledMapping['toeColumn'] = null;
  if (cols.toe !== undefined) {
    const c = resolve('toe', cols.toe);
    if (typeof c === 'string') return refuse(c);
    toeColumn = { column: c.index - 1, name: c.name };
  }
  const toeCodes = new Map<string, 1 | 2>(
    mapping.toeCodes
      ? Object.entries(mapping.toeCodes).map(([k, p]) => [k.trim().toLowerCase(), p])
      : DEFAULT_TOE_CODES,
  );

  const values: CompiledValue[] = [];
  for (const [target, ref] of entries) {
    if (target === 'position' || target === 'toe') continue;
    const c = resolve(target, ref);
    if (typeof c === 'string') return refuse(c);
    const parameter = parameterOf(target);
    const spec = PARAMETERS[parameter];
    const angle = isAngleTarget(target);
    const stated = typeof ref === 'object' ? ref.unit : undefined;
    const fileDefault = angle ? mapping.units?.angle : mapping.units?.length;
    const fromValues = (stated ?? c.unit ?? fileDefault) ? null : unitFromValues(target, c.index - 1, layout);
    const unit: ImportUnit = stated ?? c.unit ?? fileDefault ?? fromValues ?? (angle ? 'deg' : 'mm');
    const unitSource: CompiledValue['unitSource'] = stated
      ? 'mapping'
      : c.unit
        ? 'header'
        : fileDefault
          ? 'file default'
          : fromValues
            ? 'detected from values'
            : 'default';
    if (isAngleUnit(unit) !== angle) {
      return refuse(
        `Column "${c.name}" is mapped to ${target} (${angle ? 'an angle' : 'a length'}) but is in ${unit}.`,
      );
    }
    const base = target.replace(/^plate[12]\./, '');
    const plate = target.startsWith('plate1.') ? 1 : target.startsWith('plate2.') ? 2 : 0;
    if (plate === 0 && (TOE_TARGETS as readonly string[]).includes(base) && !toeColumn && !mapping.toe) {
      return refuse(
        `${target} is measured at a toe: map it per plate ("plate1.${base}", "plate2.${base}"), map a "toe" column, or give the mapping a fixed "toe".`,
      );
    }
    if (seam && !spec.joints.includes(jointFamily(seam.joint.type))) {
      return refuse(
        `Column "${c.name}" holds ${parameter}, which does not apply to a ${seam.joint.type} joint.`,
      );
    }
    values.push({
      target,
      parameter,
      column: c.index - 1,
      name: c.name,
      unit,
      unitSource,
      factor: UNIT_FACTOR[unit],
      plate,
      flank: base === 'flankAngle',
    });
  }
  if (!values.length) return refuse('No column is mapped to a measured value: map at least one parameter.');
  const has = (p: ParameterName) => values.some((x) => x.parameter === p);
  const twice = values.find((x, i) =>
    values.some((y, j) => j < i && y.parameter === x.parameter && y.plate === x.plate),
  );
  if (twice)
    return refuse(
      `Two columns are mapped to ${twice.parameter}${twice.plate ? ` on plate ${twice.plate}` : ''}.`,
    );
  if (has('reinforcementHeight') && !has('reinforcementWidth')) {
    return refuse(
      'reinforcementHeight is mapped but reinforcementWidth is not: its limit depends on the width b of the same cross-section.',
    );
  }
  if (has('leg1') !== has('leg2')) return refuse('leg1 and leg2 go together: map both or neither.');
  if (seam) {
    const fillet = jointFamily(seam.joint.type) === 'fillet';
    if (
      fillet &&
      (has('throat') || has('rootGap') || has('leg1') || has('poreDiameter')) &&
      seam.nominalThroat === undefined
    ) {
      return refuse(
        'The seam has no nominal throat a, which the throat, root-gap, leg and pore limits need: set it up first.',
      );
    }
    if (
      has('linearMisalignment') &&
      seam.plate1.thickness !== seam.plate2.thickness &&
      !mapping.misalignmentBasis
    ) {
      return refuse(
        'The plates differ in thickness: say in the mapping whether the scanner reports the "midPlane" offset or the step on the "faceSurface" or "rootSurface" (misalignmentBasis).',
      );
    }
    if (has('incompleteRootPenetration') && seam.joint.sides !== 'one') {
      return refuse('incompleteRootPenetration applies to single-sided butt welds only.');
    }
  }
  const width = Math.max(layout.columns.length, ...[...used.keys()]);
  return {
    ok: true,
    compiled: {
      position: { column: pos.index - 1, name: pos.name, unit: posUnit, factor: UNIT_FACTOR[posUnit] },
      toeColumn,
      toeCodes,
      values,
      width,
    },
  };
}
