// Readings the ingest has just stored, handed to the re-grade as the ingest judged them, so the re-grade that
// follows neither reads their bodies back nor parses them again. A reading is taken only if it equals what parsing
// its stored body gives: canonical JSON writes -0 as 0, so a reading holding -0 is left to be read back. Held
// readings wait only for their seam's next re-grade, and their number is bounded; past it, they are read back.
import type { Reading } from '../../domain/index.js';

const MAX_HELD = 50_000;

function holdsNegativeZero(value: unknown): boolean {
  if (typeof value === 'number') return Object.is(value, -0);
  if (typeof value !== 'object' || value === null) return false;
  const record = value as Record<string, unknown>;
  for (const key in record) if (holdsNegativeZero(record[key])) return true;
  return false;
}

export class FreshReadings {
  readonly #bySeam = new Map<string, Map<string, Reading>>();
  #count = 0;

  /** Call only for records that were inserted just now with this content (accepted, never a duplicate). */
  add(seamId: string, recordId: string, reading: Reading): void {
    if (this.#count >= MAX_HELD || holdsNegativeZero(reading)) return;
    let held = this.#bySeam.get(seamId);
    if (!held) this.#bySeam.set(seamId, (held = new Map()));
    if (!held.has(recordId)) this.#count += 1;
    held.set(recordId, reading);
  }

  /** The seam's held readings by record id; they are no longer held after this. */
  take(seamId: string): ReadonlyMap<string, Reading> {
    const held = this.#bySeam.get(seamId);
    if (!held) return new Map();
    this.#bySeam.delete(seamId);
    this.#count -= held.size;
    return held;
  }

  get size(): number {
    return this.#count;
  }
}
