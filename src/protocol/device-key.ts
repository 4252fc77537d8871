// The device's signing key: ECDSA P-256 made with WebCrypto, the private half non-extractable (it can sign but
// never leave the browser; a CryptoKey stores in IndexedDB as it is).
import { exportJWK, generateKeyPair, type CryptoKey } from 'jose';
import { thumbprint, toPublicJwk, type PublicJwk } from './jwk.js';
import { JWS_ALG } from './version.js';

export interface DeviceKey {
  readonly privateKey: CryptoKey;
  readonly publicKey: CryptoKey;
  readonly publicJwk: PublicJwk;
  /** RFC 7638 thumbprint of the public key: the device's id on the server. */
  readonly kid: string;
}

export async function generateDeviceKey(): Promise<DeviceKey> {
  const { privateKey, publicKey } = await generateKeyPair(JWS_ALG, { extractable: false });
  return describeKeyPair(privateKey, publicKey);
}

/** The kid and public JWK of a key pair (e.g. one read back from IndexedDB). */
export async function describeKeyPair(privateKey: CryptoKey, publicKey: CryptoKey): Promise<DeviceKey> {
  const publicJwk = toPublicJwk(await exportJWK(publicKey));
  return { privateKey, publicKey, publicJwk, kid: await thumbprint(publicJwk) };
}
