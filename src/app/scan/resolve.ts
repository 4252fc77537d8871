// From tag text (camera, photo or typed) to what the Tag screen shows: a message for text that is no tag, the
// seam to open, or the choices the linking rules allow, with the seams' labels.
import { ownersOf, readTagText, scanOutcome, type ScanOutcome } from '../../domain/index.js';
import type { SeamRecord, Store, TagVia } from '../../store/api.js';

export type TagResolution =
  | { readonly kind: 'invalid'; readonly message: string }
  | {
      readonly kind: 'resolved';
      readonly tag: string;
      readonly via: TagVia;
      readonly outcome: ScanOutcome;
      /** The seams the outcome names, by id. */
      readonly seams: ReadonlyMap<string, SeamRecord>;
    };

export async function resolveTag(
  store: Store,
  raw: string,
  via: TagVia,
  currentSeamId: string | null,
): Promise<TagResolution> {
  const read = readTagText(raw);
  if (!read.ok) return { kind: 'invalid', message: read.message };
  const lookup = await store.lookupTag(read.tag);
  const current = currentSeamId === null ? undefined : await store.getSeam(currentSeamId);
  const owners = ownersOf(
    lookup.link ? { seamId: lookup.link.seamId, via: 'link' } : undefined,
    lookup.setupSeamIds,
  );
  const outcome = scanOutcome(owners, current ? current.id : null);
  const ids = new Set([...owners.map((o) => o.seamId), ...(current ? [current.id] : [])]);
  const seams = new Map<string, SeamRecord>();
  for (const id of ids) {
    const rec = id === current?.id ? current : await store.getSeam(id);
    if (rec) seams.set(id, rec);
  }
  return { kind: 'resolved', tag: read.tag, via, outcome, seams };
}
