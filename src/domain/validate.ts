import * as v from 'valibot';
import { EXECUTION_CLASS_PRESETS } from './criteria/presets.js';
import { BUILT_IN_CRITERIA } from './criteria/registry.js';
import { CHECKLIST_RULES } from './grade/checklist.js';
import { jointFamily, readingSide } from './model/joint.js';
import { PARAMETERS, PARAMETER_NAMES, type ParameterName } from './model/parameters.js';
import {
  EDITIONS,
  MAX_READINGS,
  seamFileSchema,
  seamRecordSchema,
  type Edition,
  type Reading,
  type SeamFile,
} from './model/seam-file.js';
import { toProblems, type Problem } from './model/schema-kit.js';

export type Parsed<T> =
  { readonly ok: true; readonly value: T } | { readonly ok: false; readonly problems: Problem[] };

/** The ISO 6520-1 numbers an override may name in an edition: its gauge rows and the checklist items. */
function knownRefs(edition: Edition): Set<string> {
  const refs = new Set<string>();
  for (const row of BUILT_IN_CRITERIA[edition].rows) row.refs.forEach((r) => refs.add(r));
  for (const rule of Object.values(CHECKLIST_RULES)) refs.add(rule.ref);
  return refs;
}
const KNOWN_REFS = new Map(EDITIONS.map((e) => [e, knownRefs(e)]));

function checkSeam(file: SeamFile, problems: Problem[]): void {
  const { seam } = file;
  const acc = seam.acceptance;
  if (acc.level === undefined && acc.preset === undefined) {
    problems.push({
      path: 'seam.acceptance',
      message: 'needs a required level ("B", "C" or "D") or an execution-class preset ("EXC1"…"EXC4")',
    });
  }
  if (
    acc.level !== undefined &&
    acc.preset !== undefined &&
    EXECUTION_CLASS_PRESETS[acc.preset].level !== acc.level
  ) {
    problems.push({
      path: 'seam.acceptance.level',
      message: `${acc.preset} asks level ${EXECUTION_CLASS_PRESETS[acc.preset].level} but level says ${acc.level}: give one of them, or use overrides for single imperfections`,
    });
  }
  const known = KNOWN_REFS.get(acc.edition) ?? new Set<string>();
  for (const key of Object.keys(acc.overrides ?? {})) {
    if (!known.has(key)) {
      problems.push({
        path: `seam.acceptance.overrides.${key}`,
        message: `not an ISO 6520-1 number ${acc.edition} grades; known: ${[...known].sort().join(', ')}`,
      });
    }
  }
  const family = jointFamily(seam.joint.type);
  if (family === 'butt' && (seam.nominalThroat !== undefined || seam.nominalLegs !== undefined)) {
    problems.push({
      path: 'seam.nominalThroat',
      message: 'a butt joint has no fillet throat or legs; remove them or choose a fillet joint type',
    });
  }
  if (family === 'fillet' && seam.buttThickness !== undefined) {
    problems.push({
      path: 'seam.buttThickness',
      message: 'butt-weld thickness s applies to butt joints only',
    });
  }
}

