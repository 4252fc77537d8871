import {
  PARAMETER_NAMES,
  type ParameterName,
  type Problem,
  type Reading,
  type Seam,
} from '../../../domain/index.js';
import { checkEntry, type EntryContext } from '../../../../workers/entry-check-api.js';
import { fieldWords } from './field-labels.js';
import type { FieldKey, FieldProblems } from './reading-builder.js';

const isParameter = (x: string): x is ParameterName => (PARAMETER_NAMES as readonly string[]).includes(x);

/** Which field of the form a validator path points at, for the reading at `index`. */
export function fieldOfPath(path: string, index: number): FieldKey | null {
  const prefix = `readings[${index}]`;
  if (path === prefix) return 'position';
  if (!path.startsWith(`${prefix}.`)) return null;
  const rest = path.slice(prefix.length + 1);
  const [head, sub] = rest.split('.');
  if (head === 'values') return sub && isParameter(sub) ? sub : 'form';
  if (head === 'position' || head === 'start' || head === 'end') return head;
  if (head === 'toe' || head === 'side') return 'where';
  if (head === 'misalignmentBasis') return 'misalignmentBasis';
  if (head === 'instrument') return 'instrument';
  return 'form';
}

/**
 * The validator's message in the inspector's words: vocabulary names become field names, and the messages
 * that speak of record fields (toe objects, bases) say what to do on this screen instead.
 */
export function plainMessage(p: Problem, file: { readonly seam: Seam }, reading: Reading): string {
  const side = reading.toe?.side ?? reading.side;
  const m = p.message;
  if (/is measured at a toe/.test(m)) return 'is read at a toe: choose the toe on the drawing';
  if (/belongs to the face or the root/.test(m))
    return 'belongs to a side: choose the face side or the root side';
  if (p.path.endsWith('.misalignmentBasis'))
    return 'the plates differ in thickness: choose the surface the gauge sat on';
  if (p.path === 'seam.nominalThroat') {
    return 'this seam has no nominal throat a set up, and the limits need it: add it on the seam set-up first';
  }
  return m.replace(/\b[a-zA-Z]+\b/g, (w) => (isParameter(w) ? fieldWords(w, file.seam, side) : w));
}

/**
 * Checks the seam as it would be with the new reading appended, by the rules the store and the grader apply
 * (checkEntry: the validator's problems for that file, found without validating every earlier reading again, so
 * a save costs the same with ten readings or ten thousand), and places each problem next to its field. Problems
 * about other records go above the form.
 */
export function checkNewReading(context: EntryContext, reading: Reading): FieldProblems {
  const index = context.byId.size;
  const problems = checkEntry(context, reading, index);
  if (!problems.length) return {};
  const file = context;
  const out: FieldProblems = {};
  const general: string[] = [];
  for (const p of problems) {
    const field = p.path === 'seam.nominalThroat' ? 'form' : fieldOfPath(p.path, index);
    const text = plainMessage(p, file, reading);
    if (field === null) {
      general.push(`${p.path}: ${p.message}`);
      continue;
    }
    if (field === 'form') general.push(text);
    else out[field] = out[field] ? `${out[field]}; ${text}` : text;
  }
  if (general.length) out.form = [...new Set(general)].join(' · ');
  return out;
}
