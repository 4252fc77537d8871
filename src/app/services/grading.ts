import { wrap, type Remote } from 'comlink';
import type { SeamFile } from '../../domain/index.js';
import type { GradeApi, GradeReply } from '../../../workers/grade-api.js';

// The page never grades itself: it asks the grading worker, started on first use and kept for the session.
let api: Remote<GradeApi> | null = null;

function worker(): Remote<GradeApi> {
  if (!api) {
    const w = new Worker(new URL('../../../workers/grade.worker.ts', import.meta.url), { type: 'module' });
    api = wrap<GradeApi>(w);
  }
  return api;
}

/** Grades a seam as the app keeps it (a new seam may have no readings yet). */
export function gradeInWorker(file: SeamFile): Promise<GradeReply> {
  return worker().grade(file, undefined, { allowNoReadings: true });
}
