import type { Unit } from '../units.js';
import type { LimitExpr } from './types.js';

export interface LimitInputs {
  readonly t: number;
  readonly a?: number | undefined;
  readonly b?: number | undefined;
  readonly s?: number | undefined;
}

// Limits are kept to the micrometre so that 0.15 × 7 is 1.05, not 1.0499999999999998, and equality passes.
// `+ 0` turns a rounded −0 into 0.
export const toMicrometre = (x: number): number => Math.round(x * 1e6) / 1e6 + 0;

/** The variables a limit formula needs that the inputs lack (empty when it can be evaluated). */
export function missingInputs(expr: LimitExpr, inputs: LimitInputs): ('a' | 'b' | 's')[] {
  if (expr.kind !== 'max') return [];
  const missing: ('a' | 'b' | 's')[] = [];
  if (expr.a !== undefined && inputs.a === undefined) missing.push('a');
  if (expr.b !== undefined && inputs.b === undefined) missing.push('b');
  if (expr.s !== undefined && inputs.s === undefined) missing.push('s');
  return missing;
}

/**
 * The limit value: for `max` the formula capped at `cap` (ISO 5817: "the lower value governs"); 0 for
 * "not permitted"; Infinity for "unlimited"; the angle for `minAngle`.
 */
export function limitValue(expr: LimitExpr, inputs: LimitInputs): number {
  switch (expr.kind) {
    case 'notPermitted':
      return 0;
    case 'unlimited':
      return Infinity;
    case 'minAngle':
      return expr.deg;
    case 'max': {
      const raw =
        (expr.c ?? 0) +
        (expr.t ?? 0) * inputs.t +
        (expr.a === undefined ? 0 : expr.a * (inputs.a ?? NaN)) +
        (expr.b === undefined ? 0 : expr.b * (inputs.b ?? NaN)) +
        (expr.s === undefined ? 0 : expr.s * (inputs.s ?? NaN));
      const capped = expr.cap === undefined ? raw : Math.min(raw, expr.cap);
      return toMicrometre(capped);
    }
  }
}

/** Equality passes: limits are written "h ≤ …" and "α ≥ …". */
export function passesLimit(expr: LimitExpr, limit: number, measured: number): boolean {
  return expr.kind === 'minAngle' ? measured >= limit : measured <= limit;
}

/** Distance inside the limit in the parameter's unit (negative when outside); null when unlimited. */
export function marginTo(expr: LimitExpr, limit: number, measured: number): number | null {
  if (expr.kind === 'unlimited') return null;
  const m = expr.kind === 'minAngle' ? measured - limit : limit - measured;
  return toMicrometre(m);
}

const term = (k: number | undefined, sym: string): string | null =>
  k === undefined ? null : k === 1 ? sym : `${k}·${sym}`;

/** The limit as a person reads it in the table, e.g. "h ≤ 1 mm + 0.15·b, max 7 mm". */
export function describeLimit(expr: LimitExpr, unit: Unit): string {
  switch (expr.kind) {
    case 'notPermitted':
      return 'not permitted';
    case 'unlimited':
      return 'unlimited';
    case 'minAngle':
      return `α ≥ ${expr.deg}°`;
    case 'max': {
      const parts = [
        expr.c === undefined ? null : `${expr.c} ${unit}`,
        term(expr.t, 't'),
        term(expr.a, 'a'),
        term(expr.b, 'b'),
        term(expr.s, 's'),
      ].filter((p): p is string => p !== null);
      const cap = expr.cap === undefined ? '' : `, max ${expr.cap} ${unit}`;
      const short = expr.shortOnly ? ' (short imperfections only)' : '';
      return `h ≤ ${parts.join(' + ') || '0'}${cap}${short}`;
    }
  }
}
