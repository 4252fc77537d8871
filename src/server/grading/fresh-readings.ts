// Readings the ingest has just stored, handed to the re-grade as the ingest judged them, so the re-grade that
// follows neither reads their bodies back nor parses them again. Held readings wait only for their seam's next
// re-grade, and their number is bounded; past it, they are read back.
import type { Reading } from '../../domain/index.js';

const MAX_HELD = 50_000;

/**
 * Whether readings parsed from this JSON text are exactly what parsing their canonical text gives back. Canonical
 * JSON writes -0 as 0, and only a negative number in the text (a minus sign where a value starts) can parse to -0;
 * text without one qualifies (a minus inside a string may make this say no, never wrongly yes).
 */
export const parsesLikeItsCanonicalText = (jsonText: string): boolean => !/[:,[]\s*-/.test(jsonText);

export class FreshReadings {
  readonly #bySeam = new Map<string, Map<string, Reading>>();
  #count = 0;

  /**
   * Call only for records inserted just now with this content (accepted, never a duplicate), parsed from text for
   * which parsesLikeItsCanonicalText holds: the reading must equal what parsing its stored body gives.
   */
  add(seamId: string, recordId: string, reading: Reading): void {
    if (this.#count >= MAX_HELD) return;
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
