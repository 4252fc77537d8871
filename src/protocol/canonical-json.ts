// Canonical JSON: object members sorted by key (UTF-16 code units, as RFC 8785 orders them), no whitespace,
// numbers and strings as JSON.stringify writes them. Equal values give equal text, whatever order their members
// were built in, so content can be compared and hashed as text. Only JSON values are accepted: undefined, NaN,
// Infinity, functions, symbols, bigints and cycles are errors, never dropped or turned into null silently.
// The server writes one of these per received record. A device's canonical payload parses back with every object's
// members in order, and for such a value JSON.stringify (native) writes the canonical text already; anything else
// goes through the writer below, which avoids per-member arrays and sorts only objects that are out of order.

/** Keys JSON writes as they are (no escapes), so quoting them needs no JSON.stringify. */
const PLAIN_KEY = /^[A-Za-z0-9_$-]*$/;

/** Quoted keys seen so far: records repeat a few dozen keys; bounded so odd input cannot grow it. */
const QUOTED = new Map<string, string>();
const QUOTED_MAX = 512;

function quoted(key: string): string {
  let q = QUOTED.get(key);
  if (q === undefined) {
    q = PLAIN_KEY.test(key) ? `"${key}"` : JSON.stringify(key);
    if (QUOTED.size < QUOTED_MAX) QUOTED.set(key, q);
  }
  return q;
}

function inOrder(keys: readonly string[]): boolean {
  for (let i = 1; i < keys.length; i++) if ((keys[i - 1] as string) > (keys[i] as string)) return false;
  return true;
}

export function canonicalJson(value: unknown): string {
  return stringifiesCanonically(value, 0) ? JSON.stringify(value) : write(value, []);
}

/** Past this depth the writer decides (and names a cycle, which would otherwise recurse here without end). */
const MAX_FAST_DEPTH = 32;

/**
 * Whether JSON.stringify writes value exactly as the writer would: JSON values only (finite numbers, no undefined,
 * functions, symbols or bigints), plain objects and arrays, every object's members already in sorted order.
 */
function stringifiesCanonically(value: unknown, depth: number): boolean {
  switch (typeof value) {
    case 'string':
    case 'boolean':
      return true;
    case 'number':
      return Number.isFinite(value);
    case 'object': {
      if (value === null) return true;
      if (depth > MAX_FAST_DEPTH) return false;
      if (Array.isArray(value)) {
        if ((value as { toJSON?: unknown }).toJSON !== undefined) return false;
        for (let i = 0; i < value.length; i++) if (!stringifiesCanonically(value[i], depth + 1)) return false;
        return true;
      }
      const proto: unknown = Object.getPrototypeOf(value);
      if (proto !== Object.prototype && proto !== null) return false;
      const record = value as Record<string, unknown>;
      let previous: string | null = null;
      for (const key of Object.keys(record)) {
        if (previous !== null && previous > key) return false;
        previous = key;
        if (!stringifiesCanonically(record[key], depth + 1)) return false;
      }
      return true;
    }
    default:
      return false;
  }
}

function write(value: unknown, open: object[]): string {
  switch (typeof value) {
    case 'string':
      return JSON.stringify(value);
    case 'boolean':
      return value ? 'true' : 'false';
    case 'number':
      if (!Number.isFinite(value)) throw new TypeError(`canonical JSON has no form for ${String(value)}`);
      // For finite numbers String() and JSON.stringify agree (-0 included: both write 0).
      return String(value);
    case 'object': {
      if (value === null) return 'null';
      if (open.includes(value)) throw new TypeError('canonical JSON cannot hold a cycle');
      open.push(value);
      let out: string;
      if (Array.isArray(value)) {
        out = '[';
        for (let i = 0; i < value.length; i++) {
          if (i) out += ',';
          out += write(value[i], open);
        }
        out += ']';
      } else {
        const record = value as Record<string, unknown>;
        const keys = Object.keys(record);
        if (!inOrder(keys)) keys.sort();
        out = '{';
        for (let i = 0; i < keys.length; i++) {
          const key = keys[i] as string;
          const member = record[key];
          if (member === undefined)
            throw new TypeError(`canonical JSON has no form for undefined (at "${key}")`);
          if (i) out += ',';
          out += `${quoted(key)}:${write(member, open)}`;
        }
        out += '}';
      }
      open.pop();
      return out;
    }
    default:
      throw new TypeError(`canonical JSON has no form for a ${typeof value}`);
  }
}
