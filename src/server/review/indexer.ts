// Keeps the review facts (what the queue filters and sorts on) up to date: after each re-grade is saved the seam is
// marked, and one loop makes its facts, one seam at a time, yielding to requests between seams so ingest and pages
// keep going. Facts are derived and can be made again at any time: at start, seams whose facts lag their grade are
// marked too.
import type { Logger } from '../log.js';
import { SeamQueue } from '../seam-queue.js';
import type { Storage } from '../storage/types.js';
import { reviewFactsOf } from './facts.js';
import { reviewSeam } from './seam-review.js';

export class ReviewIndexer {
  readonly #queue = new SeamQueue(
    (seamId) => this.index(seamId),
    (seamId, error) => this.log.error('reviewFactsFailed', { seamId, error }),
    true,
  );

  constructor(
    private readonly storage: Storage,
    private readonly now: () => Date,
    private readonly log: Logger,
  ) {}

  schedule(seamIds: Iterable<string>): void {
    this.#queue.schedule(seamIds);
  }

  /** How many seams wait for their facts. */
  get pending(): number {
    return this.#queue.pending;
  }

  /** Resolves when every marked seam has its facts. */
  idle(): Promise<void> {
    return this.#queue.idle();
  }

  /** Makes and saves the seam's facts from its records and stored server grade. */
  async index(seamId: string): Promise<void> {
    const [row, material, grade, deviceGrades] = await Promise.all([
      this.storage.getSeam(seamId),
      this.storage.seamMaterial(seamId),
      this.storage.getServerGrade(seamId),
      this.storage.listDeviceGrades(seamId),
    ]);
    // Not graded yet, or records arrived since: the re-grade that follows marks the seam again.
    if (!grade) return;
    const review = reviewSeam(material, grade, { readings: 'columns', sensitivity: false });
    if (!review.stored) return;
    await this.storage.saveReviewFacts(
      reviewFactsOf({
        seamId,
        namespace: row?.namespace ?? 'live',
        material,
        review,
        deviceGrades,
        gradedAt: grade.gradedAt,
        now: this.now().toISOString(),
      }),
    );
  }
}
