// Tag links in the store: each link and unlink is recorded in the outbox with the change (live seams only), a
// tag owned by another seam moves only on a confirmation naming that seam, and the demo's links leave with it.
import { describe, expect, it } from 'vitest';
import { StoreError } from '../../src/store/index.js';
import { TagConflictError } from '../../src/store/tag-links.js';
import { butt, freshStore } from './support.js';

const tagEvents = async (store: Awaited<ReturnType<typeof freshStore>>) =>
  (await store.outboxEntries())
    .filter((e) => e.kind === 'tagLink')
    .map((e) => {
      const body = e.body as { action: string; seamId: string; tag: string; via: string };
      return `${body.action} ${body.tag} ${body.seamId} ${body.via}`;
    });

describe('tag links', () => {
  it('links a free tag, finds it by any typed form, and queues the event', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    const link = await store.linkTag('s-1', ' KP-900\r\n', 'camera');
    expect(link).toMatchObject({ key: 'KP-900', tag: 'KP-900', seamId: 's-1', namespace: 'live' });
    expect((await store.lookupTag('kp-900')).link?.seamId).toBe('s-1');
    expect(await tagEvents(store)).toEqual(['link KP-900 s-1 camera']);
    expect((await store.seamTags('s-1')).map((l) => l.tag)).toEqual(['KP-900']);
  });

  it('linking again to the same seam records nothing new', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    await store.linkTag('s-1', 'KP-1', 'typed');
    await store.linkTag('s-1', 'kp-1', 'camera');
    expect(await tagEvents(store)).toEqual(['link KP-1 s-1 typed']);
  });

  it('refuses to move a tag of another seam without confirmation, and changes nothing', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-a'));
    await store.saveSeam(butt('s-b'));
    await store.linkTag('s-a', 'KP-2', 'camera');
    const refused = await store.linkTag('s-b', 'KP-2', 'camera').catch((e: unknown) => e);
    expect(refused).toBeInstanceOf(TagConflictError);
    expect((refused as TagConflictError).ownerSeamId).toBe('s-a');
    // A confirmation for some other seam is not a confirmation for this owner.
    await expect(store.linkTag('s-b', 'KP-2', 'camera', 's-c')).rejects.toBeInstanceOf(TagConflictError);
    expect((await store.lookupTag('KP-2')).link?.seamId).toBe('s-a');
    expect(await tagEvents(store)).toEqual(['link KP-2 s-a camera']);
  });

  it('moves a tag on confirmation as an unlink and a link, in one step', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-a'));
    await store.saveSeam(butt('s-b'));
    await store.linkTag('s-a', 'KP-3', 'camera');
    await store.linkTag('s-b', 'KP-3', 'photo', 's-a');
    expect((await store.lookupTag('KP-3')).link?.seamId).toBe('s-b');
    expect(await tagEvents(store)).toEqual([
      'link KP-3 s-a camera',
      'unlink KP-3 s-a confirmedMove',
      'link KP-3 s-b photo',
    ]);
  });

  it("treats a tag listed in another seam's set-up as owned by it", async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-a', { tags: ['KP-4'] }));
    await store.saveSeam(butt('s-b'));
    expect(await store.lookupTag('kp-4')).toMatchObject({ link: undefined, setupSeamIds: ['s-a'] });
    await expect(store.linkTag('s-b', 'KP-4', 'typed')).rejects.toBeInstanceOf(TagConflictError);
    // Its own seam may link it without a confirmation.
    await store.linkTag('s-a', 'KP-4', 'typed');
    expect((await store.lookupTag('KP-4')).link?.seamId).toBe('s-a');
  });

  it('unlinks only where the tag is linked, and records it', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-a'));
    await store.linkTag('s-a', 'KP-5', 'camera');
    expect(await store.unlinkTag('s-b', 'KP-5')).toBe(false);
    expect(await store.unlinkTag('s-a', 'kp-5')).toBe(true);
    expect((await store.lookupTag('KP-5')).link).toBeUndefined();
    expect(await tagEvents(store)).toEqual(['link KP-5 s-a camera', 'unlink KP-5 s-a typed']);
  });

  it('refuses empty and over-long tags with the message, and unknown seams', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-a'));
    await expect(store.linkTag('s-a', '  ', 'typed')).rejects.toThrow(/empty/);
    await expect(store.linkTag('s-a', 'x'.repeat(300), 'typed')).rejects.toThrow(/at most 256/);
    const missing = await store.linkTag('nope', 'KP-6', 'typed').catch((e: unknown) => e);
    expect(missing).toBeInstanceOf(StoreError);
    expect((missing as StoreError).code).toBe('notFound');
    expect(await store.listTagLinks()).toEqual([]);
  });

  it('stores injection payloads exactly as read', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-a'));
    const payload = `<script>alert("x")</script>'; DROP TABLE seams;--`;
    await store.linkTag('s-a', payload, 'camera');
    expect((await store.lookupTag(payload)).link?.tag).toBe(payload);
  });

  it('links demo seams without queuing anything, and removes them with the demo', async () => {
    const store = await freshStore();
    await store.loadDemo();
    const [demo] = await store.listSeams();
    if (!demo) throw new Error('no demo seam');
    await store.linkTag(demo.id, 'DEMO-TAG', 'camera');
    expect(await tagEvents(store)).toEqual([]);
    await store.removeDemo();
    expect(await store.listTagLinks()).toEqual([]);
  });
});

