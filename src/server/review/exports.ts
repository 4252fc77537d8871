// The CSV exports of a selection of seams (the queue's filters, or seams named one by one): readings and seam
// summaries. Readings are read per seam with the same fold and left-out list as the grade, without grading again;
// the seam summaries read each seam's viewing records, for the viewing conditions the queue's rows do not hold.
import type { AppDeps } from '../deps.js';
import { foldViewing, type RoundViewing } from '../grading/fold.js';
import type { Device } from '../storage/types.js';
import { parseReviewQuery } from './query.js';
import { readingLines, type ReadingLine } from './seam-detail.js';
import { reviewSeam } from './seam-review.js';
import { readingsCsv, seamsCsv } from './csv.js';

/** The most seams one export or report takes. */
export const MAX_SELECTION = 5000;

/** Seam ids named with `seam=`, else those the queue's filters select (in its order). */
export async function selectedSeams(
  deps: AppDeps,
  params: URLSearchParams,
  max = MAX_SELECTION,
): Promise<string[]> {
  const named = params.getAll('seam').filter((s) => s.length > 0 && s.length <= 64);
  if (named.length) return [...new Set(named)].slice(0, max);
  return deps.storage.reviewSelection(parseReviewQuery(params), max);
}

async function seamReadings(deps: AppDeps, seamId: string, devices: ReadonlyMap<string, Device>) {
  const [material, grade] = await Promise.all([
    deps.storage.seamMaterial(seamId),
    deps.storage.getServerGrade(seamId),
  ]);
  const review = reviewSeam(material, grade, { readings: 'columns', sensitivity: false, grade: false });
  const readings: ReadingLine[] = readingLines(review, material.records, devices);
  return {
    id: seamId,
    label: review.folded.seam?.label ?? seamId,
    readings,
    viewing: review.folded.viewing,
  };
}

export async function readingsExport(deps: AppDeps, params: URLSearchParams): Promise<string> {
  const ids = await selectedSeams(deps, params);
  const devices = new Map((await deps.storage.listDevices()).map((d) => [d.kid, d]));
  const seams = [];
  for (const id of ids) seams.push(await seamReadings(deps, id, devices));
  return readingsCsv(seams);
}

export async function seamsExport(deps: AppDeps, params: URLSearchParams): Promise<string> {
  const named = params.getAll('seam');
  const page = await deps.storage.reviewQueue({
    ...parseReviewQuery(params),
    offset: 0,
    limit: MAX_SELECTION,
  });
  const rows = named.length ? page.rows.filter((r) => named.includes(r.seamId)) : page.rows;
  const viewing = new Map<string, readonly RoundViewing[]>();
  for (const r of rows) viewing.set(r.seamId, foldViewing(await deps.storage.viewingRecordsOf(r.seamId)));
  return seamsCsv(rows, viewing);
}
