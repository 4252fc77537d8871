// Errors a request can end with. Each carries its status, a stable code and a message for people; nothing else
// (no stack, no internal detail) leaves the server.
import type { ContentfulStatusCode } from 'hono/utils/http-status';
import type { ProtocolError } from '../../protocol/index.js';

export class HttpError extends Error {
  override readonly name = 'HttpError';
  constructor(
    readonly status: ContentfulStatusCode,
    readonly code: string,
    message: string,
    readonly headers: Readonly<Record<string, string>> = {},
  ) {
    super(message);
  }
}

const PROTOCOL_STATUS: Record<ProtocolError['code'], ContentfulStatusCode> = {
  malformed: 400,
  algorithm: 400,
  header: 400,
  type: 400,
  version: 400,
  signature: 401,
};

export function fromProtocolError(e: ProtocolError): HttpError {
  return new HttpError(PROTOCOL_STATUS[e.code], e.code, e.message);
}
