// Shared checks for signed payloads: the protocol version first (so a newer peer gets "version", not a list of
// unknown fields), then the schema, with problems phrased as path: message.
import * as v from 'valibot';
import { toProblems } from '../domain/model/schema-kit.js';
import { ProtocolError } from './errors.js';
import { PROTOCOL_VERSION } from './version.js';

export function parsePayload<S extends v.GenericSchema>(
  schema: S,
  payload: unknown,
  what: string,
): v.InferOutput<S> {
  if (typeof payload !== 'object' || payload === null || Array.isArray(payload)) {
    throw new ProtocolError('malformed', `the ${what} payload must be a JSON object`);
  }
  const version = (payload as Record<string, unknown>)['protocol'];
  if (version !== PROTOCOL_VERSION) {
    throw new ProtocolError(
      'version',
      `the ${what} speaks protocol ${JSON.stringify(version) ?? 'nothing'}; this side speaks protocol ${PROTOCOL_VERSION}`,
    );
  }
  const parsed = v.safeParse(schema, payload, { abortPipeEarly: true });
  if (!parsed.success) {
    const problems = toProblems(parsed.issues).slice(0, 5);
    throw new ProtocolError(
      'malformed',
      `${what}: ${problems.map((p) => `${p.path}: ${p.message}`).join('; ')}`,
    );
  }
  return parsed.output;
}

export const protocolField = v.literal(PROTOCOL_VERSION);
