// What every route needs, made once per server (see app.ts), and the per-request values routes share.
import type { ServerConfig } from './config.js';
import type { Logger } from './log.js';
import type { Regrader } from './grading/regrade.js';
import type { RateLimiter } from './http/rate-limit.js';
import type { ReviewIndexer } from './review/indexer.js';
import type { Account, Storage } from './storage/types.js';
import type { DeviceKeyCache } from './sync/device-keys.js';
import type { ServerSigningKey } from './sync/server-key.js';

export interface AppDeps {
  readonly config: ServerConfig;
  readonly storage: Storage;
  readonly log: Logger;
  readonly now: () => Date;
  readonly serverKey: ServerSigningKey;
  readonly regrader: Regrader;
  /** Review facts (what the queue filters on), made after each re-grade. */
  readonly reviewIndexer: ReviewIndexer;
  readonly deviceKeys: DeviceKeyCache;
  readonly limiters: { readonly login: RateLimiter; readonly sync: RateLimiter };
  /** Whether the browser reaches this server over https (decides the cookie's Secure flag and HSTS). */
  readonly secure: boolean;
}

export interface AppEnv {
  Variables: {
    account: Account | null;
    sessionTokenHash: string | null;
    requestId: string;
  };
}
