import {
  parseSeamFile,
  SEAM_FILE_FORMAT,
  type Edition,
  type ExecutionClass,
  type JointType,
  type Level,
  type Problem,
  type Seam,
} from '../../domain/index.js';

/** What the set-up form edits: strings for text, numbers or undefined for the NumberFields. */
export interface SetupForm {
  label: string;
  tags: string;
  drawing: string;
  drawingPosition: string;
  jointType: JointType;
  preparation: string;
  sides: 'one' | 'two';
  setting: 'shopFlat' | 'site';
  faceSideNote: string;
  t1: number | undefined;
  t2: number | undefined;
  buttThickness: number | undefined;
  nominalThroat: number | undefined;
  leg1: number | undefined;
  leg2: number | undefined;
  length: number | undefined;
  circumferential: boolean;
  surface: Seam['surface'];
  materialName: string;
  materialGroup: string;
  materialKind: 'steel' | 'aluminium';
  acceptanceMode: 'level' | 'preset';
  level: Level;
  preset: ExecutionClass;
  overrides: { ref: string; level: Level }[];
  edition: Edition;
  process: string;
  welder: string;
  procedure: string;
}

export type SetupField = keyof SetupForm | 'legs' | 'acceptance' | 'form';

export const isFillet = (t: JointType): boolean => t !== 'butt';

export function emptyForm(): SetupForm {
  return {
    label: '',
    tags: '',
    drawing: '',
    drawingPosition: '',
    jointType: 'butt',
    preparation: 'singleV',
    sides: 'one',
    setting: 'shopFlat',
    faceSideNote: '',
    t1: undefined,
    t2: undefined,
    buttThickness: undefined,
    nominalThroat: undefined,
    leg1: undefined,
    leg2: undefined,
    length: undefined,
    circumferential: false,
    surface: 'asWelded',
    materialName: '',
    materialGroup: '',
    materialKind: 'steel',
    acceptanceMode: 'level',
    level: 'C',
    preset: 'EXC2',
    overrides: [],
    edition: 'ISO 5817:2014',
    process: '',
    welder: '',
    procedure: '',
  };
}

export function formFromSeam(seam: Seam): SetupForm {
  const acc = seam.acceptance;
  return {
    label: seam.label,
    tags: (seam.tags ?? []).join(', '),
    drawing: seam.drawing ?? '',
    drawingPosition: seam.drawingPosition ?? '',
    jointType: seam.joint.type,
    preparation: seam.joint.preparation ?? '',
    sides: seam.joint.sides,
    setting: seam.joint.setting,
    faceSideNote: seam.joint.faceSideNote ?? '',
    t1: seam.plate1.thickness,
    t2: seam.plate2.thickness,
    buttThickness: seam.buttThickness,
    nominalThroat: seam.nominalThroat,
    leg1: seam.nominalLegs?.leg1,
    leg2: seam.nominalLegs?.leg2,
    length: seam.length,
    circumferential: seam.circumferential,
    surface: seam.surface,
    materialName: seam.material.name,
    materialGroup: seam.material.group ?? '',
    materialKind: seam.material.kind,
    acceptanceMode: acc.preset !== undefined ? 'preset' : 'level',
    level: acc.level ?? 'C',
    preset: acc.preset ?? 'EXC2',
    overrides: Object.entries(acc.overrides ?? {}).map(([ref, level]) => ({ ref, level })),
    edition: acc.edition,
    process: seam.process ?? '',
    welder: seam.welder ?? '',
    procedure: seam.procedure ?? '',
  };
}

/** Tags are typed as a list separated by commas or new lines; blanks and repeats are dropped. */
export function parseTags(text: string): string[] {
  const out: string[] = [];
  for (const t of text.split(/[,\n]/)) {
    const tag = t.trim();
    if (tag && !out.includes(tag)) out.push(tag);
  }
  return out;
}

/**
 * The seam the form describes, over `base` so fields the form does not show (fatigue, area, time welded) are
 * kept on an edit. Empty text and empty numbers are left out, so the validator names what is missing.
 */
export function seamFromForm(form: SetupForm, id: string, base?: Seam): Record<string, unknown> {
  const seam: Record<string, unknown> = { ...(base ?? {}), id };
  const put = (key: string, value: unknown) => {
    const blank = value === undefined || (typeof value === 'string' && value.trim() === '');
    seam[key] = blank ? undefined : typeof value === 'string' ? value.trim() : value;
  };
  put('label', form.label);
  const tags = parseTags(form.tags);
  put('tags', tags.length ? tags : undefined);
  put('drawing', form.drawing);
  put('drawingPosition', form.drawingPosition);
  const fillet = isFillet(form.jointType);
  const joint: Record<string, unknown> = { type: form.jointType, sides: form.sides, setting: form.setting };
  if (form.preparation) joint['preparation'] = form.preparation;
  if (form.sides === 'two' && form.faceSideNote.trim()) joint['faceSideNote'] = form.faceSideNote.trim();
  seam['joint'] = joint;
  seam['plate1'] = form.t1 === undefined ? {} : { thickness: form.t1 };
  seam['plate2'] = form.t2 === undefined ? {} : { thickness: form.t2 };
  put('buttThickness', fillet ? undefined : form.buttThickness);
  put('nominalThroat', fillet ? form.nominalThroat : undefined);
  if (fillet && (form.leg1 !== undefined || form.leg2 !== undefined)) {
    const legs: Record<string, number> = {};
    if (form.leg1 !== undefined) legs['leg1'] = form.leg1;
    if (form.leg2 !== undefined) legs['leg2'] = form.leg2;
    seam['nominalLegs'] = legs;
  } else seam['nominalLegs'] = undefined;
  put('length', form.length);
  seam['circumferential'] = form.circumferential;
  seam['surface'] = form.surface;
  const material: Record<string, unknown> = { kind: form.materialKind };
  if (form.materialName.trim()) material['name'] = form.materialName.trim();
  if (form.materialGroup.trim()) material['group'] = form.materialGroup.trim();
  seam['material'] = material;
  const acceptance: Record<string, unknown> = { edition: form.edition };
  if (form.acceptanceMode === 'level') acceptance['level'] = form.level;
  else acceptance['preset'] = form.preset;
  const overrides = form.overrides.filter((o) => o.ref.trim() !== '');
  if (overrides.length)
    acceptance['overrides'] = Object.fromEntries(overrides.map((o) => [o.ref.trim(), o.level]));
  seam['acceptance'] = acceptance;
  put('process', form.process);
  put('welder', form.welder);
  put('procedure', form.procedure);
  // Left-out fields are absent, not undefined: the record is closed and exact about optional fields.
  return Object.fromEntries(Object.entries(seam).filter(([, v]) => v !== undefined));
}

