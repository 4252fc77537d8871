import { useCallback, useEffect, useRef, useState } from 'preact/hooks';
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
import type { EntryReply } from '../../../../workers/entry-check-api.js';
import { entryCheckWorker } from '../../services/entry-check.js';
import { roundSoFar, type SoFar } from './grade-view.js';

export interface GradeShown {
  readonly heading: string;
  readonly reading: Reading | null;
  readonly grade: ReadingGrade | null;
  readonly soFar: SoFar | null;
  readonly required: Level | null;
  readonly pending: boolean;
  readonly error: string | null;
}

const SUMMARY_DELAY_MS = 1500;

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
 * Asks the entry-check worker for the seam's standing and one reading's grade. The worker keeps its own copy of
 * the seam: the first request sends the seam whole, later ones only the readings entered since, and the answer
 * carries no per-reading grades, so a save costs the page the same with ten readings or ten thousand. Only the
 * latest request's answer is shown, so a quick second save never shows the first one's result last.
 */
export function useGrade(store: Store, seamId: string) {
  const [shown, setShown] = useState<GradeShown | null>(null);
  const ticket = useRef(0);
  // The Seams list's cached summary is written once entries pause (and when the screen closes), not once per
  // save: it is a durable write, and the list grades every seam again when it opens anyway.
  const summary = useRef<{ timer: ReturnType<typeof setTimeout>; write: () => void } | null>(null);
  const flushSummary = useCallback(() => {
    const pending = summary.current;
    summary.current = null;
    if (!pending) return;
    clearTimeout(pending.timer);
    pending.write();
  }, []);
  useEffect(() => flushSummary, [flushSummary]);
  const queueSummary = useCallback(
    (write: () => void) => {
      if (summary.current) clearTimeout(summary.current.timer);
      summary.current = { timer: setTimeout(flushSummary, SUMMARY_DELAY_MS), write };
    },
    [flushSummary],
  );
  // How many readings of the seam the worker's copy holds; null until it has one.
  const sent = useRef<number | null>(null);

  const ask = useCallback(async (file: SeamFile, focus: string | null): Promise<EntryReply> => {
    const api = entryCheckWorker();
    const base = sent.current;
    // Counted as sent before the answer comes: the worker takes requests in order, so the next save extends it.
    sent.current = file.readings.length;
    try {
      let reply =
        base === null || base > file.readings.length
          ? await api.open(file, focus)
          : await api.update(
              { seam: file.seam, rounds: file.rounds, base, added: file.readings.slice(base) },
              focus,
            );
      if (reply.ok === 'resync') {
        sent.current = file.readings.length;
        reply = await api.open(file, focus);
      }
      if (reply.ok !== true) sent.current = null;
      return reply;
    } catch (e) {
      sent.current = null;
      throw e;
    }
  }, []);
  const grade = useCallback(
    async (
      file: SeamFile,
      round: number,
      heading: string,
      reading: Reading | null,
      saveSummary: boolean,
      /** Called with the words for the screen's status line in the same update that shows the grade. */
      onSaid?: (said: string) => void,
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
        const reply = await ask(file, reading?.id ?? null);
        if (mine !== ticket.current) return null;
        if (reply.ok !== true) {
          const problems = reply.ok === false ? reply.problems : [];
          setShown({
            heading,
            reading,
            grade: null,
            soFar: null,
            required: null,
            pending: false,
            error: `The grader refused the seam record: ${describeProblems(problems)}`,
          });
          return null;
        }
        const found = reply.reading;
        const soFar = roundSoFar(reply.standing, round);
        setShown({
          heading,
          reading,
          grade: found,
          soFar,
          required: reply.standing.requiredLevel,
          pending: false,
          error: null,
        });
        if (saveSummary) {
          // The Seams list shows this cached summary; the grade itself is always recomputed.
          const next = summaryOf(reply.standing);
          queueSummary(() => void store.setSummary(seamId, next).catch(() => undefined));
        }
        const level = found?.levelMet;
        const said = level ? `level met by this reading: ${levelText(level)}; ${soFar.text}` : soFar.text;
        onSaid?.(said);
        return said;
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
    [store, seamId, ask, queueSummary],
  );
  return { shown, grade };
}
