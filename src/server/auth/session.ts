// Sessions: a random token in an http-only, SameSite=Strict cookie (Secure, with the __Host- prefix, whenever the
// server runs https); the database keeps only the token's hash. Unsafe requests on session routes must come from
// this origin, which with SameSite=Strict and JSON-only API bodies closes the door on cross-site requests.
import type { Context, MiddlewareHandler } from 'hono';
import { deleteCookie, getCookie, setCookie } from 'hono/cookie';
import type { AppDeps, AppEnv } from '../deps.js';
import { HttpError } from '../http/errors.js';
import type { Account, Role } from '../storage/types.js';
import { accountWithoutHash } from './account-without-hash.js';
import { decoyHash, verifyPassword } from './password.js';
import { newToken, tokenHash } from './tokens.js';

export const cookieName = (secure: boolean): string =>
  secure ? '__Host-beadbook_session' : 'beadbook_session';

/** Reads the session cookie, if any, into the request's `account`. Never refuses by itself. */
export function loadSession(deps: AppDeps): MiddlewareHandler<AppEnv> {
  return async (c, next) => {
    c.set('account', null);
    c.set('sessionTokenHash', null);
    const token = getCookie(c, cookieName(deps.secure));
    if (token && token.length <= 128) {
      const hash = tokenHash(token);
      const account = await deps.storage.findSession(hash, deps.now().toISOString());
      if (account) {
        c.set('account', account);
        c.set('sessionTokenHash', hash);
      }
    }
    await next();
  };
}

/** Checks a name and password; the same work is done whether or not the account exists. */
export async function checkLogin(deps: AppDeps, username: string, password: string): Promise<Account | null> {
  const account =
    username.length <= 80 && password.length <= 1024 ? await deps.storage.findAccount(username) : undefined;
  const ok = await verifyPassword(
    password.slice(0, 1024),
    account?.passwordHash ?? (await decoyHash(deps.config.scryptCost)),
  );
  if (!account || !ok) return null;
  return accountWithoutHash(account);
}

export async function startSession(deps: AppDeps, c: Context, account: Account): Promise<void> {
  const token = newToken();
  const now = deps.now();
  const expires = new Date(now.getTime() + deps.config.sessionHours * 3_600_000);
  await deps.storage.createSession(tokenHash(token), account.id, now.toISOString(), expires.toISOString());
  setCookie(c, cookieName(deps.secure), token, {
    httpOnly: true,
    secure: deps.secure,
    sameSite: 'Strict',
    path: '/',
    maxAge: deps.config.sessionHours * 3600,
  });
}

export async function endSession(deps: AppDeps, c: Context<AppEnv>): Promise<void> {
  const hash = c.get('sessionTokenHash');
  if (hash) await deps.storage.deleteSession(hash);
  deleteCookie(c, cookieName(deps.secure), { path: '/', secure: deps.secure });
}

const UNSAFE = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/** Unsafe requests must come from this origin: Origin must match, or Sec-Fetch-Site must say so. */
export function sameOrigin(): MiddlewareHandler<AppEnv> {
  return async (c, next) => {
    if (UNSAFE.has(c.req.method)) {
      const origin = c.req.header('origin');
      const site = c.req.header('sec-fetch-site');
      const own = new URL(c.req.url).origin;
      const fromHere =
        origin !== undefined
          ? origin === own
          : site === undefined || site === 'same-origin' || site === 'none';
      if (!fromHere)
        throw new HttpError(
          403,
          'crossOrigin',
          "requests that change data must come from this server's own pages",
        );
    }
    await next();
  };
}

export type Gate = 'api' | 'page';

/**
 * Requires a signed-in account with the role. Pages send a visitor to the sign-in page; the API answers 401/403.
 * An account that must change its password may do only that until it has.
 */
export function requireRole(role: Role, gate: Gate): MiddlewareHandler<AppEnv> {
  return async (c, next) => {
    const account = c.get('account');
    if (!account) {
      if (gate === 'page') return c.redirect('/supervisor/login', 303);
      throw new HttpError(401, 'signInRequired', 'sign in first');
    }
    if (account.role !== role) throw new HttpError(403, 'forbidden', `this needs the ${role} role`);
    if (account.mustChangePassword) {
      if (gate === 'page') return c.redirect('/supervisor/password', 303);
      throw new HttpError(
        403,
        'passwordChangeRequired',
        'set a new password first (POST /api/session/password)',
      );
    }
    await next();
    return undefined;
  };
}
