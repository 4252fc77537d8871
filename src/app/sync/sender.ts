// The outbox sender. The store's outbox is the source of truth; this only moves records to the server and takes
// out of the outbox what the server acknowledged by id. A batch is sealed (signed) once, kept in the store, and
// resent byte for byte until every record in it is answered; new records go into new batches. A failed pass
// (no answer, 5xx, 429) keeps everything queued and tries again after a backoff with jitter; app start, the
// `online` event and "Send now" only wake it.
// Protocol modules by name, not the barrel: the sender is in the first paint (see device-vault.ts).
import { isAcknowledged, parseBatchReply, sealBatch, type BatchReply } from '../../protocol/batch.js';
import { JOSE_JSON } from '../../protocol/version.js';
import type { RecordAnswer, SealedBatchRecord, Store } from '../../store/api.js';
import { backoffDelay, DEFAULT_BACKOFF, type BackoffPolicy } from './backoff.js';
import type { DeviceVault } from './device-vault.js';
import { errorText, refusalText, type Transport } from './transport.js';

export type SenderStore = Pick<
  Store,
  | 'unsealedEntries'
  | 'nextBatchSeq'
  | 'keepSealedBatch'
  | 'pendingBatches'
  | 'noteAttempt'
  | 'settleBatch'
  | 'releaseBatch'
  | 'shownGrades'
>;

export type SenderState =
  /** Nothing to do, or everything sent. */
  | 'idle'
  | 'sending'
  /** The last pass failed; the next try is scheduled. */
  | 'waiting'
  /** The device has no enrolment: nothing is sent until it enrols. */
  | 'notEnrolled'
  /** The server refused the device's key (unknown or revoked): records wait until the device enrols again. */
  | 'keyRefused';

export interface SenderStatus {
  readonly state: SenderState;
  /** Consecutive failed passes. */
  readonly failures: number;
  readonly lastError: string | null;
  /** When the last pass ended (device clock, ms). */
  readonly lastPassAt: number | null;
  /** When the last pass that reached the server with every batch answered ended. */
  readonly lastSuccessAt: number | null;
  readonly nextAttemptAt: number | null;
}

export interface SenderOptions {
  readonly store: SenderStore;
  readonly vault: Pick<DeviceVault, 'key' | 'enrolment'>;
  /** The transport for the enrolled server. */
  readonly transport: (serverOrigin: string) => Transport;
  /** Records per batch (the protocol allows up to 1,000). */
  readonly batchSize?: number;
  readonly backoff?: BackoffPolicy;
  readonly now?: () => number;
  readonly random?: () => number;
  readonly setTimer?: (run: () => void, ms: number) => unknown;
  readonly clearTimer?: (timer: unknown) => void;
  /** Runs a pass under a lock shared by every tab (Web Locks in the page), so two tabs do not send at once. */
  readonly exclusive?: <T>(pass: () => Promise<T>) => Promise<T>;
}

/** How a pass ended. */
type PassEnd =
  | { readonly kind: 'done' }
  | { readonly kind: 'notEnrolled' }
  | { readonly kind: 'retry'; readonly error: string }
  | { readonly kind: 'keyRefused'; readonly error: string };

type SendResult =
  | { readonly kind: 'answered' }
  | { readonly kind: 'retry'; readonly error: string }
  /** Refused as a whole for a reason resending will not change soon (400, 413, 415, 422): skip it this pass. */
  | { readonly kind: 'refused'; readonly error: string }
  | { readonly kind: 'keyRefused'; readonly error: string };

const TRANSIENT = (status: number) => status >= 500 || status === 429 || status === 408;

