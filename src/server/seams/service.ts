// Seams the supervisor sets up on the server (one by one, or from a seam list) and assigns to tablets. A seam is
// checked by the grading core's rules before it is kept; an imported list is checked row by row and kept only
// when every row is sound, so a list is never half imported.
import type { Seam } from '../../domain/index.js';
import {
  assignSeam,
  checkSeamSetup,
  inspectorAccount,
  putSeam,
  type AssignTarget,
} from '../admin/service.js';
import type { AppDeps } from '../deps.js';
import { HttpError } from '../http/errors.js';
import type { Account } from '../storage/types.js';
import { seamFromValues, type SeamValues } from './seam-fields.js';

export interface RowProblem {
  /** The line of the list's file the row starts on, or 0 for the form or the list as a whole. */
  readonly line: number;
  readonly message: string;
}

/** One row of a list as checked: the seam it makes, or why it makes none. */
export type RowResult =
  | { readonly line: number; readonly seam: Seam; readonly problem?: undefined }
  | { readonly line: number; readonly problem: string; readonly seam?: undefined };

/**
 * Checks every row (the grading core's set-up rules, ids unique in the list and new to the server) without
 * keeping anything. lines[i] is the file line of rows[i]; the form's single row has line 0.
 */
export async function checkRows(
  deps: AppDeps,
  rows: readonly SeamValues[],
  lines: readonly number[] = [],
): Promise<{ seams: Seam[]; problems: RowProblem[]; results: RowResult[] }> {
  const seams: Seam[] = [];
  const problems: RowProblem[] = [];
  const results: RowResult[] = [];
  const ids = new Set<string>();
  for (const [i, values] of rows.entries()) {
    const line = lines[i] ?? 0;
    try {
      const seam = checkSeamSetup(seamFromValues(values));
      if (ids.has(seam.id))
        throw new HttpError(400, 'invalid', `seam id "${seam.id}" appears twice in the list`);
      if (await deps.storage.getSeam(seam.id))
        throw new HttpError(409, 'exists', `seam id "${seam.id}" exists already; nothing of it was changed`);
      ids.add(seam.id);
      seams.push(seam);
      results.push({ line, seam });
    } catch (error) {
      if (!(error instanceof HttpError)) throw error;
      problems.push({ line, message: error.message });
      results.push({ line, problem: error.message });
    }
  }
  return { seams, problems, results };
}

/** A tablet or an inspector account to assign seams to, with a note for the inspector. */
export type AssignTo = AssignTarget & { readonly note?: string };

/** Refuses (4xx) a tablet or inspector that cannot be assigned to, before anything is kept. */
export async function checkAssignTo(deps: AppDeps, assignTo: AssignTo): Promise<void> {
  if (assignTo.inspector !== undefined) {
    await inspectorAccount(deps, assignTo.inspector);
    return;
  }
  const device = await deps.storage.getDevice(assignTo.deviceKid);
  if (!device) throw new HttpError(404, 'unknownDevice', 'no device is enrolled with this kid');
  if (device.revokedAt !== null) throw new HttpError(409, 'revoked', 'this device is revoked');
}

/** Keeps the seams (all checked already) and assigns each to the tablet or inspector when one is given. */
export async function createSeams(
  deps: AppDeps,
  by: Account,
  seams: readonly Seam[],
  assignTo: AssignTo | null,
): Promise<number> {
  // The target is checked first, so a list is never kept without the assignment asked for.
  if (assignTo) await checkAssignTo(deps, assignTo);
  for (const seam of seams) {
    await putSeam(deps, by, seam, 'live');
    if (assignTo) await assignSeam(deps, by, { seamId: seam.id, ...assignTo });
  }
  deps.log.info('seamsCreated', {
    by: by.username,
    count: seams.length,
    assigned: assignTo?.deviceKid ?? assignTo?.inspector ?? null,
  });
  return seams.length;
}
