// Imported device public keys, kept so each request does not import its key again. Whether a device is enrolled
// and not revoked is read from storage on every request; only the key import is cached.
import { importJWK, type CryptoKey } from 'jose';
import { JWS_ALG } from '../../protocol/index.js';

const MAX_KEYS = 2000;

export class DeviceKeyCache {
  readonly #keys = new Map<string, CryptoKey>();

  async get(kid: string, publicJwk: string): Promise<CryptoKey> {
    const cached = this.#keys.get(kid);
    if (cached) return cached;
    const key = (await importJWK(JSON.parse(publicJwk) as Record<string, unknown>, JWS_ALG)) as CryptoKey;
    if (this.#keys.size >= MAX_KEYS) this.#keys.clear();
    this.#keys.set(kid, key);
    return key;
  }
}
