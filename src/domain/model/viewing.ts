// How a round was looked at: the viewing and lighting conditions and the aids used, which a visual-testing report
// states (ISO 17637 lists them among its report items, from memory). Recorded by the inspector per round; the
// values are stated, never judged here: whether they suffice is for the governing specification.
import * as v from 'valibot';
import { choice, count, obj, text } from './schema-kit.js';

/** Direct: the eye on the surface; remote: through a borescope, camera or other relay of the image. */
export const VIEWING_KINDS = ['direct', 'remote'] as const;
export type ViewingKind = (typeof VIEWING_KINDS)[number];

const finiteIn = (min: number, max: number, unit: string) =>
  v.pipe(
    v.number(`must be a number in ${unit}`),
    v.finite('must be a finite number'),
    v.minValue(min, `must be at least ${min} ${unit}`),
    v.maxValue(max, `must be at most ${max} ${unit}`),
  );

export const viewingConditionsSchema = obj('viewing conditions', {
  viewing: choice(VIEWING_KINDS),
  /** Illuminance on the surface examined, in lux. */
  illuminanceLx: v.optional(count(0, 200_000)),
  /** Eye (or lens) to surface, in mm. */
  distanceMm: v.optional(finiteIn(0, 100_000, 'mm')),
  /** Between the line of sight and the surface, in degrees. */
  angleDeg: v.optional(finiteIn(0, 90, 'degrees')),
  /** The light used: daylight, hall lighting, a hand lamp … */
  lighting: v.optional(text(200, 'the lighting')),
  /** Aids: mirror, magnifier, borescope, gauge … */
  aids: v.optional(text(200, 'the aids')),
});

export type ViewingConditions = v.InferOutput<typeof viewingConditionsSchema>;

/** The conditions in words, for screens and reports. */
export function describeViewing(c: ViewingConditions): string {
  return [
    c.viewing === 'direct' ? 'direct viewing' : 'remote viewing',
    c.illuminanceLx !== undefined ? `${c.illuminanceLx} lx` : 'illuminance not measured',
    c.distanceMm !== undefined ? `distance ${c.distanceMm} mm` : null,
    c.angleDeg !== undefined ? `angle ${c.angleDeg}°` : null,
    c.lighting ? `lighting: ${c.lighting}` : null,
    c.aids ? `aids: ${c.aids}` : 'no aids named',
  ]
    .filter((part): part is string => part !== null)
    .join('; ');
}
