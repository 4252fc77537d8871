// Canonical JSON: object members sorted by key (UTF-16 code units, as RFC 8785 orders them), no whitespace,
// numbers and strings as JSON.stringify writes them. Equal values give equal text, whatever order their members
// were built in, so content can be compared and hashed as text. Only JSON values are accepted: undefined, NaN,
// Infinity, functions, symbols, bigints and cycles are errors, never dropped or turned into null silently.

/** Keys JSON writes as they are (no escapes), so quoting them needs no JSON.stringify. */
const PLAIN_KEY = /^[A-Za-z0-9_$-]*$/;

export function canonicalJson(value: unknown): string {
  return write(value, new Set());
}

function write(value: unknown, open: Set<object>): string {
  switch (typeof value) {
    case 'string':
      return JSON.stringify(value);
    case 'boolean':
      return value ? 'true' : 'false';
    case 'number':
      if (!Number.isFinite(value)) throw new TypeError(`canonical JSON has no form for ${String(value)}`);
      return JSON.stringify(value);
    case 'object': {
      if (value === null) return 'null';
      if (open.has(value)) throw new TypeError('canonical JSON cannot hold a cycle');
      open.add(value);
      let out: string;
      if (Array.isArray(value)) {
        out = `[${value.map((item: unknown) => write(item, open)).join(',')}]`;
      } else {
        const record = value as Record<string, unknown>;
        const keys = Object.keys(record).sort();
        const parts: string[] = [];
        for (const key of keys) {
          const member = record[key];
          if (member === undefined)
            throw new TypeError(`canonical JSON has no form for undefined (at "${key}")`);
          parts.push(`${PLAIN_KEY.test(key) ? `"${key}"` : JSON.stringify(key)}:${write(member, open)}`);
        }
        out = `{${parts.join(',')}}`;
      }
      open.delete(value);
      return out;
    }
    default:
      throw new TypeError(`canonical JSON has no form for a ${typeof value}`);
  }
}
