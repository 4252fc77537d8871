// Tag links: which seam a tag fixed to the work leads to. Each link and unlink is written with its outbox entry in
// one transaction (live seams), so it syncs like a reading; a tag owned by another seam moves only when the
// caller names that owner as confirmed.
import { planLink, planUnlink, readTagText, tagKey, type LinkEvent } from '../domain/index.js';
import type { Namespace, SeamRecord, TagLinkRecord, TagLookup, TagVia } from './api.js';
import type { StoreContext } from './context.js';
import { StoreError } from './errors.js';
import { entryForAdd, outboxEntry } from './records.js';

/** The tag belongs to another seam and the move was not confirmed for it. */
export class TagConflictError extends StoreError {
  constructor(
    readonly tag: string,
    readonly ownerSeamId: string,
  ) {
    super(
      'conflict',
      `Tag not moved: it belongs to seam "${ownerSeamId}". Confirm the move to link it here.`,
    );
  }
}

const seamNotFound = (seamId: string) =>
  new StoreError('notFound', `No seam with id "${seamId}" is stored on this device.`);

function cleanTag(raw: string): { tag: string; key: string } {
  const read = readTagText(raw);
  if (!read.ok) throw new StoreError('invalid', read.message);
  return read;
}

/** Seams whose set-up lists the tag, each once. */
const setupOwners = (seams: readonly SeamRecord[], key: string): string[] =>
  seams.filter((s) => (s.seam.tags ?? []).some((t) => tagKey(t) === key)).map((s) => s.id);

export async function lookupTag(ctx: StoreContext, raw: string): Promise<TagLookup> {
  const { tag, key } = cleanTag(raw);
  return ctx.conn.run(['tagLinks', 'seams'], 'readonly', async (tx) => {
    const link = await tx.objectStore('tagLinks').get(key);
    const setupSeamIds = link ? [] : setupOwners(await tx.objectStore('seams').getAll(), key);
    return { tag, key, link, setupSeamIds };
  });
}

export const seamTags = (ctx: StoreContext, seamId: string): Promise<TagLinkRecord[]> =>
  ctx.conn.run(['tagLinks'], 'readonly', (tx) => tx.store.index('bySeam').getAll(seamId));

export async function linkTag(
  ctx: StoreContext,
  seamId: string,
  raw: string,
  via: TagVia,
  confirmedFrom?: string,
): Promise<TagLinkRecord> {
  const { tag, key } = cleanTag(raw);
  const now = ctx.now();
  const ids = [ctx.newId(), ctx.newId()];
  return ctx.conn.run(['seams', 'tagLinks', 'outbox'], 'readwrite', async (tx) => {
    const seams = tx.objectStore('seams');
    const target = await seams.get(seamId);
    if (!target) throw seamNotFound(seamId);
    const links = tx.objectStore('tagLinks');
    const held = await links.get(key);
    const owner =
      held?.seamId ?? setupOwners(await seams.getAll(), key).find((id) => id !== seamId && id !== undefined);
    const plan = planLink(owner, seamId, confirmedFrom);
    if (plan.kind === 'needsConfirmation') throw new TagConflictError(tag, plan.ownerSeamId);
    const record: TagLinkRecord = { key, tag, seamId, namespace: target.namespace, linkedAt: now, via };
    if (plan.events.length === 0 && held) return held;
    await links.put(record);
    for (const [i, event] of plan.events.entries()) {
      const namespace = event.seamId === seamId ? target.namespace : await namespaceOf(seams, event.seamId);
      if (namespace !== 'live') continue;
      await queue(
        tx.objectStore('outbox'),
        ids[i] ?? ctx.newId(),
        event,
        tag,
        event.action === 'unlink' ? 'confirmedMove' : via,
        now,
      );
    }
    return record;
  });
}

export async function unlinkTag(ctx: StoreContext, seamId: string, raw: string): Promise<boolean> {
  const { key } = cleanTag(raw);
  const now = ctx.now();
  const id = ctx.newId();
  return ctx.conn.run(['tagLinks', 'outbox'], 'readwrite', async (tx) => {
    const links = tx.objectStore('tagLinks');
    const held = await links.get(key);
    const [event] = planUnlink(held?.seamId, seamId);
    if (!event || !held) return false;
    await links.delete(key);
    if (held.namespace === 'live') await queue(tx.objectStore('outbox'), id, event, held.tag, 'typed', now);
    return true;
  });
}

async function namespaceOf(
  seams: { get(id: string): Promise<SeamRecord | undefined> },
  seamId: string,
): Promise<Namespace | undefined> {
  return (await seams.get(seamId))?.namespace;
}

function queue(
  outbox: { add(entry: ReturnType<typeof entryForAdd>): Promise<number> },
  recordId: string,
  event: LinkEvent,
  tag: string,
  via: TagVia | 'confirmedMove',
  at: string,
): Promise<number> {
  return outbox.add(
    entryForAdd(
      outboxEntry('tagLink', recordId, { seamId: event.seamId, action: event.action, tag, via, at }, at),
    ),
  );
}