/** Where a validator path lands in the form: the longest known prefix wins. */
const FIELD_OF_PATH: readonly (readonly [string, SetupField])[] = [
  ['seam.label', 'label'],
  ['seam.tags', 'tags'],
  ['seam.drawingPosition', 'drawingPosition'],
  ['seam.drawing', 'drawing'],
  ['seam.joint.type', 'jointType'],
  ['seam.joint.preparation', 'preparation'],
  ['seam.joint.sides', 'sides'],
  ['seam.joint.setting', 'setting'],
  ['seam.joint.faceSideNote', 'faceSideNote'],
  ['seam.plate1', 't1'],
  ['seam.plate2', 't2'],
  ['seam.buttThickness', 'buttThickness'],
  ['seam.nominalThroat', 'nominalThroat'],
  ['seam.nominalLegs.leg1', 'leg1'],
  ['seam.nominalLegs.leg2', 'leg2'],
  ['seam.nominalLegs', 'legs'],
  ['seam.length', 'length'],
  ['seam.circumferential', 'circumferential'],
  ['seam.surface', 'surface'],
  ['seam.material.name', 'materialName'],
  ['seam.material.group', 'materialGroup'],
  ['seam.material.kind', 'materialKind'],
  ['seam.acceptance.level', 'level'],
  ['seam.acceptance.preset', 'preset'],
  ['seam.acceptance.overrides', 'overrides'],
  ['seam.acceptance.edition', 'edition'],
  ['seam.acceptance', 'acceptance'],
  ['seam.process', 'process'],
  ['seam.welder', 'welder'],
  ['seam.procedure', 'procedure'],
];

export function fieldOfPath(path: string): SetupField {
  let best: SetupField = 'form';
  let bestLen = -1;
  for (const [prefix, field] of FIELD_OF_PATH) {
    const hit = path === prefix || path.startsWith(`${prefix}.`) || path.startsWith(`${prefix}[`);
    if (hit && prefix.length > bestLen) {
      best = field;
      bestLen = prefix.length;
    }
  }
  return best;
}

/** What to say for an empty required field, in place of the validator's generic "required field is missing". */
const WHEN_EMPTY: Partial<Record<SetupField, string>> = {
  label: 'give the seam a label, e.g. the mark painted next to it',
  t1: 'enter the thickness of plate 1',
  t2: 'enter the thickness of plate 2',
  length: 'enter the seam length from the start mark to the end mark',
  materialName: 'enter the material, e.g. S355J2',
  leg1: 'enter both nominal legs, or neither',
  leg2: 'enter both nominal legs, or neither',
};

/** A validator message made plain: the field is already named by where the message is shown. */
export function plainMessage(field: SetupField, p: Problem): string {
  if (/required field .* is missing/.test(p.message)) return WHEN_EMPTY[field] ?? 'fill this in';
  if (field === 'overrides' && p.path.startsWith('seam.acceptance.overrides.')) {
    return `${p.path.slice('seam.acceptance.overrides.'.length)}: ${p.message}`;
  }
  return p.message;
}

export type SetupCheck =
  | { readonly ok: true; readonly seam: Seam }
  | { readonly ok: false; readonly errors: Partial<Record<SetupField, string[]>> };

/** Checks the form the way the grader will: as a seam file with one empty round and no readings. */
export function checkSetup(form: SetupForm, id: string, base?: Seam): SetupCheck {
  const seam = seamFromForm(form, id, base);
  const parsed = parseSeamFile(
    {
      format: SEAM_FILE_FORMAT,
      units: { length: 'mm', angle: 'deg' },
      seam,
      rounds: [{ number: 1, kind: 'first', checklist: {} }],
      readings: [],
    },
    { allowNoReadings: true },
  );
  if (parsed.ok) return { ok: true, seam: parsed.value.seam };
  const errors: Partial<Record<SetupField, string[]>> = {};
  for (const p of parsed.problems) {
    const field = fieldOfPath(p.path);
    const list = (errors[field] ??= []);
    const msg = plainMessage(field, p);
    if (!list.includes(msg)) list.push(msg);
  }
  return { ok: false, errors };
}
