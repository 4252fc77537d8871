import type { ChecklistAnswerKind, JointType, LevelMet } from '../../domain/index.js';
import { levelText } from '../../domain/index.js';

// Plain words for the record's codes, shared by the seam screens. The record keeps the codes; people read these.

export const JOINT_LABEL: Record<JointType, string> = {
  butt: 'Butt',
  filletT: 'Fillet T',
  cruciform: 'Cruciform',
  lap: 'Lap',
};

export const PREPARATION_LABEL: Record<string, string> = {
  square: 'Square',
  singleV: 'Single V',
  doubleV: 'Double V',
  singleBevel: 'Single bevel',
  doubleBevel: 'Double bevel',
  singleU: 'Single U',
  doubleU: 'Double U',
  singleJ: 'Single J',
  doubleJ: 'Double J',
  fillet: 'Fillet (no preparation)',
};

export const SURFACE_LABEL: Record<string, string> = {
  asWelded: 'As welded',
  groundFlush: 'Ground flush',
  toeGround: 'Toe ground',
  treated: 'Treated (peened or similar)',
};

export const SETTING_LABEL: Record<string, string> = { shopFlat: 'Shop / flat', site: 'Site' };

export const ANSWER_LABEL: Record<ChecklistAnswerKind | 'unanswered', string> = {
  noneFound: 'None found',
  present: 'Present',
  notAccessible: 'Not accessible',
  unanswered: 'Not answered',
};

export const ROUND_KIND_LABEL: Record<string, string> = {
  first: 'First inspection',
  afterRepair: 'After repair',
  additional: 'Additional',
};

/** A number as an inspector reads it: at most three decimals, no trailing zeros, a true minus sign. */
export function fmtNumber(x: number, decimals = 3): string {
  if (!Number.isFinite(x)) return x > 0 ? '∞' : x < 0 ? '−∞' : '—';
  const rounded = Number(x.toFixed(decimals)) + 0;
  return String(rounded).replace('-', '−');
}

export function fmtValue(x: number | null | undefined, unit: 'mm' | 'deg' | string): string {
  if (x === null || x === undefined) return '—';
  return unit === 'deg' ? `${fmtNumber(x)}°` : `${fmtNumber(x)} ${unit}`;
}

/** A margin with its sign spelt out, so "inside" and "over" never hang on a minus sign alone. */
export function fmtMargin(margin: number | null, unit: 'mm' | 'deg'): string {
  if (margin === null) return 'no limit';
  if (margin < 0) return `${fmtValue(-margin, unit)} over the limit`;
  if (margin === 0) return 'exactly at the limit';
  return `${fmtValue(margin, unit)} inside`;
}

export function fmtLevel(l: LevelMet | null | undefined): string {
  return l === null || l === undefined ? '—' : levelText(l);
}

export function fmtWhen(iso: string | undefined): string {
  if (!iso) return '—';
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return d.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

export function fmtPosition(r: {
  readonly position?: number | undefined;
  readonly start?: number | undefined;
  readonly end?: number | undefined;
}): string {
  if (r.start !== undefined && r.end !== undefined) return `${fmtNumber(r.start)}–${fmtNumber(r.end)} mm`;
  if (r.position !== undefined) return `${fmtNumber(r.position)} mm`;
  return '—';
}

/** Short names of the measured values for lists (symbol and words, as on the gauge screen). */
export const PARAM_LABEL: Record<string, string> = {
  toeAngle: 'toe angle α',
  toeRadius: 'toe radius ρ',
  reinforcementHeight: 'reinforcement h',
  reinforcementWidth: 'width b',
  convexity: 'convexity h',
  undercutDepth: 'undercut h',
  overlap: 'overlap h',
  rootConcavity: 'root concavity h',
  shrinkageGroove: 'shrinkage groove h',
  sagging: 'sagging h',
  incompleteRootPenetration: 'incomplete root penetration h',
  throat: 'throat aA',
  leg1: 'leg z1',
  leg2: 'leg z2',
  rootGap: 'root gap h',
  linearMisalignment: 'misalignment e',
  angularMisalignment: 'angular misalignment β',
  poreDiameter: 'pore d',
  endCraterDepth: 'end crater h',
};

export function fmtToe(
  toe: { plate: 1 | 2; side: 'face' | 'root' } | undefined,
  side?: 'face' | 'root',
): string {
  if (toe) return `toe on plate ${toe.plate}, ${toe.side} side`;
  if (side) return `${side} side`;
  return '';
}
