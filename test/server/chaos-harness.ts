// The seeded chaos harness (chaos-*.test.ts run 500 runs each, 1,000 in all, in parallel): runs of a simulated device syncing through a faulty network to the in-process
// server — dropped requests, 502/503 answers, lost responses, duplicate and reordered deliveries, server
// restarts on the same database file, and device clocks off by up to 30 days. Each run ends with a healthy
// network and checks that the server holds exactly the records the device made, each once, with its content.
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect } from 'vitest';
import { canonicalJson, parseBatchReply, type SealedBatch } from '../../src/protocol/index.js';
import { bodies, testSeam, toeReading } from './records.js';
import type { Sent } from './sim-device.js';
import { TestClock, testServer, type TestServer } from './support.js';

export const RUNS_PER_DATABASE = 50;
const SEED = 20261202;

/** mulberry32: a small seeded generator, so a failing run can be replayed from its seed. */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

type Fault = 'none' | 'drop' | '503' | '502' | 'lost' | 'duplicate';
const FAULTS: readonly [Fault, number][] = [
  ['none', 0.45],
  ['drop', 0.12],
  ['503', 0.1],
  ['502', 0.08],
  ['lost', 0.13],
  ['duplicate', 0.12],
];

export interface Tally {
  runs: number;
  requests: number;
  restarts: number;
  faults: Record<Fault, number>;
  records: number;
}

class Network {
  constructor(
    private readonly random: () => number,
    private readonly tally: Tally,
    private healthy = false,
  ) {}

  heal(): void {
    this.healthy = true;
  }

