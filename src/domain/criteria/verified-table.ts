import * as v from 'valibot';
import { choice, isoDate, list, obj, text, toProblems, type Problem } from '../model/schema-kit.js';
import { EDITIONS } from '../model/seam-file.js';
import type { Band, CriteriaSet, LimitExpr } from './types.js';

export const LIMITS_FILE_FORMAT = 'beadbook.limits/1';

const coefficient = v.optional(
  v.pipe(v.number('must be a number'), v.finite('must be finite'), v.minValue(0, 'must be ≥ 0')),
);

const limitExpr = v.variant(
  'kind',
  [
    obj('a "max" limit', {
      kind: v.literal('max'),
      c: coefficient,
      t: coefficient,
      a: coefficient,
      b: coefficient,
      s: coefficient,
      cap: coefficient,
      shortOnly: v.optional(v.boolean('must be true or false')),
    }),
    obj('a "minAngle" limit', {
      kind: v.literal('minAngle'),
      deg: v.pipe(
        v.number('must be a number'),
        v.minValue(90, 'must be ≥ 90'),
        v.maxValue(180, 'must be ≤ 180'),
      ),
    }),
    obj('a "notPermitted" limit', { kind: v.literal('notPermitted') }),
    obj('an "unlimited" limit', { kind: v.literal('unlimited') }),
  ],
  'kind must be "max", "minAngle", "notPermitted" or "unlimited"',
);

const bandSchema = obj('a band', {
  tMax: v.optional(v.pipe(v.number('must be a number'), v.gtValue(0, 'must be > 0'))),
  levels: obj('levels', { B: limitExpr, C: limitExpr, D: limitExpr }),
});

export const limitsFileSchema = obj('limits file', {
  format: v.literal(LIMITS_FILE_FORMAT, `must be "${LIMITS_FILE_FORMAT}"`),
  edition: choice(EDITIONS),
  name: text(120, 'the table name'),
  verifiedBy: text(120, 'who checked the table against a licensed copy'),
  verifiedOn: isoDate(),
  rows: list(
    obj('a row', { id: text(40, 'a row id'), bands: list(bandSchema, 1, 5, 'bands') }),
    1,
    100,
    'rows',
  ),
});

export type LimitsFile = v.InferOutput<typeof limitsFileSchema>;

export type LoadResult = { ok: true; criteria: CriteriaSet } | { ok: false; problems: Problem[] };

/**
 * Replaces the built-in limits of the rows a licensed, checked table lists. Everything else about a row
 * (what it measures, which thickness governs) stays; replaced limits are marked verified.
 */
export function applyVerifiedTable(base: CriteriaSet, input: unknown): LoadResult {
  const parsed = v.safeParse(limitsFileSchema, input, { abortEarly: false });
  if (!parsed.success) return { ok: false, problems: toProblems(parsed.issues) };
  const file = parsed.output;
  const problems: Problem[] = [];
  if (file.edition !== base.edition) {
    problems.push({
      path: 'edition',
      message: `the table is for ${file.edition}; the seam asks ${base.edition}`,
    });
  }
  const known = new Set(base.rows.map((r) => r.id));
  file.rows.forEach((row, i) => {
    if (!known.has(row.id)) {
      problems.push({
        path: `rows[${i}].id`,
        message: `unknown row "${row.id}"; known rows: ${[...known].join(', ')}`,
      });
    }
    const last = row.bands.length - 1;
    row.bands.forEach((b, j) => {
      if ((b.tMax === undefined) !== (j === last)) {
        problems.push({
          path: `rows[${i}].bands[${j}].tMax`,
          message: 'every band but the last needs tMax; the last has none',
        });
      }
    });
  });
  if (problems.length) return { ok: false, problems };
  const byId = new Map(file.rows.map((r) => [r.id, r]));
  const source = `${file.name}, verified by ${file.verifiedBy} on ${file.verifiedOn}`;
  const rows = base.rows.map((row) => {
    const replacement = byId.get(row.id);
    if (!replacement) return row;
    const bands: Band[] = replacement.bands.map((b) => {
      const lv = (e: LimitExpr) => ({ limit: e, confidence: 'verified' as const, source });
      const levels = {
        B: lv(b.levels.B as LimitExpr),
        C: lv(b.levels.C as LimitExpr),
        D: lv(b.levels.D as LimitExpr),
      };
      return b.tMax === undefined ? { levels } : { tMax: b.tMax, levels };
    });
    return { ...row, bands };
  });
  return {
    ok: true,
    criteria: {
      edition: base.edition,
      rows,
      verifiedTable: { name: file.name, verifiedBy: file.verifiedBy, verifiedOn: file.verifiedOn },
    },
  };
}
