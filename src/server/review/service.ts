// The review operations the pages and the JSON API share: the queue page (with its filter choices), one seam in
// full, its audit trail and its verifiable export.
import type { AppDeps } from '../deps.js';
import type { ReviewQuery } from '../storage/types.js';
import { auditEvents, seamBundle } from './audit.js';
import { seamDetail } from './seam-detail.js';

export async function reviewQueue(deps: AppDeps, query: ReviewQuery) {
  const [page, choices] = await Promise.all([deps.storage.reviewQueue(query), deps.storage.reviewChoices()]);
  return { page, choices, pending: deps.reviewIndexer.pending };
}

export async function seamAudit(deps: AppDeps, seamId: string) {
  const detail = await seamDetail(deps, seamId, { sensitivity: false });
  return { detail, events: auditEvents(detail) };
}

export async function seamExport(deps: AppDeps, seamId: string) {
  const detail = await seamDetail(deps, seamId, { sensitivity: false });
  return { ...seamBundle(deps, detail, deps.now().toISOString()), events: auditEvents(detail) };
}

/** A file name part from a seam id: letters, digits, dot, dash and underscore only. */
export const fileSafe = (text: string): string =>
  text.replace(/[^A-Za-z0-9._-]+/g, '_').slice(0, 80) || 'seam';
