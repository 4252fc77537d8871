// Seams waiting for one kind of background work (a re-grade, the review facts): each seam once however often it is
// marked, one at a time, started only after the request that marked it has answered.
export class SeamQueue {
  readonly #pending = new Set<string>();
  #running: Promise<void> | null = null;

  constructor(
    private readonly work: (seamId: string) => Promise<void>,
    private readonly failed: (seamId: string, error: unknown) => void,
    /** Yield to waiting requests before every seam, not only before the first. */
    private readonly yieldEachSeam = false,
  ) {}

  schedule(seamIds: Iterable<string>): void {
    for (const id of seamIds) this.#pending.add(id);
    if (this.#pending.size && !this.#running) {
      this.#running = this.#drain().finally(() => {
        this.#running = null;
        if (this.#pending.size) this.schedule([]);
      });
    }
  }

  /** How many seams wait. */
  get pending(): number {
    return this.#pending.size;
  }

  /** Resolves when every marked seam has been done. */
  async idle(): Promise<void> {
    while (this.#running) await this.#running;
  }

  async #drain(): Promise<void> {
    const breathe = () => new Promise<void>((resolve) => setImmediate(resolve));
    // Let the request that scheduled the work answer first.
    await breathe();
    for (let first = true; ; first = false) {
      if (!first && this.yieldEachSeam) await breathe();
      const next = this.#pending.values().next();
      if (next.done) return;
      this.#pending.delete(next.value);
      try {
        await this.work(next.value);
      } catch (error) {
        this.failed(next.value, error);
      }
    }
  }
}
