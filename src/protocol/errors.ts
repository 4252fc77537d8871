/**
 * Why a signed message or a record was refused. The code is for programs (the server maps it to an HTTP status,
 * the device decides whether to retry); the message is for people and names what was wrong.
 */
export type ProtocolErrorCode =
  /** Not a flattened JWS, not JSON, bad base64url, or a payload that is not the expected shape. */
  | 'malformed'
  /** `alg` is not ES256 (`none`, HMAC and every other algorithm are refused). */
  | 'algorithm'
  /** A protected header member this protocol does not know, or a `crit` list. */
  | 'header'
  /** `typ` names another kind of message. */
  | 'type'
  /** The signature does not verify with the key the `kid` names. */
  | 'signature'
  /** The payload names a protocol version this code does not speak. */
  | 'version';

export class ProtocolError extends Error {
  override readonly name = 'ProtocolError';
  constructor(
    readonly code: ProtocolErrorCode,
    message: string,
  ) {
    super(message);
  }
}

export const isProtocolError = (e: unknown): e is ProtocolError => e instanceof ProtocolError;
