// Seams the supervisor sets up on the server (one by one, or from a seam list) and assigns to tablets. A seam is
// checked by the grading core's rules before it is kept; an imported list is checked row by row and kept only
// when every row is sound, so a list is never half imported.
import type { Seam } from '../../domain/index.js';
import { assignSeam, checkSeamSetup, putSeam } from '../admin/service.js';
import type { AppDeps } from '../deps.js';
import { HttpError } from '../http/errors.js';
import type { Account } from '../storage/types.js';
import { seamFromValues, type SeamValues } from './seam-fields.js';

export interface RowProblem {
  /** The row of the list (2 is the first row after the header), or 0 for the form. */
  readonly row: number;
  readonly message: string;
}

export async function checkRows(
  deps: AppDeps,
  rows: readonly SeamValues[],
  firstRow = 2,
): Promise<{ seams: Seam[]; problems: RowProblem[] }> {
  const seams: Seam[] = [];
  const problems: RowProblem[] = [];
  const ids = new Set<string>();
  for (const [i, values] of rows.entries()) {
    const row = firstRow + i;
    try {
      const seam = checkSeamSetup(seamFromValues(values));
      if (ids.has(seam.id))
        throw new HttpError(400, 'invalid', `seam id "${seam.id}" appears twice in the list`);
      if (await deps.storage.getSeam(seam.id))
        throw new HttpError(409, 'exists', `seam id "${seam.id}" exists already; nothing of it was changed`);
      ids.add(seam.id);
      seams.push(seam);
    } catch (error) {
      if (!(error instanceof HttpError)) throw error;
      problems.push({ row, message: error.message });
    }
  }
  return { seams, problems };
}

/** Keeps the seams (all checked already) and assigns each to the device when one is given. */
export async function createSeams(
  deps: AppDeps,
  by: Account,
  seams: readonly Seam[],
  assignTo: { readonly deviceKid: string; readonly note?: string } | null,
): Promise<number> {
  for (const seam of seams) {
    await putSeam(deps, by, seam, 'live');
    if (assignTo) await assignSeam(deps, by, { seamId: seam.id, ...assignTo });
  }
  deps.log.info('seamsCreated', {
    by: by.username,
    count: seams.length,
    assigned: assignTo?.deviceKid ?? null,
  });
  return seams.length;
}