describe('tag links in backups', () => {
  it('travel in the backup and are restored onto another device', async () => {
    const source = await freshStore();
    await source.saveSeam(butt('s-a'));
    await source.linkTag('s-a', 'KP-BK-1', 'camera');
    const backup = JSON.parse(JSON.stringify(await source.exportBackup())) as unknown;
    const target = await freshStore();
    const report = await target.importBackup(backup);
    expect(report.refused).toEqual([]);
    expect(report.tagLinksAdded).toBe(1);
    expect((await target.lookupTag('kp-bk-1')).link?.seamId).toBe('s-a');
    // Again: nothing new.
    expect((await target.importBackup(backup)).tagLinksAdded).toBe(0);
  });

  it('never moves a tag linked to another seam here, and reads backups made before tag links', async () => {
    const source = await freshStore();
    await source.saveSeam(butt('s-a'));
    await source.saveSeam(butt('s-b'));
    await source.linkTag('s-a', 'KP-BK-2', 'camera');
    const backup = await source.exportBackup();
    const target = await freshStore();
    await target.saveSeam(butt('s-a'));
    await target.saveSeam(butt('s-b'));
    await target.linkTag('s-b', 'KP-BK-2', 'typed');
    const report = await target.importBackup(JSON.parse(JSON.stringify(backup)) as unknown);
    expect(report.tagLinksAdded).toBe(0);
    expect(report.refused).toEqual([
      { path: 'tagLinks[0]', reason: 'conflict: this tag is linked to seam "s-b" here; it was not moved' },
    ]);
    expect((await target.lookupTag('KP-BK-2')).link?.seamId).toBe('s-b');

    const older: Record<string, unknown> = { ...backup };
    delete older['tagLinks'];
    const fresh = await freshStore();
    expect((await fresh.importBackup(JSON.parse(JSON.stringify(older)) as unknown)).refused).toEqual([]);
  });

  it('refuses a link whose key is not its tag’s match key', async () => {
    const source = await freshStore();
    await source.saveSeam(butt('s-a'));
    await source.linkTag('s-a', 'KP-BK-3', 'camera');
    const backup = JSON.parse(JSON.stringify(await source.exportBackup())) as { tagLinks: { key: string }[] };
    const [link] = backup.tagLinks;
    if (link) link.key = 'OTHER';
    const report = await (await freshStore()).importBackup(backup);
    expect(report.refused).toEqual([
      { path: 'tagLinks[0]', reason: 'key: must be "KP-BK-3", the tag\'s match key' },
    ]);
  });
});
