// Enrolment from the device: the code the supervisor's Devices page shows (typed, or the ticket text pasted),
// sent with the device's public key in a request signed by that key. The reply's server key is checked against
// the ticket when there is one, and kept for checking what the server signs later.
import {
  checkEnrolReply,
  JOSE_JSON,
  parseEnrolmentTicket,
  signEnrolRequest,
  type DeviceKey,
} from '../../protocol/index.js';
import type { DeviceVault, Enrolment } from './device-vault.js';
import { errorText, refusalText, type Transport } from './transport.js';

export type EnrolOutcome =
  { readonly ok: true; readonly enrolment: Enrolment } | { readonly ok: false; readonly message: string };

const REFUSALS: Record<string, string> = {
  codeUnknown: 'The server does not know this code. Check it against the Devices page and type it again.',
  codeExpired: 'This code has expired. Ask the supervisor for a new one.',
  codeUsed: 'This code was used already. Ask the supervisor for a new one.',
  revoked: 'This device was revoked on the server. Ask the supervisor.',
};

export async function enrolDevice(
  input: { readonly code: string; readonly label?: string },
  deps: { readonly vault: DeviceVault; readonly transport: Transport; readonly serverOrigin: string },
): Promise<EnrolOutcome> {
  const ticket = parseEnrolmentTicket(input.code);
  if (!ticket) {
    return {
      ok: false,
      message:
        'That is not an enrolment code: a code has 8 letters and digits, like 7KQ2-M9XD (dashes and spaces do not matter).',
    };
  }
  try {
    let attempt = await request(ticket.code, input.label, deps);
    if (!attempt.ok && attempt.code === 'revoked') {
      // A revoked key stays revoked; with a new code from the supervisor the tablet comes back as a new device.
      await deps.vault.renewKey();
      attempt = await request(ticket.code, input.label, deps);
    }
    if (!attempt.ok) return { ok: false, message: attempt.message };
    const { res, key } = attempt;
    const reply = await checkEnrolReply(await res.json(), key, ticket.serverKid);
    const enrolment: Enrolment = {
      serverOrigin: deps.serverOrigin,
      deviceKid: reply.deviceKid,
      name: reply.name,
      enrolledAt: reply.enrolledAt,
      serverKid: reply.server.kid,
      serverJwk: reply.server.jwk,
    };
    await deps.vault.saveEnrolment(enrolment);
    return { ok: true, enrolment };
  } catch (error) {
    return { ok: false, message: `Not enrolled: ${errorText(error)}.` };
  }
}

type Attempt =
  | { readonly ok: true; readonly res: Response; readonly key: DeviceKey }
  | { readonly ok: false; readonly code: string; readonly message: string };

async function request(
  code: string,
  label: string | undefined,
  deps: { readonly vault: DeviceVault; readonly transport: Transport },
): Promise<Attempt> {
  const key = await deps.vault.key();
  const trimmed = label?.trim();
  const body = await signEnrolRequest(key, code, trimmed ? trimmed : undefined);
  let res: Response;
  try {
    res = await deps.transport('/api/sync/enrol', {
      method: 'POST',
      headers: { 'content-type': JOSE_JSON },
      body,
    });
  } catch (error) {
    return {
      ok: false,
      code: 'network',
      message: `The server could not be reached (${errorText(error)}). Enrol when the tablet is in range of the yard network.`,
    };
  }
  if (res.status === 200 || res.status === 201) return { ok: true, res, key };
  const refusal = await refusalText(res);
  return {
    ok: false,
    code: refusal.code,
    message: REFUSALS[refusal.code] ?? `Not enrolled: ${refusal.text}.`,
  };
}
