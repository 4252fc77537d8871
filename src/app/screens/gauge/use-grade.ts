import { useCallback, useRef, useState } from 'preact/hooks';
import {
  describeProblems,
  levelText,
  type Level,
  type Reading,
  type ReadingGrade,
  type SeamFile,
  type SeamGrade,
} from '../../../domain/index.js';
import type { Store } from '../../../store/api.js';
import { gradeInWorker } from '../../services/grading.js';
import { findReadingGrade, roundSoFar, type SoFar } from './grade-view.js';

export interface GradeShown {
  readonly heading: string;
  readonly reading: Reading | null;
  readonly grade: ReadingGrade | null;
  readonly soFar: SoFar | null;
  readonly required: Level | null;
  readonly pending: boolean;
  readonly error: string | null;
}

const message = (e: unknown): string => (e instanceof Error ? e.message : String(e));

function summaryOf(g: SeamGrade): Parameters<Store['setSummary']>[1] {
  const count = g.rounds.reduce((n, r) => n + r.readingCount, 0);
  return {
    state: count === 0 ? 'noReadings' : g.state,
    levelMet: g.levelMet,
    meetsRequired: g.meetsRequired,
    readingCount: count,
    gradedAt: new Date().toISOString(),
  };
}

/**
 * Asks the grading worker for the seam's grade and picks out one reading's grade and the round's standing. Only
 * the latest request's answer is shown, so a quick second save never shows the first one's result last.
 */
export function useGrade(store: Store, seamId: string) {
  const [shown, setShown] = useState<GradeShown | null>(null);
  const ticket = useRef(0);
  const grade = useCallback(
    async (
      file: SeamFile,
      round: number,
      heading: string,
      reading: Reading | null,
      saveSummary: boolean,
    ): Promise<string | null> => {
      const mine = ++ticket.current;
      setShown((prev) => ({
        heading,
        reading,
        grade: null,
        soFar: prev?.soFar ?? null,
        required: prev?.required ?? null,
        pending: true,
        error: null,
      }));
      try {
        const reply = await gradeInWorker(file);
        if (mine !== ticket.current) return null;
        if (!reply.ok) {
          setShown({
            heading,
            reading,
            grade: null,
            soFar: null,
            required: null,
            pending: false,
            error: `The grader refused the seam record: ${describeProblems(reply.problems)}`,
          });
          return null;
        }
        const found = reading ? findReadingGrade(reply.grade, reading.id) : null;
        const soFar = roundSoFar(reply.grade, round);
        setShown({
          heading,
          reading,
          grade: found?.reading ?? null,
          soFar,
          required: reply.grade.requiredLevel,
          pending: false,
          error: null,
        });
        if (saveSummary) {
          // The Seams list shows this cached summary; the grade itself is always recomputed.
          store.setSummary(seamId, summaryOf(reply.grade)).catch(() => undefined);
        }
        const level = found?.reading.levelMet;
        return level ? `level met by this reading: ${levelText(level)}; ${soFar.text}` : soFar.text;
      } catch (e) {
        if (mine === ticket.current) {
          setShown((prev) => ({
            heading,
            reading,
            grade: null,
            soFar: prev?.soFar ?? null,
            required: prev?.required ?? null,
            pending: false,
            error: `Saved, but the grade could not be worked out (${message(e)}). It will be graded when the seam is opened again.`,
          }));
        }
        return null;
      }
    },
    [store, seamId],
  );
  return { shown, grade };
}