export class OutboxSender {
  #status: SenderStatus = {
    state: 'idle',
    failures: 0,
    lastError: null,
    lastPassAt: null,
    lastSuccessAt: null,
    nextAttemptAt: null,
  };
  #running: Promise<SenderStatus> | null = null;
  #again = false;
  #timer: unknown = null;
  #stopped = false;
  readonly #listeners = new Set<(status: SenderStatus) => void>();
  readonly #o: Required<Omit<SenderOptions, 'exclusive'>> & Pick<SenderOptions, 'exclusive'>;

  constructor(options: SenderOptions) {
    this.#o = {
      batchSize: 200,
      backoff: DEFAULT_BACKOFF,
      now: () => Date.now(),
      random: () => Math.random(),
      setTimer: (run, ms) => setTimeout(run, ms),
      clearTimer: (timer) => clearTimeout(timer as ReturnType<typeof setTimeout>),
      ...options,
    };
  }

  get status(): SenderStatus {
    return this.#status;
  }

  subscribe(listener: (status: SenderStatus) => void): () => void {
    this.#listeners.add(listener);
    listener(this.#status);
    return () => this.#listeners.delete(listener);
  }

  /**
   * Sends what waits, now (a running pass finishes first and then runs again, so records made meanwhile go
   * too). Never rejects: failures end up in the status and schedule a retry.
   */
  sendNow(): Promise<SenderStatus> {
    if (this.#stopped) return Promise.resolve(this.#status);
    this.#cancelTimer();
    if (this.#running) {
      this.#again = true;
      return this.#running;
    }
    const run = (async () => {
      do {
        this.#again = false;
        await this.#onePass();
      } while (this.#again && !this.#stopped);
      return this.#status;
    })().finally(() => {
      this.#running = null;
    });
    this.#running = run;
    return run;
  }

  /** Stops scheduled retries (the page is going away, or a test is done). */
  stop(): void {
    this.#stopped = true;
    this.#cancelTimer();
  }

  async #onePass(): Promise<void> {
    this.#set({ state: 'sending', nextAttemptAt: null });
    let end: PassEnd;
    try {
      const pass = () => this.#pass();
      end = await (this.#o.exclusive ? this.#o.exclusive(pass) : pass());
    } catch (error) {
      // The store or the key failed (IndexedDB closed, quota, a browser fault): nothing left the outbox.
      end = { kind: 'retry', error: `could not prepare the records to send (${errorText(error)})` };
    }
    const at = this.#o.now();
    switch (end.kind) {
      case 'done':
        this.#set({ state: 'idle', failures: 0, lastError: null, lastPassAt: at, lastSuccessAt: at });
        return;
      case 'notEnrolled':
        this.#set({ state: 'notEnrolled', lastPassAt: at });
        return;
      case 'keyRefused':
        this.#set({ state: 'keyRefused', lastError: end.error, lastPassAt: at });
        return;
      case 'retry': {
        const failures = this.#status.failures + 1;
        const delay = backoffDelay(failures, this.#o.random, this.#o.backoff);
        this.#set({
          state: 'waiting',
          failures,
          lastError: end.error,
          lastPassAt: at,
          nextAttemptAt: at + delay,
        });
        if (!this.#stopped) {
          this.#timer = this.#o.setTimer(() => {
            this.#timer = null;
            void this.sendNow();
          }, delay);
        }
        return;
      }
    }
  }

  async #pass(): Promise<PassEnd> {
    const { store, vault } = this.#o;
    const enrolment = await vault.enrolment();
    if (!enrolment) return { kind: 'notEnrolled' };
    const transport = this.#o.transport(enrolment.serverOrigin);
    const key = await vault.key();
    const tried = new Set<string>();
    let firstError: string | null = null;
    for (;;) {
      const batch = (await store.pendingBatches()).find((b) => !tried.has(b.batchId));
      if (!batch) {
        const entries = await store.unsealedEntries(this.#o.batchSize);
        if (entries.length === 0) break;
        const deviceSeq = await store.nextBatchSeq();
        // The grades this tablet showed for the batch's seams travel with it, so the review can set them beside
        // the server's own (protocol 1's optional deviceGrades: a server that keeps none ignores nothing else).
        const deviceGrades = await store.shownGrades(entries.map((e) => e.seamId));
        const sealed = await sealBatch({ deviceSeq, entries, deviceGrades }, key.privateKey, key.kid);
        // Not kept when another tab sealed some of these records first: that batch was never sent; look again.
        await store.keepSealedBatch({
          batchId: sealed.batchId,
          deviceSeq,
          kid: key.kid,
          recordIds: sealed.recordIds,
          body: sealed.body,
        });
        continue;
      }
      tried.add(batch.batchId);
      const result = await this.#send(transport, batch);
      switch (result.kind) {
        case 'answered':
          break;
        case 'refused':
          // Other batches may still go through; this one stays, with its error, for the next pass.
          firstError ??= result.error;
          break;
        case 'retry':
          return { kind: 'retry', error: result.error };
        case 'keyRefused':
          if (batch.kid !== key.kid) {
            // Sealed under the key this device had before it enrolled again: those bytes will never be
            // accepted, so the records go into new batches under the current key.
            await store.releaseBatch(batch.batchId);
            tried.delete(batch.batchId);
            break;
          }
          return { kind: 'keyRefused', error: result.error };
      }
    }
    return firstError === null ? { kind: 'done' } : { kind: 'retry', error: firstError };
  }

  async #send(transport: Transport, batch: SealedBatchRecord): Promise<SendResult> {
    const { store } = this.#o;
    let res: Response;
    try {
      res = await transport('/api/sync/batches', {
        method: 'POST',
        headers: { 'content-type': JOSE_JSON },
        body: batch.body,
      });
    } catch (error) {
      // A lost answer looks the same as no delivery: the batch is resent as it is and the server answers
      // "duplicate" for what it already holds.
      const text = `no answer from the server (${errorText(error)})`;
      await store.noteAttempt(batch.batchId, text);
      return { kind: 'retry', error: text };
    }
    if (res.status === 200) {
      let reply: BatchReply;
      try {
        reply = parseBatchReply(await res.json());
        if (reply.batchId !== batch.batchId) throw new Error('the answer names another batch');
      } catch (error) {
        const text = `the server's answer could not be read (${errorText(error)})`;
        await store.noteAttempt(batch.batchId, text);
        return { kind: 'retry', error: text };
      }
      await store.noteAttempt(batch.batchId, null);
      await store.settleBatch(batch.batchId, answersOf(reply));
      return { kind: 'answered' };
    }
    const refusal = await refusalText(res);
    await store.noteAttempt(batch.batchId, refusal.text);
    if (TRANSIENT(res.status)) return { kind: 'retry', error: refusal.text };
    if (res.status === 401 || res.status === 403) {
      return {
        kind: 'keyRefused',
        error: `${refusal.text}. The records stay on this tablet; enrol it again to send them.`,
      };
    }
    return { kind: 'refused', error: refusal.text };
  }

  #cancelTimer(): void {
    if (this.#timer !== null) {
      this.#o.clearTimer(this.#timer);
      this.#timer = null;
    }
  }

  #set(change: Partial<SenderStatus>): void {
    this.#status = { ...this.#status, ...change };
    for (const listener of this.#listeners) {
      try {
        listener(this.#status);
      } catch {
        // A failing screen must not stop the sender.
      }
    }
  }
}

function answersOf(reply: BatchReply): RecordAnswer[] {
  const answers: RecordAnswer[] = [];
  for (const r of reply.results) {
    if (r.id === null) continue;
    answers.push({
      id: r.id,
      acknowledged: isAcknowledged(r),
      ...(r.reason !== undefined ? { reason: r.reason } : {}),
    });
  }
  return answers;
}