function checkPosition(
  r: Reading,
  i: number,
  length: number,
  circumferential: boolean,
  problems: Problem[],
): void {
  const at = `readings[${i}]`;
  const hasPoint = r.position !== undefined;
  const hasStart = r.start !== undefined;
  const hasEnd = r.end !== undefined;
  if (hasPoint && (hasStart || hasEnd)) {
    problems.push({
      path: at,
      message: 'give either position, or start and end for an imperfection with length, not both',
    });
    return;
  }
  if (!hasPoint && !(hasStart && hasEnd)) {
    problems.push({
      path: at,
      message:
        hasStart || hasEnd
          ? 'start and end go together'
          : 'needs a position (mm from the start mark), or start and end',
    });
    return;
  }
  for (const key of ['position', 'start', 'end'] as const) {
    const x = r[key];
    if (x !== undefined && x > length) {
      problems.push({
        path: `${at}.${key}`,
        message: `lies beyond the seam's length of ${length} mm; got ${x}`,
      });
    }
  }
  if (hasStart && hasEnd && (r.start as number) >= (r.end as number) && !circumferential) {
    problems.push({
      path: `${at}.end`,
      message: `must be greater than start (${r.start} mm); only a circumferential seam may run past its start mark`,
    });
  }
  if (hasStart && hasEnd) {
    const longParams = PARAMETER_NAMES.filter((n) => r.values[n] !== undefined && !PARAMETERS[n].hasLength);
    if (longParams.length) {
      problems.push({
        path: `${at}.values`,
        message: `${longParams.join(', ')} ${longParams.length > 1 ? 'are' : 'is'} measured at a position, not along a length: record ${longParams.length > 1 ? 'them' : 'it'} in a reading with a position`,
      });
    }
  }
}

function checkWithdrawal(r: Reading, i: number, problems: Problem[]): void {
  if (r.supersedes === undefined) {
    problems.push({
      path: `readings[${i}].supersedes`,
      message: 'a withdrawal must name the reading it withdraws',
    });
  }
  if (PARAMETER_NAMES.some((n) => r.values[n] !== undefined)) {
    problems.push({
      path: `readings[${i}].values`,
      message: 'a withdrawal carries no values: record a correction instead',
    });
  }
}

const PARAMETER_ORDER = new Map<string, number>(PARAMETER_NAMES.map((name, i) => [name, i]));

/**
 * The parameters a reading holds a value for, in PARAMETER_NAMES order (the order problems are reported in). A
 * reading holds a few of the many parameters, so its own keys are the shorter list to walk.
 */
function presentValues(values: Reading['values']): ParameterName[] {
  const present = (Object.keys(values) as ParameterName[]).filter((n) => values[n] !== undefined);
  return present.length > 1
    ? present.sort((a, b) => (PARAMETER_ORDER.get(a) ?? 0) - (PARAMETER_ORDER.get(b) ?? 0))
    : present;
}

