// Enrolment: a supervisor shows a one-time code (as text and as a QR ticket that also names the server's key);
// the device sends the code and its new public key in a request signed with that key, which proves it holds the
// private half. The reply carries the server's public key, which the device checks against the ticket and keeps
// for verifying what the server signs.
import * as v from 'valibot';
import { obj, text } from '../domain/model/schema-kit.js';
import { canonicalJson } from './canonical-json.js';
import { ProtocolError } from './errors.js';
import { KID_PATTERN, thumbprint, toPublicJwk, type PublicJwk } from './jwk.js';
import { decodeJsonSegment, jwsBody, parseFlattenedJws, readProtectedHeader, signJws } from './jws.js';
import { verifyJws } from './jws-verify.js';
import { parsePayload, protocolField } from './payload.js';
import { randomBytes } from './platform.js';
import { PROTOCOL_VERSION } from './version.js';
import type { DeviceKey } from './device-key.js';

/** Crockford's base32 digits: no I, L, O or U, so a code read aloud or off a screen is hard to get wrong. */
const CODE_DIGITS = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';
const CODE_LENGTH = 8;

/** A new enrolment code, 8 characters (40 random bits) shown as XXXX-XXXX. */
export function newEnrolmentCode(): string {
  const bytes = randomBytes(CODE_LENGTH);
  let code = '';
  for (const b of bytes) code += CODE_DIGITS[b & 31];
  return `${code.slice(0, 4)}-${code.slice(4)}`;
}

/**
 * The code as typed, in its one canonical form (XXXX-XXXX), or null when it cannot be a code. Case, spaces and
 * dashes do not matter; O reads as 0 and I or L as 1, as Crockford's base32 has it.
 */
export function normaliseEnrolmentCode(input: string): string | null {
  const plain = input.toUpperCase().replace(/[\s-]/g, '').replace(/O/g, '0').replace(/[IL]/g, '1');
  if (plain.length !== CODE_LENGTH || [...plain].some((c) => !CODE_DIGITS.includes(c))) return null;
  return `${plain.slice(0, 4)}-${plain.slice(4)}`;
}

const TICKET_PREFIX = `BEADBOOK-ENROL/${PROTOCOL_VERSION}/`;

export interface EnrolmentTicket {
  readonly code: string;
  /** Thumbprint of the server's signing key, so the device can check the key it is given at enrolment. */
  readonly serverKid: string;
}

/** The text a QR code carries: BEADBOOK-ENROL/1/<code>/<server kid>. */
export const formatEnrolmentTicket = (ticket: EnrolmentTicket): string =>
  `${TICKET_PREFIX}${ticket.code}/${ticket.serverKid}`;

/** A scanned ticket, or a code typed by hand (then without the server's kid), or null. */
export function parseEnrolmentTicket(text: string): { code: string; serverKid: string | null } | null {
  const trimmed = text.trim();
  if (trimmed.startsWith(TICKET_PREFIX)) {
    const [code, serverKid, ...rest] = trimmed.slice(TICKET_PREFIX.length).split('/');
    const normal = normaliseEnrolmentCode(code ?? '');
    if (!normal || !serverKid || !KID_PATTERN.test(serverKid) || rest.length) return null;
    return { code: normal, serverKid };
  }
  const normal = normaliseEnrolmentCode(trimmed);
  return normal ? { code: normal, serverKid: null } : null;
}

const enrolPayloadSchema = obj('an enrolment request', {
  protocol: protocolField,
  type: v.literal('enrol', 'type must be "enrol"'),
  code: text(16, 'an enrolment code'),
  jwk: v.unknown(),
  /** What the device calls itself; the supervisor can rename it. */
  label: v.optional(text(80, 'a label')),
});

/** The enrolment request body, signed with the new key itself. */
export async function signEnrolRequest(key: DeviceKey, code: string, label?: string): Promise<string> {
  const payload = {
    protocol: PROTOCOL_VERSION,
    type: 'enrol',
    code,
    jwk: key.publicJwk,
    ...(label !== undefined ? { label } : {}),
  };
  return jwsBody(await signJws(canonicalJson(payload), 'enrol', key.privateKey, key.kid));
}

export interface EnrolRequest {
  readonly kid: string;
  readonly jwk: PublicJwk;
  /** The code in canonical form, or null when what was sent cannot be a code. */
  readonly code: string | null;
  readonly label?: string;
}

/**
 * Opens an enrolment request: the key comes from the payload, the header's kid must be that key's thumbprint,
 * and the signature must verify with it (proof of possession). Throws ProtocolError otherwise.
 */
export async function openEnrolRequest(body: unknown): Promise<EnrolRequest> {
  const jws = parseFlattenedJws(body);
  const header = readProtectedHeader(jws, 'enrol');
  // The payload is read before the signature is checked only to find the key to check it with.
  const claimed = parsePayload(
    enrolPayloadSchema,
    decodeJsonSegment(jws.payload, 'enrolment request payload'),
    'enrolment request',
  );
  const jwk = toPublicJwk(claimed.jwk);
  const kid = await thumbprint(jwk);
  if (header.kid !== kid) {
    throw new ProtocolError('header', 'kid must be the thumbprint of the public key in the request');
  }
  const verified = await verifyJws(jws, 'enrol', { ...jwk });
  const payload = parsePayload(enrolPayloadSchema, verified.payload, 'enrolment request');
  return {
    kid,
    jwk,
    code: normaliseEnrolmentCode(payload.code),
    ...(payload.label !== undefined ? { label: payload.label } : {}),
  };
}

export const enrolReplySchema = v.object({
  protocol: protocolField,
  deviceKid: v.pipe(v.string(), v.regex(KID_PATTERN)),
  name: v.string(),
  enrolledAt: v.string(),
  server: v.object({ kid: v.pipe(v.string(), v.regex(KID_PATTERN)), jwk: v.unknown() }),
});

export interface EnrolReply {
  readonly protocol: typeof PROTOCOL_VERSION;
  readonly deviceKid: string;
  readonly name: string;
  readonly enrolledAt: string;
  readonly server: { readonly kid: string; readonly jwk: PublicJwk };
}

/**
 * Checks the server's enrolment reply on the device: the server key must hash to the kid it is given under, and
 * to the kid the ticket named when the device scanned one. Returns the server key to keep.
 */
export async function checkEnrolReply(
  reply: unknown,
  device: Pick<DeviceKey, 'kid'>,
  ticketServerKid: string | null,
): Promise<EnrolReply> {
  const parsed = v.safeParse(enrolReplySchema, reply);
  if (!parsed.success)
    throw new ProtocolError('malformed', 'the enrolment reply is not in the expected form');
  const jwk = toPublicJwk(parsed.output.server.jwk);
  const kid = await thumbprint(jwk);
  if (kid !== parsed.output.server.kid) {
    throw new ProtocolError('signature', 'the server key does not match the kid it was sent with');
  }
  if (ticketServerKid !== null && kid !== ticketServerKid) {
    throw new ProtocolError('signature', 'the server key is not the one the enrolment code named');
  }
  if (parsed.output.deviceKid !== device.kid) {
    throw new ProtocolError('malformed', 'the enrolment reply names another device');
  }
  return { ...parsed.output, protocol: PROTOCOL_VERSION, server: { kid, jwk } };
}
