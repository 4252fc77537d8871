// Pull on the server: a signed request with a fresh, single-use nonce; the reply lists the device's assignments
// and the decisions on seams it worked on, each signed by the server key.
import {
  cursorOf,
  MAX_PULL_ITEMS,
  parsePullPayload,
  PROTOCOL_VERSION,
  seqOfCursor,
  signServerItem,
  type ServerItem,
} from '../../protocol/index.js';
import { newToken } from '../auth/tokens.js';
import type { AppDeps } from '../deps.js';
import { HttpError } from '../http/errors.js';
import type { ChangeRow } from '../storage/types.js';
import { verifyDeviceRequest } from './ingest.js';
import type { SyncDeps } from './ingest.js';

export async function issueNonce(deps: AppDeps): Promise<{ nonce: string; expiresAt: string }> {
  const nonce = newToken(24);
  const expiresAt = new Date(deps.now().getTime() + deps.config.nonceSeconds * 1000).toISOString();
  await deps.storage.issueNonce(nonce, expiresAt);
  return { nonce, expiresAt };
}

function itemOf(change: ChangeRow, deviceKid: string): ServerItem {
  const stored = JSON.parse(change.item) as Record<string, unknown>;
  return {
    ...stored,
    protocol: PROTOCOL_VERSION,
    type: change.kind,
    seq: change.seq,
    deviceKid,
  } as ServerItem;
}

export async function pull(deps: AppDeps & SyncDeps, bodyText: string) {
  const { device, verified } = await verifyDeviceRequest(deps, bodyText, 'pull');
  const payload = parsePullPayload(verified.payload);
  const now = deps.now().toISOString();
  if (!(await deps.storage.consumeNonce(payload.nonce, now))) {
    deps.log.warn('security', { what: 'nonceRefused', kid: device.kid });
    throw new HttpError(
      401,
      'nonce',
      'this nonce is unknown, used or expired: ask for a new one (POST /api/sync/nonce)',
    );
  }
  await deps.storage.touchDevice(device.kid, now, {
    queued: payload.outbox.queued,
    oldestAt: payload.outbox.oldestQueuedAt ?? null,
  });
  const page = await deps.storage.changesFor(
    device.kid,
    seqOfCursor(payload.cursor),
    payload.limit ?? MAX_PULL_ITEMS,
  );
  const items = [];
  for (const change of page.changes) {
    items.push(
      await signServerItem(itemOf(change, device.kid), deps.serverKey.privateKey, deps.serverKey.kid),
    );
  }
  return { protocol: PROTOCOL_VERSION, cursor: cursorOf(page.through), more: page.more, items };
}
