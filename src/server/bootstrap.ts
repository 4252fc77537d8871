// First start: the supervisor account. Its password comes from BEADBOOK_SUPERVISOR_PASSWORD, or is a one-time
// password printed once (to stderr, never to the structured log) that must be changed at first sign-in.
import { hashPassword } from './auth/password.js';
import { newPassword } from './auth/tokens.js';
import type { ServerConfig } from './config.js';
import type { Logger } from './log.js';
import type { Storage } from './storage/types.js';

export async function ensureSupervisor(
  storage: Storage,
  config: ServerConfig,
  log: Logger,
  now: Date,
  announce: (text: string) => void,
): Promise<'created' | 'exists'> {
  if ((await storage.countAccounts()) > 0) return 'exists';
  const oneTime = config.supervisorPassword === null;
  const password = config.supervisorPassword ?? newPassword();
  await storage.createAccount({
    username: config.supervisorName,
    role: 'supervisor',
    passwordHash: await hashPassword(password, config.scryptCost),
    mustChangePassword: oneTime,
    createdAt: now.toISOString(),
  });
  log.info('supervisorCreated', { username: config.supervisorName, oneTimePassword: oneTime });
  if (oneTime) {
    announce(
      `\nBeadbook: supervisor account "${config.supervisorName}" created with the one-time password\n\n    ${password}\n\n` +
        'It is shown only this once. Sign in at /supervisor and choose your own password.\n\n',
    );
  }
  return 'created';
}
