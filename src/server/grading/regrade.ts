// The server re-grades every seam it receives records for, with the same grading core as the device, and keeps
// its result beside the grade the device reported: a review never rests on a device's arithmetic. Readings that
// do not fit their seam (a value that does not apply to the joint, a round not received yet) are left out of the
// grade and listed with the grader's reason; the records themselves stay stored.
import {
  gradeSeam,
  parseSeamFileWithCheckedReadings,
  type Problem,
  type Reading,
  type SeamFile,
} from '../../domain/index.js';
import type { Logger } from '../log.js';
import { SeamQueue } from '../seam-queue.js';
import type { ServerGrade, Storage } from '../storage/types.js';
import { foldSeam, seamFileOf, type LeftOut } from './fold.js';
import { FreshReadings } from './fresh-readings.js';

export interface GradeSummary {
  readonly state: 'graded' | 'incomplete' | 'noReadings' | 'noSetup' | 'noRounds' | 'invalid';
  readonly levelMet: string | null;
  readonly meetsRequired: boolean | null;
  readonly requiredLevel: string | null;
  readonly gradedRound: number | null;
  readonly readingCount: number;
  readonly rounds: readonly {
    readonly round: number;
    readonly complete: boolean;
    readonly levelMet: string | null;
    readonly meetsRequired: boolean | null;
  }[];
  readonly unverifiedRows: readonly string[];
  /** Problems with the seam itself (its set-up or rounds); the grade waits until they are resolved. */
  readonly problems: readonly Problem[];
  readonly leftOut: readonly LeftOut[];
}

const MAX_PASSES = 4;
const READING_PATH = /^readings\[(\d+)\]/;

/** The stages of a re-grade, for `npm run bench:ingest` to say where the time goes. */
export type RegradeStage = 'read' | 'fold' | 'check' | 'grade' | 'save';
export type StageTimer = (stage: RegradeStage) => void;

export function gradeFolded(
  material: Parameters<typeof foldSeam>[0],
  lap: StageTimer = () => {},
  held?: ReadonlyMap<string, Reading>,
): {
  basedOn: number;
  summary: GradeSummary;
} {
  const folded = foldSeam(material, held);
  lap('fold');
  const empty = {
    levelMet: null,
    meetsRequired: null,
    requiredLevel: null,
    gradedRound: null,
    readingCount: 0,
    rounds: [],
    unverifiedRows: [],
    problems: [],
    leftOut: folded.leftOut,
  };
  if (!folded.seam) return { basedOn: folded.basedOn, summary: { ...empty, state: 'noSetup' } };
  if (!folded.rounds.length) return { basedOn: folded.basedOn, summary: { ...empty, state: 'noRounds' } };

  const leftOut = [...folded.leftOut];
  let kept = folded.readings;
  let file: SeamFile | null = null;
  for (let pass = 0; pass < MAX_PASSES && !file; pass++) {
    // Stored readings passed the reading schema when they arrived (judgeRecord); what is left to check here is
    // how they fit their seam and each other.
    const parsed = parseSeamFileWithCheckedReadings(
      seamFileOf(folded, []),
      kept.map((r) => r.reading),
      { allowNoReadings: true },
    );
    if (parsed.ok) {
      file = parsed.value;
      break;
    }
    const bad = new Map<number, string>();
    const seamProblems: Problem[] = [];
    for (const p of parsed.problems) {
      const m = READING_PATH.exec(p.path);
      if (m) {
        const i = Number(m[1]);
        bad.set(
          i,
          bad.has(i)
            ? `${bad.get(i)}; ${p.path.replace(READING_PATH, 'reading')}: ${p.message}`
            : `${p.path.replace(READING_PATH, 'reading')}: ${p.message}`,
        );
      } else seamProblems.push(p);
    }
    if (seamProblems.length) {
      return {
        basedOn: folded.basedOn,
        summary: { ...empty, leftOut, state: 'invalid', problems: seamProblems },
      };
    }
    for (const [i, reason] of bad) {
      const r = kept[i];
      if (r) leftOut.push({ recordId: r.recordId, reason });
    }
    kept = kept.filter((_, i) => !bad.has(i));
  }
  if (!file) {
    return {
      basedOn: folded.basedOn,
      summary: {
        ...empty,
        leftOut,
        state: 'invalid',
        problems: [{ path: 'readings', message: 'could not be brought into a gradable set' }],
      },
    };
  }
  lap('check');
  const grade = gradeSeam(file, undefined, { readings: 'columns' });
  const readingCount = file.readings.filter((r: Reading) => !r.withdrawn).length;
  lap('grade');
  return {
    basedOn: folded.basedOn,
    summary: {
      state: readingCount === 0 && grade.state === 'incomplete' ? 'noReadings' : grade.state,
      levelMet: grade.levelMet,
      meetsRequired: grade.meetsRequired,
      requiredLevel: grade.requiredLevel,
      gradedRound: grade.gradedRound,
      readingCount,
      rounds: grade.rounds.map((r) => ({
        round: r.round,
        complete: r.complete,
        levelMet: r.levelMet,
        meetsRequired: r.meetsRequired,
      })),
      unverifiedRows: grade.unverifiedRows,
      problems: [],
      leftOut,
    },
  };
}

/**
 * Re-grades seams after their records are stored. Requests only mark seams; one loop grades them, a seam marked
 * again while it is being graded is graded once more afterwards, so a burst of batches costs one grade per seam.
 */
export class Regrader {
  /** Readings the ingest stored just now, for the next re-grade of their seam (see FreshReadings). */
  readonly fresh = new FreshReadings();
  readonly #graded = new Set<(seamId: string) => void>();
  readonly #queue = new SeamQueue(
    async (seamId) => {
      await this.regrade(seamId);
      for (const listener of this.#graded) listener(seamId);
    },
    (seamId, error) => this.log.error('regradeFailed', { seamId, error }),
  );

  constructor(
    private readonly storage: Storage,
    private readonly now: () => Date,
    private readonly log: Logger,
  ) {}

  schedule(seamIds: Iterable<string>): void {
    this.#queue.schedule(seamIds);
  }

  /** Calls the listener after each scheduled re-grade is saved (the review facts follow the grade). */
  onGraded(listener: (seamId: string) => void): void {
    this.#graded.add(listener);
  }

  /** Resolves when every scheduled seam has been graded. */
  idle(): Promise<void> {
    return this.#queue.idle();
  }

  async regrade(seamId: string, timed?: (stage: RegradeStage, ms: number) => void): Promise<ServerGrade> {
    let mark = timed ? performance.now() : 0;
    const lap: StageTimer = (stage) => {
      if (!timed) return;
      const t = performance.now();
      timed(stage, t - mark);
      mark = t;
    };
    const held = this.fresh.take(seamId);
    const material = await this.storage.gradeMaterial(seamId, new Set(held.keys()));
    lap('read');
    const { basedOn, summary } = gradeFolded(material, lap, held);
    const grade: ServerGrade = {
      seamId,
      basedOn,
      gradedAt: this.now().toISOString(),
      state: summary.state,
      levelMet: summary.levelMet,
      meetsRequired: summary.meetsRequired,
      summary: JSON.stringify(summary),
    };
    await this.storage.saveServerGrade(grade);
    lap('save');
    return grade;
  }
}
