// The device's identity: its signing key and what it learned at enrolment, in an IndexedDB database of its own
// so the key never bumps the records' schema. The private key is a non-extractable CryptoKey: IndexedDB keeps it
// as it is, and it can sign but never be read out. When the browser wipes this database, the next key is new and
// the device must enrol again as a new device: nothing else can prove it is the old one.
import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import type { CryptoKey } from 'jose';
// Protocol modules by name, not the barrel: this is in the first paint, which must not carry what it does not use.
import { describeKeyPair, generateDeviceKey, type DeviceKey } from '../../protocol/device-key.js';
import type { PublicJwk } from '../../protocol/jwk.js';

export const DEVICE_DB_NAME = 'beadbook-device';

/** What the device keeps once the server has accepted its key. */
export interface Enrolment {
  /** The server the device enrolled with (its origin, e.g. https://yard.example:4173). */
  readonly serverOrigin: string;
  /** The device's key id as the server knows it. */
  readonly deviceKid: string;
  /** The name the server gave the device (the supervisor may rename it later). */
  readonly name: string;
  readonly enrolledAt: string;
  /** The server's signing key, checked at enrolment: what the device verifies server-signed items with. */
  readonly serverKid: string;
  readonly serverJwk: PublicJwk;
}

interface StoredKey {
  readonly id: 'device';
  readonly privateKey: CryptoKey;
  readonly publicKey: CryptoKey;
  readonly createdAt: string;
}

interface StoredEnrolment extends Enrolment {
  readonly id: 'enrolment';
}

interface DeviceDB extends DBSchema {
  identity: { key: 'device' | 'enrolment'; value: StoredKey | StoredEnrolment };
}

export interface DeviceVault {
  /** The device key, made on first use; every caller gets the same key. */
  key(): Promise<DeviceKey & { readonly createdAt: string }>;
  /** The enrolment of the current key, or null when the device has not enrolled (or enrolled another key). */
  enrolment(): Promise<Enrolment | null>;
  saveEnrolment(enrolment: Enrolment): Promise<void>;
  /**
   * Forgets the key and its enrolment, so the next key() makes a new one: for a device the server revoked, which
   * can only come back as a new device.
   */
  renewKey(): Promise<void>;
  close(): void;
}

export interface DeviceVaultOptions {
  readonly name?: string;
  readonly now?: () => string;
}

export function openDeviceVault(options: DeviceVaultOptions = {}): DeviceVault {
  const now = options.now ?? (() => new Date().toISOString());
  let db: Promise<IDBPDatabase<DeviceDB>> | null = null;
  const connect = (): Promise<IDBPDatabase<DeviceDB>> => {
    db ??= openDB<DeviceDB>(options.name ?? DEVICE_DB_NAME, 1, {
      upgrade: (database) => {
        database.createObjectStore('identity', { keyPath: 'id' });
      },
      // A connection the browser closed is dropped; the next call opens a new one.
      terminated: () => {
        db = null;
      },
    });
    const opening = db;
    opening.catch(() => {
      if (db === opening) db = null;
    });
    return opening;
  };

  const readKey = async (): Promise<StoredKey | undefined> => {
    const stored = await (await connect()).get('identity', 'device');
    return stored?.id === 'device' ? stored : undefined;
  };

  let making: Promise<DeviceKey & { createdAt: string }> | null = null;
  const key = async (): Promise<DeviceKey & { createdAt: string }> => {
    const stored = await readKey();
    if (stored) return withCreated(stored);
    // Key generation is asynchronous and cannot run inside a transaction; a second caller (another tab) may
    // store its key first, so the add is conditional and the stored key is the one everybody uses.
    making ??= (async () => {
      const fresh = await generateDeviceKey();
      const database = await connect();
      const tx = database.transaction('identity', 'readwrite', { durability: 'strict' });
      const existing = await tx.store.get('device');
      if (existing?.id !== 'device') {
        await tx.store.put({
          id: 'device',
          privateKey: fresh.privateKey,
          publicKey: fresh.publicKey,
          createdAt: now(),
        });
      }
      await tx.done;
      const kept = await readKey();
      if (!kept) throw new Error('the device key could not be stored in this browser');
      return withCreated(kept);
    })().finally(() => {
      making = null;
    });
    return making;
  };

  return {
    key,
    async enrolment() {
      const stored = await (await connect()).get('identity', 'enrolment');
      if (stored?.id !== 'enrolment') return null;
      const current = await readKey();
      if (!current) return null;
      const { kid } = await describeKeyPair(current.privateKey, current.publicKey);
      if (kid !== stored.deviceKid) return null;
      return {
        serverOrigin: stored.serverOrigin,
        deviceKid: stored.deviceKid,
        name: stored.name,
        enrolledAt: stored.enrolledAt,
        serverKid: stored.serverKid,
        serverJwk: stored.serverJwk,
      };
    },
    async saveEnrolment(enrolment) {
      const database = await connect();
      const tx = database.transaction('identity', 'readwrite', { durability: 'strict' });
      await tx.store.put({ id: 'enrolment', ...enrolment });
      await tx.done;
    },
    async renewKey() {
      const database = await connect();
      const tx = database.transaction('identity', 'readwrite', { durability: 'strict' });
      await tx.store.delete('enrolment');
      await tx.store.delete('device');
      await tx.done;
    },
    close() {
      const current = db;
      db = null;
      current?.then((d) => d.close()).catch(() => undefined);
    },
  };
}

async function withCreated(stored: StoredKey): Promise<DeviceKey & { createdAt: string }> {
  return { ...(await describeKeyPair(stored.privateKey, stored.publicKey)), createdAt: stored.createdAt };
}
