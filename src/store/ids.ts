// Record ids are UUIDv7 (RFC 9562): the leading 48-bit millisecond timestamp keeps ids roughly in creation order
// in IndexedDB key order and on the server, while the random tail keeps ids made on different devices apart.
// Order of entry itself comes from localSeq and the outbox sequence, never from these timestamps.

/**
 * A UUIDv7 built from crypto.randomUUID() (present wherever the app can run: it needs a secure context, as
 * service workers do): its random bits, with the time and version written over them.
 */
export function uuidv7(ms: number = Date.now()): string {
  const random = crypto.randomUUID(); // xxxxxxxx-xxxx-4xxx-Vxxx-xxxxxxxxxxxx, variant bits V already 10xx
  const time = Math.max(0, Math.min(Math.floor(ms), 2 ** 48 - 1))
    .toString(16)
    .padStart(12, '0');
  return `${time.slice(0, 8)}-${time.slice(8, 12)}-7${random.slice(15, 18)}-${random.slice(19)}`;
}

/** The millisecond timestamp a UUIDv7 carries (for tests and diagnostics). */
export function uuidv7Time(id: string): number {
  return parseInt(id.slice(0, 8) + id.slice(9, 13), 16);
}