function checkValues(file: SeamFile, r: Reading, i: number, problems: Problem[]): void {
  const { seam } = file;
  const at = `readings[${i}]`;
  const family = jointFamily(seam.joint.type);
  const present = presentValues(r.values);
  if (!present.length)
    problems.push({
      path: `${at}.values`,
      message: `holds no measured value; give at least one of: ${PARAMETER_NAMES.join(', ')}`,
    });
  if (r.toe && r.side && r.toe.side !== r.side) {
    problems.push({
      path: `${at}.side`,
      message: `disagrees with toe.side ("${r.toe.side}"); give one of them`,
    });
  }
  const side = readingSide(r);
  for (const name of present) {
    const p = PARAMETERS[name];
    const path = `${at}.values.${name}`;
    if (!p.joints.includes(family)) {
      problems.push({
        path,
        message: `does not apply to a ${seam.joint.type} joint (it belongs to ${p.joints.join(' and ')} welds)`,
      });
      continue;
    }
    if (p.per === 'toe' && !r.toe)
      problems.push({
        path,
        message: 'is measured at a toe: the reading needs toe {plate: 1 or 2, side: "face" or "root"}',
      });
    if (p.per === 'side' && !side)
      problems.push({
        path,
        message: 'belongs to the face or the root: the reading needs side ("face" or "root") or a toe',
      });
  }
  const v = r.values;
  if (v.reinforcementHeight !== undefined && v.reinforcementWidth === undefined) {
    problems.push({
      path: `${at}.values.reinforcementWidth`,
      message:
        'is needed with reinforcementHeight: the limit is 1 mm + k·b, with b the width in the same cross-section',
    });
  }
  if (v.convexity !== undefined && v.reinforcementWidth === undefined) {
    problems.push({
      path: `${at}.values.reinforcementWidth`,
      message: 'is needed with convexity: the limit uses the fillet face width b',
    });
  }
  if (v.overlap !== undefined && v.reinforcementWidth === undefined) {
    problems.push({
      path: `${at}.values.reinforcementWidth`,
      message: 'is needed with overlap: the limit uses the weld face width b',
    });
  }
  if ((v.leg1 === undefined) !== (v.leg2 === undefined)) {
    problems.push({
      path: `${at}.values.${v.leg1 === undefined ? 'leg1' : 'leg2'}`,
      message: 'leg1 and leg2 go together: asymmetry is h = z1 − z2',
    });
  }
  // On a butt joint these values are already reported as not applying; asking for a throat would contradict that.
  if (
    family === 'fillet' &&
    (v.throat !== undefined || v.rootGap !== undefined || v.leg1 !== undefined) &&
    seam.nominalThroat === undefined
  ) {
    problems.push({
      path: 'seam.nominalThroat',
      message: `is needed to grade ${at}: the throat, root-gap and asymmetry limits are written in terms of the nominal throat a`,
    });
  }
  if (v.poreDiameter !== undefined && family === 'fillet' && seam.nominalThroat === undefined) {
    problems.push({
      path: 'seam.nominalThroat',
      message: `is needed to grade ${at}: the fillet pore limit is written in terms of the nominal throat a`,
    });
  }
  if (v.incompleteRootPenetration !== undefined && seam.joint.sides !== 'one') {
    problems.push({
      path: `${at}.values.incompleteRootPenetration`,
      message: 'applies to single-sided butt welds only (joint.sides is "two")',
    });
  }
  if (
    v.linearMisalignment !== undefined &&
    seam.plate1.thickness !== seam.plate2.thickness &&
    r.misalignmentBasis === undefined
  ) {
    problems.push({
      path: `${at}.misalignmentBasis`,
      message:
        'is needed when the plates differ in thickness: say whether the gauge read the "midPlane" offset, or the step on the "faceSurface" or "rootSurface"',
    });
  }
  if (r.seamId !== undefined && r.seamId !== seam.id) {
    problems.push({
      path: `${at}.seamId`,
      message: `belongs to seam "${r.seamId}", not to this file's seam "${seam.id}"`,
    });
  }
}

function checkReferences(file: SeamFile, problems: Problem[]): void {
  const rounds = new Set<number>();
  file.rounds.forEach((round, i) => {
    if (rounds.has(round.number))
      problems.push({ path: `rounds[${i}].number`, message: `round ${round.number} appears twice` });
    rounds.add(round.number);
    for (const [item, answer] of Object.entries(round.checklist)) {
      if (answer?.answer === 'present' && answer.position === undefined) {
        problems.push({
          path: `rounds[${i}].checklist.${item}.position`,
          message: 'is needed when the item is "present": where along the seam (mm)',
        });
      }
    }
  });
  const byId = new Map<string, { r: Reading; i: number }>();
  file.readings.forEach((r, i) => {
    if (byId.has(r.id))
      problems.push({
        path: `readings[${i}].id`,
        message: `"${r.id}" is used by another reading; ids must be unique`,
      });
    else byId.set(r.id, { r, i });
    if (!rounds.has(r.round))
      problems.push({
        path: `readings[${i}].round`,
        message: `round ${r.round} is not among the file's rounds (${[...rounds].join(', ')})`,
      });
  });
  const supersededBy = new Map<string, string>();
  file.readings.forEach((r, i) => {
    if (r.supersedes === undefined) return;
    const target = byId.get(r.supersedes);
    const path = `readings[${i}].supersedes`;
    if (!target)
      problems.push({ path, message: `names reading "${r.supersedes}", which is not in the file` });
    else if (r.supersedes === r.id) problems.push({ path, message: 'a reading cannot supersede itself' });
    else if (target.r.round !== r.round)
      problems.push({
        path,
        message: `a correction stays in its round: "${r.supersedes}" is in round ${target.r.round}`,
      });
    else if (supersededBy.has(r.supersedes))
      problems.push({
        path,
        message: `"${r.supersedes}" is already superseded by "${supersededBy.get(r.supersedes)}"; correct the latest reading instead`,
      });
    else supersededBy.set(r.supersedes, r.id);
  });
  // Corrections form chains; a loop would leave no current reading.
  for (const start of supersededBy.keys()) {
    const seen = new Set<string>([start]);
    let next = supersededBy.get(start);
    while (next !== undefined) {
      if (seen.has(next)) {
        problems.push({
          path: `readings[${byId.get(start)?.i ?? 0}].supersedes`,
          message: 'corrections form a loop',
        });
        break;
      }
      seen.add(next);
      next = supersededBy.get(next);
    }
  }
}

