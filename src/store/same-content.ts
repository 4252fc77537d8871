// Records compare by content, not by key order: a record read back from IndexedDB or from a backup file may list
// its fields in another order and still be the same record.

/** JSON with object keys sorted at every depth; undefined fields are left out, as JSON leaves them out. */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) =>
    v !== null && typeof v === 'object' && !Array.isArray(v)
      ? Object.fromEntries(Object.entries(v).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)))
      : v,
  );
}

export const sameContent = (a: unknown, b: unknown): boolean => canonicalJson(a) === canonicalJson(b);
