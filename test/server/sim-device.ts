// A simulated tablet: its key, its outbox, and the sender's rules — a batch is sealed when first sent and resent
// byte for byte until every record is answered; only acknowledged records leave the outbox.
import {
  generateDeviceKey,
  isAcknowledged,
  parseBatchReply,
  JOSE_JSON,
  sealBatch,
  signEnrolRequest,
  signPullRequest,
  type BatchReply,
  type DeviceGrade,
  type DeviceKey,
  type OutboxEntryLike,
  type SealedBatch,
} from '../../src/protocol/index.js';
import { T0 } from './records.js';

interface Requester {
  request(path: string, init?: RequestInit): Promise<Response>;
}

export interface Sent {
  readonly status: number;
  readonly body: unknown;
}

export class SimDevice {
  #seq = 0;
  #batchSeq = 0;
  readonly outbox: OutboxEntryLike[] = [];
  /** Every record this device ever made, by id. */
  readonly made = new Map<string, OutboxEntryLike>();
  /** Batches sealed and not yet fully answered. */
  readonly pending: SealedBatch[] = [];
  readonly rejected = new Map<string, string>();

  private constructor(readonly key: DeviceKey) {}

  static async create(): Promise<SimDevice> {
    return new SimDevice(await generateDeviceKey());
  }

  get kid(): string {
    return this.key.kid;
  }

  add(
    kind: string,
    recordId: string,
    body: Readonly<Record<string, unknown>> & { readonly seamId: string },
    createdAt = T0,
  ): OutboxEntryLike {
    const entry = { seq: ++this.#seq, recordId, kind, seamId: body.seamId, body, createdAt };
    this.outbox.push(entry);
    this.made.set(recordId, entry);
    return entry;
  }

  async seal(
    entries: readonly OutboxEntryLike[] = this.unsealed(),
    deviceGrades?: readonly DeviceGrade[],
  ): Promise<SealedBatch> {
    const sealed = await sealBatch(
      { deviceSeq: ++this.#batchSeq, entries, ...(deviceGrades ? { deviceGrades } : {}) },
      this.key.privateKey,
      this.key.kid,
    );
    this.pending.push(sealed);
    return sealed;
  }

  /** Outbox entries not in any pending batch. */
  unsealed(): OutboxEntryLike[] {
    const inFlight = new Set(this.pending.flatMap((b) => b.recordIds));
    return this.outbox.filter((e) => !inFlight.has(e.recordId));
  }

  async post(server: Requester, path: string, body: string, contentType = JOSE_JSON): Promise<Sent> {
    const res = await server.request(path, {
      method: 'POST',
      headers: { 'content-type': contentType },
      body,
    });
    const text = await res.text();
    let parsed: unknown = text;
    try {
      parsed = JSON.parse(text);
    } catch {
      // Kept as text: tests look at it.
    }
    return { status: res.status, body: parsed };
  }

  /** Sends a sealed batch; on a 200 applies the reply to the outbox (acknowledged records leave it). */
  async send(server: Requester, batch: SealedBatch): Promise<Sent> {
    const sent = await this.post(server, '/api/sync/batches', batch.body);
    if (sent.status === 200) this.applyReply(batch, parseBatchReply(sent.body));
    return sent;
  }

  applyReply(batch: SealedBatch, reply: BatchReply): void {
    const done = new Set<string>();
    for (const r of reply.results) {
      if (r.id === null) continue;
      if (isAcknowledged(r)) done.add(r.id);
      else this.rejected.set(r.id, r.reason ?? '');
    }
    for (let i = this.outbox.length - 1; i >= 0; i--) {
      const e = this.outbox[i];
      if (e && done.has(e.recordId)) this.outbox.splice(i, 1);
    }
    // Answered in full (rejected records stay in the outbox, with their reason, outside any batch).
    const index = this.pending.indexOf(batch);
    if (index >= 0) this.pending.splice(index, 1);
  }

  async enrol(server: Requester, code: string, label?: string): Promise<Sent> {
    return this.post(server, '/api/sync/enrol', await signEnrolRequest(this.key, code, label));
  }

  async pull(server: Requester, cursor: string | null, queued = this.outbox.length): Promise<Sent> {
    const nonce = (await this.post(server, '/api/sync/nonce', '')).body as { nonce: string };
    const body = await signPullRequest(
      { nonce: nonce.nonce, cursor, queued },
      this.key.privateKey,
      this.key.kid,
    );
    return this.post(server, '/api/sync/pull', body);
  }
}
