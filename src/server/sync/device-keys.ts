// Device public keys as node:crypto key objects, kept so each request does not import its key again. Whether a
// device is enrolled and not revoked is read from storage on every request; only the key import is cached.
import type { KeyObject } from 'node:crypto';
import { publicKeyObject } from './verify.js';

const MAX_KEYS = 2000;

export class DeviceKeyCache {
  readonly #keys = new Map<string, KeyObject>();

  get(kid: string, publicJwk: string): KeyObject {
    const cached = this.#keys.get(kid);
    if (cached) return cached;
    const key = publicKeyObject(publicJwk);
    if (this.#keys.size >= MAX_KEYS) this.#keys.clear();
    this.#keys.set(kid, key);
    return key;
  }
}