  #fault(): Fault {
    if (this.healthy) return 'none';
    let x = this.random();
    for (const [fault, p] of FAULTS) {
      if ((x -= p) < 0) return fault;
    }
    return 'none';
  }

  async #jitter(): Promise<void> {
    // A few turns of the event loop, so concurrent deliveries arrive in a random order.
    const turns = Math.floor(this.random() * 4);
    for (let i = 0; i < turns; i++) await new Promise<void>((resolve) => setImmediate(resolve));
  }

  /** Delivers a request; null stands for a network error seen by the device. */
  async deliver(send: () => Promise<Sent>): Promise<Sent | null> {
    this.tally.requests += 1;
    const fault = this.#fault();
    this.tally.faults[fault] += 1;
    await this.#jitter();
    switch (fault) {
      case 'drop':
        return null;
      case '503':
        return { status: 503, body: 'unavailable' };
      case '502': {
        await send();
        return { status: 502, body: 'bad gateway' };
      }
      case 'lost':
        await send();
        return null;
      case 'duplicate': {
        const [a, b] = await Promise.all([send(), (async () => (await this.#jitter(), send()))()]);
        return this.random() < 0.5 ? a : b;
      }
      case 'none':
        return send();
    }
  }
}

/** One simulated device's life: make records, seal batches, send through the network, sometimes pull. */
async function run(
  seed: number,
  server: { current: TestServer; restart(): Promise<void> },
  tally: Tally,
): Promise<void> {
  const random = rng(seed);
  const net = new Network(random, tally);
  const device = await server.current.enrolDevice();
  const day = 86_400_000;
  const skew = Math.round((random() * 2 - 1) * 30 * day);
  const deviceTime = () => new Date(server.current.clock.now().getTime() + skew).toISOString();
  const seams = Array.from({ length: 1 + Math.floor(random() * 3) }, () => testSeam());
  const started = new Set<string>();
  const target = 4 + Math.floor(random() * 22);

  const makeSome = () => {
    const n = 1 + Math.floor(random() * 8);
    for (let i = 0; i < n && device.made.size < target; i++) {
      const seam = seams[Math.floor(random() * seams.length)] ?? seams[0];
      if (!seam) return;
      const at = deviceTime();
      if (!started.has(seam.id)) {
        started.add(seam.id);
        device.add('seamSetup', crypto.randomUUID(), bodies.seamSetup(seam, 1, at), at);
        device.add('round', crypto.randomUUID(), bodies.round(seam.id, 1, at), at);
        continue;
      }
      if (random() < 0.25) {
        device.add(
          'checklistAnswer',
          crypto.randomUUID(),
          bodies.answer(seam.id, 'spatter', random() < 0.5 ? 'noneFound' : 'present', 1, at),
          at,
        );
      } else {
        const r = toeReading(seam.id, 120 + Math.floor(random() * 60), {
          position: Math.floor(random() * 900),
          recordedAt: at,
        });
        device.add('reading', r.id, bodies.reading(r), at);
      }
    }
  };

  const sendOne = async (batch: SealedBatch): Promise<void> => {
    const sent = await net.deliver(() => device.post(server.current, '/api/sync/batches', batch.body));
    if (sent?.status === 200) {
      device.applyReply(batch, parseBatchReply(sent.body));
    } else if (sent && ![502, 503].includes(sent.status)) {
      throw new Error(`seed ${seed}: unexpected answer ${sent.status} ${JSON.stringify(sent.body)}`);
    }
  };

  for (let tick = 0; tick < 60; tick++) {
    if (tick === 12) net.heal();
    if (device.made.size < target && (tick < 12 || random() < 0.5)) makeSome();
    // Seal what is not yet in a batch (new records never join a sealed batch).
    const loose = device.unsealed().filter((e) => !device.rejected.has(e.recordId));
    if (loose.length) {
      const size = 1 + Math.floor(random() * 8);
      for (let i = 0; i < loose.length; i += size) await device.seal(loose.slice(i, i + size));
    }
    // Send every pending batch, several at once, in a random order.
    const pending = [...device.pending].sort(() => random() - 0.5);
    await Promise.all(pending.map((b) => sendOne(b)));
    if (random() < 0.15) {
      const pulled = await net.deliver(() => device.pull(server.current, null));
      if (pulled && ![200, 401, 502, 503].includes(pulled.status))
        throw new Error(`seed ${seed}: pull answered ${pulled.status}`);
    }
    server.current.clock.advance(Math.floor(random() * 300_000));
    if (random() < 0.04) {
      tally.restarts += 1;
      await server.restart();
    }
    if (device.made.size >= target && device.outbox.length === 0 && device.pending.length === 0) break;
  }

  await server.current.settle();
  const stored = await server.current.storage.listRecords({ deviceKid: device.kid });
  const storedIds = stored.map((r) => r.id);
  const madeIds = [...device.made.keys()];
  expect(device.rejected, `seed ${seed}`).toEqual(new Map());
  expect(device.outbox, `seed ${seed}: outbox not empty`).toEqual([]);
  expect(new Set(storedIds).size, `seed ${seed}: doubled`).toBe(storedIds.length);
  expect([...storedIds].sort(), `seed ${seed}`).toEqual([...madeIds].sort());
  for (const r of stored) {
    const made = device.made.get(r.id);
    expect(r.body, `seed ${seed}: content of ${r.id}`).toBe(canonicalJson(made?.body));
    expect(r.deviceSeq).toBe(made?.seq);
  }
  tally.records += madeIds.length;
  tally.runs += 1;
}

/** Runs `runs` seeded runs starting at run number `first`, in groups sharing one database file each. */
export async function chaos(first: number, runs: number): Promise<Tally> {
  const tally: Tally = {
    runs: 0,
    requests: 0,
    restarts: 0,
    records: 0,
    faults: { none: 0, drop: 0, '503': 0, '502': 0, lost: 0, duplicate: 0 },
  };
  const dir = mkdtempSync(join(tmpdir(), 'beadbook-chaos-'));
  for (let group = first / RUNS_PER_DATABASE; group < (first + runs) / RUNS_PER_DATABASE; group++) {
    const dbFile = join(dir, `chaos-${group}.sqlite`);
    const clock = new TestClock();
    const open = () => testServer({ dbFile, clock, keepOpen: true, synchronous: 'NORMAL' });
    const server = {
      current: await open(),
      async restart() {
        await this.current.close();
        this.current = await open();
      },
    };
    for (let i = 0; i < RUNS_PER_DATABASE; i++)
      await run(SEED + group * RUNS_PER_DATABASE + i, server, tally);
    await server.current.close();
  }
  return tally;
}
