import * as v from 'valibot';

/** One problem with the input, phrased so a person can fix it: where, what was wrong, what is allowed. */
export interface Problem {
  readonly path: string;
  readonly message: string;
}

type Entries = v.ObjectEntries;

/** A closed object: unknown fields are errors, so a misspelt or wrongly-unitised field is never ignored. */
export function obj<E extends Entries>(what: string, entries: E) {
  const allowed = Object.keys(entries).join(', ');
  return v.strictObject(entries, (issue) => {
    if (issue.expected === 'never') return `unknown field; ${what} allows only: ${allowed}`;
    if (issue.received === 'undefined' && issue.path?.length) return `required field of ${what} is missing`;
    return `${what} must be an object, got ${issue.received}`;
  });
}

interface RangeOptions {
  readonly min: number;
  readonly max: number;
  readonly minExclusive?: boolean;
}

/** A finite number in a unit, with its physical range. Strings such as "12 mm" are refused, not parsed. */
export function quantity(
  unit: 'mm' | 'deg' | 'MPa' | 'cycles',
  range: RangeOptions,
  why = '',
): v.GenericSchema<number, number> {
  const u = unit === 'deg' ? '°' : ` ${unit}`;
  const because = why ? ` (${why})` : '';
  const num = v.number(
    (i) =>
      `must be a number in ${unit === 'deg' ? 'degrees' : unit} (write 12, not "12 ${unit}"); got ${i.received}`,
  );
  const finite = v.finite<number, (i: v.FiniteIssue<number>) => string>(
    (i) => `must be a finite number; got ${i.received}`,
  );
  const upper = v.maxValue<number, number, (i: v.MaxValueIssue<number, number>) => string>(
    range.max,
    (i) => `must be at most ${range.max}${u}; got ${i.received}`,
  );
  // Two pipes rather than one with a chosen action, so each bound stays a plain action a JSON Schema can express.
  return range.minExclusive
    ? v.pipe(
        num,
        finite,
        v.gtValue<number, number, (i: v.GtValueIssue<number, number>) => string>(
          range.min,
          (i) => `must be greater than ${range.min}${u}${because}; got ${i.received}`,
        ),
        upper,
      )
    : v.pipe(
        num,
        finite,
        v.minValue<number, number, (i: v.MinValueIssue<number, number>) => string>(
          range.min,
          (i) => `must be at least ${range.min}${u}${because}; got ${i.received}`,
        ),
        upper,
      );
}

export function text(maxLength: number, what = 'text'): v.GenericSchema<string, string> {
  return v.pipe(
    v.string((i) => `must be ${what} (a string); got ${i.received}`),
    v.minLength(1, 'must not be empty'),
    v.maxLength(maxLength, (i) => `is too long: at most ${maxLength} characters; got ${i.received}`),
  );
}

export function choice<const T extends readonly [string | number, ...(string | number)[]]>(options: T) {
  return v.picklist(
    options,
    (i) => `must be one of ${options.map((o) => JSON.stringify(o)).join(', ')}; got ${i.received}`,
  );
}

export function isoTimestamp(): v.GenericSchema<string, string> {
  return v.pipe(
    text(40, 'a timestamp'),
    v.isoTimestamp((i) => `must be an ISO 8601 timestamp such as 2026-03-01T09:30:00Z; got ${i.received}`),
  );
}

export function isoDate(): v.GenericSchema<string, string> {
  return v.pipe(
    text(10, 'a date'),
    v.isoDate((i) => `must be a date such as 2026-03-01; got ${i.received}`),
  );
}

export function count(min: number, max: number): v.GenericSchema<number, number> {
  return v.pipe(
    v.number((i) => `must be a whole number; got ${i.received}`),
    v.integer((i) => `must be a whole number; got ${i.received}`),
    v.minValue(min, (i) => `must be at least ${min}; got ${i.received}`),
    v.maxValue(max, (i) => `must be at most ${max}; got ${i.received}`),
  );
}

export function list<T extends v.GenericSchema>(item: T, min: number, max: number, what: string) {
  // The count is checked before any item, so an oversized list is refused without validating every entry.
  return v.pipe(
    v.array(v.unknown(), (i) => `${what} must be a list; got ${i.received}`),
    v.minLength(min, `${what} must hold at least ${min} item${min === 1 ? '' : 's'}`),
    v.maxLength(max, (i) => `${what} holds ${i.received} items; at most ${max} are accepted`),
    v.array(item),
  );
}

export function formatPath(path: readonly { key: unknown }[] | undefined): string {
  if (!path?.length) return '(file)';
  let out = '';
  for (const { key } of path) {
    if (typeof key === 'number') out += `[${key}]`;
    // A key that would not read back from a dotted path (empty, or holding dots, brackets or spaces) is quoted.
    else if (!/^[^.[\]"\s]+$/.test(String(key))) out += `[${JSON.stringify(String(key))}]`;
    else out += out ? `.${String(key)}` : String(key);
  }
  return out;
}

export function toProblems(issues: readonly v.BaseIssue<unknown>[]): Problem[] {
  return issues.map((issue) => ({ path: formatPath(issue.path), message: issue.message }));
}

export function describeProblems(problems: readonly Problem[]): string {
  return problems.map((p) => `${p.path}: ${p.message}`).join('\n');
}
