// Pull: what the server has for this device — review decisions on its seams and seams assigned to it. Each pull
// asks for a fresh single-use nonce, signs the request with the device key, and checks every item with the server
// key learnt at enrolment (kept in the device vault) and that it is addressed to this device. A page with any
// item that does not verify is not kept and the cursor does not move: nothing unverified reaches the store.
// DOM-free (a fetch-shaped Transport), like the sender.
import * as v from 'valibot';
import {
  JOSE_JSON,
  nonceReplySchema,
  pullReplySchema,
  signPullRequest,
  verifyServerItem,
  type FlattenedJws,
} from '../../protocol/index.js';
import type { PullApplied, PulledItem, Store } from '../../store/api.js';
import type { DeviceVault } from './device-vault.js';
import { errorText, refusalText, type Transport } from './transport.js';

export type PullerStore = Pick<Store, 'pullCursor' | 'receivePulled' | 'outboxCount' | 'outboxEntries'>;

export type PullOutcome =
  | { readonly kind: 'notEnrolled' }
  | { readonly kind: 'pulled'; readonly applied: PullApplied }
  | { readonly kind: 'failed'; readonly error: string };

export interface PullerOptions {
  readonly store: PullerStore;
  readonly vault: Pick<DeviceVault, 'key' | 'enrolment'>;
  readonly transport: (serverOrigin: string) => Transport;
  /** Pages in one pull at most (the server sends up to 200 items a page). */
  readonly maxPages?: number;
}

const NONE: PullApplied = { decisions: 0, assignments: 0, seamsAdded: 0, roundsOpened: 0 };

const add = (a: PullApplied, b: PullApplied): PullApplied => ({
  decisions: a.decisions + b.decisions,
  assignments: a.assignments + b.assignments,
  seamsAdded: a.seamsAdded + b.seamsAdded,
  roundsOpened: a.roundsOpened + b.roundsOpened,
});

export class Puller {
  #running: Promise<PullOutcome> | null = null;
  #again = false;
  readonly #listeners = new Set<(outcome: PullOutcome) => void>();

  constructor(private readonly options: PullerOptions) {}

  /** Called after every pull with what it brought (screens refresh on it). */
  subscribe(listener: (outcome: PullOutcome) => void): () => void {
    this.#listeners.add(listener);
    return () => this.#listeners.delete(listener);
  }

  /** Pulls now; a pull asked for while one runs follows it. Never rejects. */
  pullNow(): Promise<PullOutcome> {
    if (this.#running) {
      this.#again = true;
      return this.#running;
    }
    const run = (async () => {
      let outcome: PullOutcome;
      do {
        this.#again = false;
        outcome = await this.#pull().catch((error: unknown): PullOutcome => ({
          kind: 'failed',
          error: errorText(error),
        }));
        for (const listener of this.#listeners) {
          try {
            listener(outcome);
          } catch {
            // A failing screen must not stop the puller.
          }
        }
      } while (this.#again);
      return outcome;
    })().finally(() => {
      this.#running = null;
    });
    this.#running = run;
    return run;
  }

  async #pull(): Promise<PullOutcome> {
    const { store, vault } = this.options;
    const enrolment = await vault.enrolment();
    if (!enrolment) return { kind: 'notEnrolled' };
    const key = await vault.key();
    const transport = this.options.transport(enrolment.serverOrigin);
    const server = { kid: enrolment.serverKid, jwk: enrolment.serverJwk };
    let applied = NONE;
    for (let page = 0; page < (this.options.maxPages ?? 20); page++) {
      const nonceRes = await transport('/api/sync/nonce', { method: 'POST' });
      if (nonceRes.status !== 200) return { kind: 'failed', error: (await refusalText(nonceRes)).text };
      const { nonce } = v.parse(nonceReplySchema, await nonceRes.json());
      const cursor = await store.pullCursor();
      // What waits here, and since when (device clock), for the supervisor's Devices page.
      const [oldest] = await store.outboxEntries(1);
      const body = await signPullRequest(
        {
          nonce,
          cursor,
          queued: await store.outboxCount(),
          ...(oldest ? { oldestQueuedAt: oldest.createdAt } : {}),
        },
        key.privateKey,
        key.kid,
      );
      const res = await transport('/api/sync/pull', {
        method: 'POST',
        headers: { 'content-type': JOSE_JSON },
        body,
      });
      if (res.status !== 200) return { kind: 'failed', error: (await refusalText(res)).text };
      const reply = v.parse(pullReplySchema, await res.json());
      const items: PulledItem[] = [];
      for (const raw of reply.items) {
        const item = await verifyServerItem(raw, server, enrolment.deviceKid);
        const signed = raw as FlattenedJws;
        const jws = { protected: signed.protected, payload: signed.payload, signature: signed.signature };
        items.push(
          item.type === 'decision'
            ? {
                type: 'decision',
                id: item.id,
                seamId: item.seamId,
                round: item.round,
                outcome: item.outcome,
                ...(item.comment !== undefined ? { comment: item.comment } : {}),
                decidedBy: item.decidedBy,
                decidedAt: item.decidedAt,
                signed: jws,
              }
            : {
                type: 'assignment',
                id: item.id,
                seamId: item.seamId,
                seam: item.seam,
                ...(item.note !== undefined ? { note: item.note } : {}),
                assignedBy: item.assignedBy,
                assignedAt: item.assignedAt,
                signed: jws,
              },
        );
      }
      applied = add(applied, await store.receivePulled(items, reply.cursor));
      if (!reply.more) break;
    }
    return { kind: 'pulled', applied };
  }
}
