// Enrolment from the device against the yard server in process: the code proves nothing by itself, the signed
// request proves possession of the key (design notes §4), and the server key is checked and kept.
import { describe, expect, it } from 'vitest';
import { enrolDevice } from '../../src/app/sync/enrol-device.js';
import { testServer, jsonOf } from '../server/support.js';
import { newCode, SERVER_ORIGIN, tablet } from './support.js';

describe('enrolling the device', () => {
  it('enrols with the code and keeps the server key the ticket names', async () => {
    const server = await testServer();
    const t = await tablet(server);
    const { ticket } = await newCode(server);
    const outcome = await enrolDevice(
      { code: ticket, label: 'Tablet by the blast room' },
      { vault: t.vault, transport: t.wire.transport, serverOrigin: SERVER_ORIGIN },
    );
    expect(outcome.ok).toBe(true);
    const serverKey = await jsonOf<{ kid: string }>(await server.request('/api/sync/server-key'));
    const kept = await t.vault.enrolment();
    expect(kept).toMatchObject({
      serverOrigin: SERVER_ORIGIN,
      deviceKid: (await t.vault.key()).kid,
      name: 'Tablet by the blast room',
      serverKid: serverKey.kid,
    });
    const devices = await jsonOf<{ kid: string }[]>(await server.admin('GET', '/devices'));
    expect(devices.map((d) => d.kid)).toEqual([kept?.deviceKid]);
  });

  it('says what is wrong with a mistyped, unknown or used code, and stays unenrolled', async () => {
    const server = await testServer();
    const t = await tablet(server);
    const deps = { vault: t.vault, transport: t.wire.transport, serverOrigin: SERVER_ORIGIN };
    const typo = await enrolDevice({ code: '12345' }, deps);
    expect(typo).toEqual({ ok: false, message: expect.stringContaining('not an enrolment code') });
    const unknown = await enrolDevice({ code: 'ZZZZ-ZZZZ' }, deps);
    expect(unknown).toEqual({ ok: false, message: expect.stringContaining('does not know this code') });
    expect(await t.vault.enrolment()).toBeNull();

    const { code } = await newCode(server);
    const other = await tablet(server);
    expect((await enrolDevice({ code }, { ...deps, vault: other.vault })).ok).toBe(true);
    const used = await enrolDevice({ code }, deps);
    expect(used).toEqual({ ok: false, message: expect.stringContaining('used already') });
    expect(await t.vault.enrolment()).toBeNull();
  });

  it('refuses a server key that is not the one the ticket named', async () => {
    const server = await testServer();
    const t = await tablet(server);
    const { ticket } = await newCode(server);
    const forged = ticket.replace(/\/[^/]+$/, `/${'A'.repeat(43)}`);
    const outcome = await enrolDevice(
      { code: forged },
      { vault: t.vault, transport: t.wire.transport, serverOrigin: SERVER_ORIGIN },
    );
    expect(outcome).toEqual({
      ok: false,
      message: expect.stringContaining('not the one the enrolment code named'),
    });
    expect(await t.vault.enrolment()).toBeNull();
  });

  it('tells a tablet out of range that the server could not be reached', async () => {
    const server = await testServer();
    const t = await tablet(server);
    t.wire.intercept = () => {
      throw new TypeError('Failed to fetch');
    };
    const outcome = await enrolDevice(
      { code: (await newCode(server)).code },
      { vault: t.vault, transport: t.wire.transport, serverOrigin: SERVER_ORIGIN },
    );
    expect(outcome).toEqual({ ok: false, message: expect.stringContaining('could not be reached') });
  });
});
