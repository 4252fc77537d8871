import {
  PARAMETERS,
  UNIT_LABEL,
  type ParameterName,
  type Reading,
  type Seam,
} from '../../../domain/index.js';
import { fieldWords, sideName, toeName } from './field-labels.js';

const num = (x: number): string => String(x);

/** Where a reading lies along the seam, e.g. "at 150 mm" or "from 100 to 180 mm". */
export function whereAlong(r: Reading): string {
  if (r.start !== undefined && r.end !== undefined) return `from ${num(r.start)} to ${num(r.end)} mm`;
  return r.position === undefined ? 'no position' : `at ${num(r.position)} mm`;
}

/** Where on the cross-section: the toe, or the side. */
export function whereAcross(r: Reading, seam: Seam): string | null {
  if (r.toe) return toeName(r.toe, seam);
  if (r.side) return sideName(r.side);
  return null;
}

/** The values in words with units; misalignment with its sign spelled out. */
export function valuesText(r: Reading, seam: Seam): string {
  const side = r.toe?.side ?? r.side;
  const parts: string[] = [];
  for (const [name, v] of Object.entries(r.values) as [ParameterName, number | undefined][]) {
    if (v === undefined) continue;
    const unit = UNIT_LABEL[PARAMETERS[name].unit];
    const sep = unit === '°' ? '' : ' ';
    if (name === 'linearMisalignment') {
      const basis =
        r.misalignmentBasis === 'faceSurface'
          ? ' on the face surface'
          : r.misalignmentBasis === 'rootSurface'
            ? ' on the root surface'
            : '';
      const dir = v === 0 ? 'flush' : `plate 2 ${Math.abs(v)} mm toward the ${v > 0 ? 'face' : 'root'} side`;
      parts.push(`linear misalignment ${dir}${basis}`);
    } else if (name === 'angularMisalignment') {
      parts.push(
        `angular misalignment ${v === 0 ? 'straight' : `${Math.abs(v)}° peaking toward the ${v > 0 ? 'face' : 'root'} side`}`,
      );
    } else {
      parts.push(`${fieldWords(name, seam, side)} ${num(v)}${sep}${unit}`);
    }
  }
  return parts.join(', ') || 'no values';
}

/** One line for the list of readings. */
export function describeReading(r: Reading, seam: Seam): string {
  const across = whereAcross(r, seam);
  return [whereAlong(r), across, valuesText(r, seam), r.sampling === 'targeted' ? 'targeted' : 'at pitch']
    .filter((x): x is string => x !== null)
    .join(' · ');
}
