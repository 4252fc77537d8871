// The session API (JSON): sign in, see who is signed in, change the password, sign out.
import { Hono } from 'hono';
import * as v from 'valibot';
import type { AppDeps, AppEnv } from '../deps.js';
import { readJson } from '../http/body.js';
import { HttpError } from '../http/errors.js';
import { rateLimit } from '../http/rate-limit.js';
import { parseInput } from '../http/validate.js';
import type { Account } from '../storage/types.js';
import { hashPassword } from './password.js';
import { checkLogin, endSession, sameOrigin, startSession } from './session.js';

const credentials = v.strictObject({
  username: v.pipe(v.string(), v.maxLength(80)),
  password: v.pipe(v.string(), v.maxLength(1024)),
});

export const newPasswordSchema = v.pipe(
  v.string('must be a string'),
  v.minLength(10, 'must be at least 10 characters long'),
  v.maxLength(1024, 'must be at most 1024 characters long'),
);

const passwordChange = v.strictObject({ current: v.string(), next: newPasswordSchema });

const view = (a: Account) => ({
  username: a.username,
  role: a.role,
  mustChangePassword: a.mustChangePassword,
});

/** Sets a new password after checking the current one; ends the account's other sessions. */
export async function changePassword(
  deps: AppDeps,
  account: Account,
  keepSession: string | null,
  current: string,
  next: string,
): Promise<void> {
  if (!(await checkLogin(deps, account.username, current))) {
    throw new HttpError(403, 'wrongPassword', 'the current password is not right');
  }
  if (current === next) throw new HttpError(400, 'invalid', 'next: must differ from the current password');
  await deps.storage.setPassword(account.id, await hashPassword(next, deps.config.scryptCost), false);
  await deps.storage.deleteSessionsOf(account.id, keepSession);
  deps.log.info('passwordChanged', { account: account.username });
}

export function sessionRoutes(deps: AppDeps): Hono<AppEnv> {
  const app = new Hono<AppEnv>();
  app.use('*', sameOrigin());

  app.post('/', rateLimit(deps.limiters.login, 'sign-in', deps.config.trustProxy), async (c) => {
    const { username, password } = parseInput(credentials, await readJson(c, deps.config.limits.otherBytes));
    const account = await checkLogin(deps, username, password);
    if (!account) {
      deps.log.warn('security', { what: 'signInFailed', username });
      throw new HttpError(401, 'wrongCredentials', 'the name or password is not right');
    }
    await startSession(deps, c, account);
    deps.log.info('signedIn', { account: account.username });
    return c.json(view(account));
  });

  app.get('/', (c) => {
    const account = c.get('account');
    if (!account) throw new HttpError(401, 'signInRequired', 'not signed in');
    return c.json(view(account));
  });

  app.post('/password', async (c) => {
    const account = c.get('account');
    if (!account) throw new HttpError(401, 'signInRequired', 'sign in first');
    const input = parseInput(passwordChange, await readJson(c, deps.config.limits.otherBytes));
    await changePassword(deps, account, c.get('sessionTokenHash'), input.current, input.next);
    return c.body(null, 204);
  });

  app.delete('/', async (c) => {
    await endSession(deps, c);
    return c.body(null, 204);
  });

  return app;
}