const MAX_PROBLEMS = 50;

/** Validates a seam file at the boundary: the schema first, then what relates fields to each other. */
export interface ParseOptions {
  /** Accept a seam with no readings yet (the app's own records); files handed to the grader need one. */
  readonly allowNoReadings?: boolean;
}

export function parseSeamFile(input: unknown, options: ParseOptions = {}): Parsed<SeamFile> {
  if (Array.isArray(input)) {
    return {
      ok: false,
      problems: [{ path: '(file)', message: 'seam file must be an object, got a list: give one seam file' }],
    };
  }
  // Every field is checked, but each field reports only its first fault (Infinity is "not finite", not also "too big").
  const schema = options.allowNoReadings ? seamRecordSchema : seamFileSchema;
  const parsed = v.safeParse(schema, input, { abortEarly: false, abortPipeEarly: true });
  if (!parsed.success) return { ok: false, problems: toProblems(parsed.issues).slice(0, MAX_PROBLEMS) };
  return crossChecked(parsed.output);
}

/**
 * parseSeamFile for readings that each passed the reading schema already (the server's stored records, judged one
 * by one when they arrived): the rest of the file goes through the schema, the reading count is bounded, and every
 * cross-field check runs on the whole file, so the answer is the one parseSeamFile gives for the same file. It saves
 * re-walking the schema of every reading each time a seam with thousands of them is graded again.
 */
export function parseSeamFileWithCheckedReadings(
  withoutReadings: unknown,
  readings: readonly Reading[],
  options: ParseOptions = {},
): Parsed<SeamFile> {
  const min = options.allowNoReadings ? 0 : 1;
  if (readings.length < min || readings.length > MAX_READINGS) {
    const message =
      readings.length < min
        ? 'readings must hold at least 1 item'
        : `readings holds ${readings.length} items; at most ${MAX_READINGS} are accepted`;
    return { ok: false, problems: [{ path: 'readings', message }] };
  }
  const rest =
    typeof withoutReadings === 'object' && withoutReadings !== null && !Array.isArray(withoutReadings)
      ? { ...withoutReadings, readings: [] }
      : withoutReadings;
  const parsed = v.safeParse(seamRecordSchema, rest, { abortEarly: false, abortPipeEarly: true });
  if (!parsed.success) return { ok: false, problems: toProblems(parsed.issues).slice(0, MAX_PROBLEMS) };
  return crossChecked({ ...parsed.output, readings: [...readings] });
}

/** What relates fields to each other, on a file whose fields each passed the schema. */
function crossChecked(file: SeamFile): Parsed<SeamFile> {
  const problems: Problem[] = [];
  checkSeam(file, problems);
  checkReferences(file, problems);
  file.readings.forEach((r, i) => {
    if (problems.length >= MAX_PROBLEMS) return;
    if (r.withdrawn) {
      checkWithdrawal(r, i, problems);
      return;
    }
    checkPosition(r, i, file.seam.length, file.seam.circumferential, problems);
    checkValues(file, r, i, problems);
  });
  return problems.length
    ? { ok: false, problems: problems.slice(0, MAX_PROBLEMS) }
    : { ok: true, value: file };
}
