// Canonical JSON: object members sorted by key (UTF-16 code units, as RFC 8785 orders them), no whitespace,
// numbers and strings as JSON.stringify writes them. Equal values give equal text, whatever order their members
// were built in, so content can be compared and hashed as text. Only JSON values are accepted: undefined, NaN,
// Infinity, functions, symbols, bigints and cycles are errors, never dropped or turned into null silently.
// The server writes one of these per received record, so the writer avoids per-member arrays and sorts only the
// objects whose members are not in order already (a device's canonical payload parses back in order).

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
  return write(value, []);
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
