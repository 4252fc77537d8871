// Pure helpers of the Import screen: target labels, the mapping built from the per-column choices, rates.
import {
  MAPPING_FORMAT,
  TARGETS,
  type ImportMapping,
  type ImportUnit,
  type Target,
} from '../../../domain/import/index.js';

const WORDS: Record<string, string> = {
  position: 'Position along the seam',
  toe: 'Toe (which plate)',
  toeAngle: 'Toe angle α',
  flankAngle: 'Flank angle θ',
  toeRadius: 'Toe radius',
  undercutDepth: 'Undercut depth',
  overlap: 'Overlap',
  reinforcementHeight: 'Reinforcement height',
  reinforcementWidth: 'Reinforcement width',
  convexity: 'Convexity',
  rootConcavity: 'Root concavity',
  shrinkageGroove: 'Shrinkage groove',
  sagging: 'Sagging',
  incompleteRootPenetration: 'Incomplete root penetration',
  throat: 'Throat',
  leg1: 'Leg on plate 1',
  leg2: 'Leg on plate 2',
  rootGap: 'Root gap',
  linearMisalignment: 'Linear misalignment',
  angularMisalignment: 'Angular misalignment',
  poreDiameter: 'Pore diameter',
  endCraterDepth: 'End crater depth',
};

export function targetLabel(t: Target): string {
  const m = /^plate([12])\.(.+)$/.exec(t);
  if (m) return `${WORDS[m[2] ?? ''] ?? m[2]}, plate ${m[1]} toe`;
  return WORDS[t] ?? t;
}

export const TARGET_OPTIONS: readonly Target[] = TARGETS;

export interface ColumnChoice {
  readonly target: Target | '';
  readonly unit: ImportUnit | '';
}

/** Column number (1-based) → choice, from a mapping whose columns name targets by header or number. */
export function choicesFrom(mapping: ImportMapping, names: readonly string[]): ColumnChoice[] {
  const out: ColumnChoice[] = names.map(() => ({ target: '', unit: '' }));
  for (const [target, ref] of Object.entries(mapping.columns)) {
    if (ref === undefined) continue;
    const key = typeof ref === 'object' ? ref.column : ref;
    const unit = typeof ref === 'object' ? (ref.unit ?? '') : '';
    const i =
      typeof key === 'number'
        ? key - 1
        : names.findIndex((n) => n.trim().toLowerCase() === key.trim().toLowerCase());
    if (i >= 0 && i < out.length) out[i] = { target: target as Target, unit };
  }
  return out;
}

export function mappingFrom(base: ImportMapping, choices: readonly ColumnChoice[]): ImportMapping {
  const columns: ImportMapping['columns'] = {};
  choices.forEach((c, i) => {
    if (!c.target) return;
    columns[c.target] = c.unit ? { column: i + 1, unit: c.unit } : i + 1;
  });
  return { ...base, format: MAPPING_FORMAT, columns };
}

export function rateText(items: number, bytes: number, ms: number): string {
  if (ms <= 0) return '';
  const s = ms / 1000;
  return `${Math.round(items / s).toLocaleString('en')} rows/s, ${(bytes / 1e6 / s).toFixed(1)} MB/s`;
}
