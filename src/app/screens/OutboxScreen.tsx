// The Outbox: what waits to reach the server and why, the sender's state with "Send now", and the tablet's
// enrolment. Records leave only when the server confirms them; nothing on this screen deletes unsent data.
import { useCallback, useEffect, useState } from 'preact/hooks';
import type { OutboxItem } from '../../store/api.js';
import { getStore } from '../services/store.js';
import { getSync, type SyncClient } from '../services/sync.js';
import type { SenderStatus } from '../sync/sender.js';
import { describeSender } from './outbox/describe.js';
import { EnrolmentPanel } from './outbox/EnrolmentPanel.js';
import { WaitingList } from './outbox/WaitingList.js';

const errorText = (e: unknown) => (e instanceof Error ? e.message : String(e));

export default function OutboxScreen() {
  const [sync, setSync] = useState<SyncClient | null>(null);
  const [status, setStatus] = useState<SenderStatus | null>(null);
  const [items, setItems] = useState<OutboxItem[] | null>(null);
  const [error, setError] = useState<string | null>(null);

  const refresh = useCallback(() => {
    getStore()
      .then((s) => s.outboxItems())
      .then(setItems, (e: unknown) => setError(`The outbox could not be read: ${errorText(e)}`));
  }, []);

  useEffect(() => {
    let unsubscribe = () => {};
    getSync().then(
      (client) => {
        setSync(client);
        unsubscribe = client.sender.subscribe((s) => {
          setStatus(s);
          if (s.state !== 'sending') refresh();
        });
      },
      (e: unknown) => setError(`Sending cannot start: ${errorText(e)}`),
    );
    refresh();
    return () => unsubscribe();
  }, [refresh]);

  const refused = items?.filter((i) => i.send?.rejected).length ?? 0;
  const line = status && items ? describeSender(status, items.length, refused) : null;
  // Batches sealed while the tablet had a key, but no key now: the browser cleared the key's storage (F15).
  const keyLost = status?.state === 'notEnrolled' && (items ?? []).some((i) => i.send?.batchId !== undefined);
  return (
    <section class="outbox" aria-labelledby="outbox-title">
      <h1 id="outbox-title">Outbox</h1>
      <p>
        Seam set-ups, rounds, checklist answers and readings wait here until the yard server confirms it holds
        them. Demo seams are never sent. Nothing here deletes unsent records.
      </p>
      {error ? (
        <p role="alert" class="help help-error">
          ⚠ {error}
        </p>
      ) : null}
      {keyLost ? (
        <p role="alert" class="banner banner-bad">
          ⚠ This tablet's device key is gone: the browser cleared part of its storage. The records are still
          here. Enrol again with a new code from the supervisor; they will then be sent.
        </p>
      ) : null}
      <div class="panel" aria-live="polite">
        <h2>Sending</h2>
        <p class="sender-state" data-state={status?.state ?? 'starting'}>
          {line ? (
            <>
              <span aria-hidden="true">{line.mark} </span>
              {line.text}
            </>
          ) : (
            'Starting…'
          )}
        </p>
        <p>
          <strong class="outbox-count">{items === null ? '…' : items.length}</strong> waiting.
        </p>
        <button
          type="button"
          class="primary"
          disabled={!sync || status?.state === 'sending'}
          onClick={() => void sync?.sender.sendNow()}
        >
          Send now
        </button>
      </div>
      {sync ? <EnrolmentPanel sync={sync} /> : null}
      <div class="panel">
        <h2>Waiting records</h2>
        {items ? <WaitingList items={items} /> : <p>Reading the outbox…</p>}
      </div>
    </section>
  );
}
