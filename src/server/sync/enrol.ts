// Enrolment on the server: the request proves possession of the new key; the one-time code proves a supervisor
// let this device in. Using the code and enrolling the device happen in one transaction.
import { canonicalJson, openEnrolRequest, PROTOCOL_VERSION, type EnrolReply } from '../../protocol/index.js';
import { tokenHash } from '../auth/tokens.js';
import type { AppDeps } from '../deps.js';
import { HttpError } from '../http/errors.js';
import { parseBody } from './ingest.js';

const REFUSED: Record<'codeUnknown' | 'codeExpired' | 'codeUsed' | 'revoked', [number, string]> = {
  codeUnknown: [403, 'this enrolment code is not one the server issued; ask the supervisor for a new one'],
  codeExpired: [403, 'this enrolment code has expired; ask the supervisor for a new one'],
  codeUsed: [403, 'this enrolment code has been used; ask the supervisor for a new one'],
  revoked: [403, 'this device key was revoked; make a new key and enrol again'],
};

export async function enrol(
  deps: AppDeps,
  bodyText: string,
): Promise<{ created: boolean; reply: EnrolReply }> {
  const request = await openEnrolRequest(parseBody(bodyText));
  if (request.code === null) {
    throw new HttpError(400, 'codeMalformed', 'the enrolment code must be 8 characters such as 7KQ2-M9XD');
  }
  const now = deps.now().toISOString();
  const outcome = await deps.storage.enrolDevice({
    codeHash: tokenHash(request.code),
    now,
    kid: request.kid,
    publicJwk: canonicalJson(request.jwk),
    name: request.label ?? `Tablet ${request.kid.slice(0, 6)}`,
  });
  if (outcome.kind !== 'enrolled' && outcome.kind !== 'alreadyEnrolled') {
    const [status, message] = REFUSED[outcome.kind];
    deps.log.warn('security', { what: 'enrolRefused', why: outcome.kind, kid: request.kid });
    await deps.storage.recordSecurityEvent(
      now,
      'enrolRefused',
      null,
      JSON.stringify({ kid: request.kid, why: outcome.kind }),
    );
    throw new HttpError(status as 403, outcome.kind, message);
  }
  deps.log.info('enrolled', { kid: request.kid, again: outcome.kind === 'alreadyEnrolled' });
  return {
    created: outcome.kind === 'enrolled',
    reply: {
      protocol: PROTOCOL_VERSION,
      deviceKid: outcome.device.kid,
      name: outcome.device.name,
      enrolledAt: outcome.device.enrolledAt,
      server: { kid: deps.serverKey.kid, jwk: deps.serverKey.publicJwk },
    },
  };
}
