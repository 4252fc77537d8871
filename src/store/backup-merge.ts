// How a record from a backup meets the one already here: the same content is a duplicate, a newer set-up
// revision replaces an older one, checklist answers merge when none contradicts, anything else is a conflict.
import type { OutboxEntry, RoundRecord, SeamRecord } from './api.js';
import { checkSeam } from './check-input.js';
import { sameContent } from './same-content.js';

/** What is wrong with a seam's set-up by the grader's rules, or '' when nothing is. */
export function seamProblems(seam: SeamRecord['seam']): string {
  try {
    checkSeam(seam);
    return '';
  } catch (error) {
    return error instanceof Error ? error.message.replace(/^Seam not saved:\n/, '') : String(error);
  }
}

export function withoutSeq(entry: OutboxEntry): Omit<OutboxEntry, 'seq'> {
  return {
    recordId: entry.recordId,
    kind: entry.kind,
    seamId: entry.seamId,
    body: entry.body,
    createdAt: entry.createdAt,
  };
}

type SeamDecision =
  | { readonly refuse: string; readonly write?: undefined }
  | { readonly refuse?: undefined; readonly write: 'add' | 'update' | 'none' };

/** A seam's set-up moves forward by revision only; the same revision with other content is a conflict. */
export function decideSeam(existing: SeamRecord | undefined, incoming: SeamRecord): SeamDecision {
  if (!existing) return { write: 'add' };
  if (existing.namespace !== incoming.namespace) {
    return {
      refuse: `seam "${incoming.id}" is ${existing.namespace} here and ${incoming.namespace} in the file; not merged`,
    };
  }
  if (incoming.revision === existing.revision) {
    return sameContent(incoming.seam, existing.seam)
      ? { write: 'none' }
      : {
          refuse: `conflict: revision ${incoming.revision} of seam "${incoming.id}" has other content here; the one here was kept`,
        };
  }
  if (incoming.revision > existing.revision) return { write: 'update' };
  return {
    refuse: `older set-up: the file has revision ${incoming.revision} of seam "${incoming.id}", this device has revision ${existing.revision}; the newer one was kept`,
  };
}

/** Unions two copies of one round's checklist; an item answered differently in each is a conflict. */
export function mergeRound(existing: RoundRecord, incoming: RoundRecord): RoundRecord | string {
  const where = `round ${incoming.number} of seam "${incoming.seamId}"`;
  const head = (r: RoundRecord) => ({ kind: r.kind, startedAt: r.startedAt, examiner: r.examiner });
  if (!sameContent(head(existing), head(incoming))) {
    return `conflict: ${where} is a different round here (kind, start time or examiner differ); the one here was kept`;
  }
  const clashes = Object.entries(incoming.checklist)
    .filter(([item, answer]) => {
      const here = existing.checklist[item as keyof RoundRecord['checklist']];
      return here !== undefined && !sameContent(here, answer);
    })
    .map(([item]) => item);
  if (clashes.length) {
    return `conflict: ${where} answers ${clashes.join(', ')} differently here; the answers here were kept`;
  }
  // Viewing conditions are kept as here; a round that has none here takes the backup's.
  const viewing = existing.viewing ?? incoming.viewing;
  return {
    ...existing,
    checklist: { ...incoming.checklist, ...existing.checklist },
    ...(viewing ? { viewing } : {}),
  };
}
