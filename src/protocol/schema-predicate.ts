// A valibot schema of the plain kind the record bodies use (closed objects, optional members, strings and numbers
// with bounds and patterns, picklists, literals, one-key variants), turned into a predicate that only says "valid".
// valibot builds an output object and an issue list for every member it visits; on a 500-record batch that is most
// of the ingest's judging time, although nearly every record is valid. The predicate never explains a rejection: it
// answers NOT_SHOWN and the caller asks valibot, so reasons always come from the schema itself. It may answer
// NOT_SHOWN for input valibot accepts (a member present as undefined, an object with an odd prototype), never
// VALID for input valibot refuses; test/protocol/schema-predicate.test.ts holds it to that.
import type * as v from 'valibot';

/** Valid, and every object met has its members in sorted key order (JSON.stringify then writes canonical JSON). */
export const VALID_IN_ORDER = 2;
/** Valid, but some object's members are out of order (or a member was not looked into). */
export const VALID = 1;
/** Not shown to be valid: ask the schema (it may still be valid). */
export const NOT_SHOWN = 0;

export type Verdict = typeof VALID_IN_ORDER | typeof VALID | typeof NOT_SHOWN;
export type Predicate = (value: unknown) => Verdict;

/** The members of valibot's schema and action objects read here; anything else makes the schema unsupported. */
interface Node {
  readonly kind: string;
  readonly type: string;
  readonly pipe?: readonly Node[];
  readonly entries?: Readonly<Record<string, Node>>;
  readonly wrapped?: Node;
  readonly default?: unknown;
  readonly options?: readonly unknown[];
  readonly literal?: unknown;
  readonly key?: string;
  readonly requirement?: unknown;
  readonly async?: boolean;
}

type Test = (value: unknown) => boolean;

/** The predicate for a schema, or null when the schema holds anything this does not know exactly. */
export function compilePredicate(schema: v.GenericSchema): Predicate | null {
  return compile(schema as unknown as Node);
}

function compile(node: Node): Predicate | null {
  if (node.kind !== 'schema' || node.async) return null;
  if (node.pipe) return compilePipe(node.pipe);
  switch (node.type) {
    case 'strict_object':
      return compileObject(node);
    case 'variant':
      return compileVariant(node);
    case 'unknown':
      // Looked at by no one here: valid, but with no word on its members' order.
      return (value) => (value === undefined ? NOT_SHOWN : VALID);
  }
  const test = baseTest(node);
  return test && ((value) => (test(value) ? VALID_IN_ORDER : NOT_SHOWN));
}

/** Tests for the leaf schemas, as valibot's own checks make them. */
function baseTest(node: Node): Test | null {
  switch (node.type) {
    case 'string':
      return (value) => typeof value === 'string';
    case 'number':
      return (value) => typeof value === 'number' && !Number.isNaN(value);
    case 'boolean':
      return (value) => typeof value === 'boolean';
    case 'picklist': {
      const options = node.options;
      return options ? (value) => options.includes(value) : null;
    }
    case 'literal': {
      const literal = node.literal;
      return (value) => value === literal;
    }
    default:
      return null;
  }
}

/** The validations a pipe may carry after its schema, each failing exactly where valibot's would. */
function actionTest(action: Node): Test | null {
  if (action.kind !== 'validation') return null;
  const r = action.requirement;
  switch (action.type) {
    case 'min_length':
      return typeof r === 'number' ? (value) => (value as string).length >= r : null;
    case 'max_length':
      return typeof r === 'number' ? (value) => (value as string).length <= r : null;
    case 'min_value':
      return typeof r === 'number' ? (value) => (value as number) >= r : null;
    case 'max_value':
      return typeof r === 'number' ? (value) => (value as number) <= r : null;
    case 'gt_value':
      return typeof r === 'number' ? (value) => (value as number) > r : null;
    case 'lt_value':
      return typeof r === 'number' ? (value) => (value as number) < r : null;
    case 'integer':
      return (value) => Number.isInteger(value);
    case 'finite':
      return (value) => Number.isFinite(value);
    case 'regex':
    case 'iso_timestamp':
    case 'iso_date':
      // A global or sticky pattern keeps state between tests: not the same answer twice.
      return r instanceof RegExp && !r.global && !r.sticky ? (value) => r.test(value as string) : null;
    default:
      return null;
  }
}

function compilePipe(pipe: readonly Node[]): Predicate | null {
  const [first, ...rest] = pipe;
  if (!first) return null;
  const head = compile(first);
  if (!head) return null;
  const tests: Test[] = [];
  for (const item of rest) {
    if (item.kind === 'metadata') continue;
    const test = actionTest(item);
    if (!test) return null;
    tests.push(test);
  }
  return (value) => {
    const verdict = head(value);
    if (verdict === NOT_SHOWN) return NOT_SHOWN;
    for (let i = 0; i < tests.length; i++) if (!(tests[i] as Test)(value)) return NOT_SHOWN;
    return verdict;
  };
}

interface Member {
  readonly check: Predicate;
  readonly required: boolean;
}

function compileObject(node: Node): Predicate | null {
  const members = new Map<string, Member>();
  let requiredCount = 0;
  for (const [key, entry] of Object.entries(node.entries ?? {})) {
    let required = true;
    let inner = entry;
    if (entry.type === 'optional' && !entry.pipe) {
      if (entry.default !== undefined || !entry.wrapped) return null;
      required = false;
      inner = entry.wrapped;
    } else if (
      entry.type === 'exact_optional' ||
      entry.type === 'nullish' ||
      entry.type === 'undefinedable'
    ) {
      return null;
    }
    const check = compile(inner);
    if (!check) return null;
    if (required) requiredCount += 1;
    members.set(key, { check, required });
  }
  return (value) => {
    if (typeof value !== 'object' || value === null || Array.isArray(value)) return NOT_SHOWN;
    const proto: unknown = Object.getPrototypeOf(value);
    if (proto !== Object.prototype) return NOT_SHOWN;
    const record = value as Record<string, unknown>;
    let verdict: Verdict = VALID_IN_ORDER;
    let required = 0;
    let previous = '';
    // for-in, as valibot walks the members too; V8 reads record[key] inside it from the shape's key cache.
    for (const key in record) {
      const member = members.get(key);
      const item = record[key];
      // A member present as undefined passes an optional schema in valibot but has no JSON form: let it decide.
      if (member === undefined || item === undefined) return NOT_SHOWN;
      const got = member.check(item);
      if (got === NOT_SHOWN) return NOT_SHOWN;
      if (got < verdict) verdict = got;
      if (previous > key) verdict = VALID;
      previous = key;
      if (member.required) required += 1;
    }
    return required === requiredCount ? verdict : NOT_SHOWN;
  };
}

/** A variant whose options are closed objects told apart by distinct literals: at most one option can match. */
function compileVariant(node: Node): Predicate | null {
  const key = node.key;
  if (typeof key !== 'string' || !node.options) return null;
  const byTag = new Map<unknown, Predicate>();
  for (const option of node.options as readonly Node[]) {
    const tag = option.entries?.[key];
    if (option.type !== 'strict_object' || option.pipe || tag?.type !== 'literal' || tag.pipe) return null;
    if (byTag.has(tag.literal)) return null;
    const check = compile(option);
    if (!check) return null;
    byTag.set(tag.literal, check);
  }
  return (value) => {
    if (typeof value !== 'object' || value === null) return NOT_SHOWN;
    const check = byTag.get((value as Record<string, unknown>)[key]);
    return check ? check(value) : NOT_SHOWN;
  };
}
