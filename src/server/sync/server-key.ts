// The server's own ES256 key: made on first start and kept in the database. It signs assignments and decisions;
// devices learn its public half at enrolment (and its kid from the enrolment ticket) and check what it signs.
import { exportJWK, generateKeyPair, importJWK, type CryptoKey } from 'jose';
import { JWS_ALG, thumbprint, toPublicJwk, type PublicJwk } from '../../protocol/index.js';
import type { Storage } from '../storage/types.js';

export interface ServerSigningKey {
  readonly kid: string;
  readonly publicJwk: PublicJwk;
  readonly privateKey: CryptoKey;
}

export async function loadServerKey(storage: Storage, now: Date): Promise<ServerSigningKey> {
  let row = await storage.getServerKey();
  if (!row) {
    const pair = await generateKeyPair(JWS_ALG, { extractable: true });
    const publicJwk = toPublicJwk(await exportJWK(pair.publicKey));
    row = await storage.saveServerKey({
      kid: await thumbprint(publicJwk),
      privateJwk: JSON.stringify(await exportJWK(pair.privateKey)),
      publicJwk: JSON.stringify(publicJwk),
      createdAt: now.toISOString(),
    });
  }
  const publicJwk = toPublicJwk(JSON.parse(row.publicJwk));
  const privateKey = (await importJWK(
    JSON.parse(row.privateJwk) as Record<string, unknown>,
    JWS_ALG,
  )) as CryptoKey;
  return { kid: row.kid, publicJwk, privateKey };
}
