// Enrolment codes and tickets, the proof of possession, the device's check of the server key, and server-signed
// items as the device verifies them.
import { describe, expect, it } from 'vitest';
import { exportJWK, generateKeyPair } from 'jose';
import {
  checkEnrolReply,
  formatEnrolmentTicket,
  generateDeviceKey,
  newEnrolmentCode,
  normaliseEnrolmentCode,
  openEnrolRequest,
  parseEnrolmentTicket,
  signEnrolRequest,
  signServerItem,
  thumbprint,
  toPublicJwk,
  verifyServerItem,
  type Decision,
} from '../../src/protocol/index.js';

describe('enrolment codes', () => {
  it('are 8 base32 characters shown as XXXX-XXXX, read back however they are typed', () => {
    const seen = new Set<string>();
    for (let i = 0; i < 200; i++) {
      const code = newEnrolmentCode();
      expect(code).toMatch(/^[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{4}$/);
      seen.add(code);
      expect(normaliseEnrolmentCode(code.toLowerCase().replace('-', ' '))).toBe(code);
    }
    expect(seen.size).toBe(200);
    expect(normaliseEnrolmentCode('ol1i-abcd')).toBe('0111-ABCD');
    expect(normaliseEnrolmentCode('ABCD-EFG')).toBeNull();
    expect(normaliseEnrolmentCode('ABCD-EFGU')).toBeNull();
  });

  it('travel in a QR ticket with the server key id', () => {
    const kid = 'k'.repeat(43);
    const ticket = formatEnrolmentTicket({ code: '7KQ2-M9XD', serverKid: kid });
    expect(ticket).toBe(`BEADBOOK-ENROL/1/7KQ2-M9XD/${kid}`);
    expect(parseEnrolmentTicket(ticket)).toEqual({ code: '7KQ2-M9XD', serverKid: kid });
    expect(parseEnrolmentTicket(' 7kq2 m9xd ')).toEqual({ code: '7KQ2-M9XD', serverKid: null });
    expect(parseEnrolmentTicket(`BEADBOOK-ENROL/1/7KQ2-M9XD/short`)).toBeNull();
    expect(parseEnrolmentTicket(`BEADBOOK-ENROL/1/7KQ2-M9XD/${kid}/more`)).toBeNull();
  });
});

describe('enrolment request', () => {
  it('proves possession: the kid is the thumbprint of the key in the request, which signed it', async () => {
    const key = await generateDeviceKey();
    const body = JSON.parse(await signEnrolRequest(key, '7kq2-m9xd', 'Bay 1')) as unknown;
    expect(await openEnrolRequest(body)).toEqual({
      kid: key.kid,
      jwk: key.publicJwk,
      code: '7KQ2-M9XD',
      label: 'Bay 1',
    });
  });

  it('checks the server key against the ticket and the reply', async () => {
    const device = await generateDeviceKey();
    const server = await generateDeviceKey();
    const reply = {
      protocol: 1,
      deviceKid: device.kid,
      name: 'Bay 1',
      enrolledAt: '2026-12-01T08:00:00Z',
      server: { kid: server.kid, jwk: server.publicJwk },
    };
    expect((await checkEnrolReply(reply, device, server.kid)).server.kid).toBe(server.kid);
    expect((await checkEnrolReply(reply, device, null)).server.jwk).toEqual(server.publicJwk);
    await expect(checkEnrolReply(reply, device, device.kid)).rejects.toThrow(
      /not the one the enrolment code named/,
    );
    await expect(
      checkEnrolReply({ ...reply, server: { kid: device.kid, jwk: server.publicJwk } }, device, null),
    ).rejects.toThrow(/does not match/);
    await expect(checkEnrolReply({ ...reply, deviceKid: server.kid }, device, null)).rejects.toThrow(
      /another device/,
    );
  });
});

describe('server-signed items', () => {
  it('verify on the device with the enrolled server key, for this device only', async () => {
    const pair = await generateKeyPair('ES256');
    const jwk = toPublicJwk(await exportJWK(pair.publicKey));
    const server = { kid: await thumbprint(jwk), jwk };
    const device = await generateDeviceKey();
    const decision: Decision = {
      protocol: 1,
      type: 'decision',
      id: 'd-1',
      deviceKid: device.kid,
      seamId: 'seam-1',
      seq: 3,
      round: 1,
      outcome: 'accepted',
      decidedBy: 'supervisor',
      decidedAt: '2026-12-01T10:00:00Z',
    };
    const signed = await signServerItem(decision, pair.privateKey, server.kid);
    expect(await verifyServerItem(signed, server, device.kid)).toEqual(decision);
    const impostor = await generateDeviceKey();
    const forged = await signServerItem(decision, impostor.privateKey, server.kid);
    await expect(verifyServerItem(forged, server, device.kid)).rejects.toThrow(/signature/);
    const ownKid = await signServerItem(decision, impostor.privateKey, impostor.kid);
    await expect(verifyServerItem(ownKid, server, device.kid)).rejects.toThrow();
    await expect(verifyServerItem(signed, server, impostor.kid)).rejects.toThrow(/another device/);
  });
});
