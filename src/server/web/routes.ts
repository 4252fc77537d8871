// The supervisor's web pages under /supervisor. Forms post back here (same origin only); every page but sign-in
// needs a supervisor session.
import { Hono, type Context } from 'hono';
import { changePassword } from '../auth/routes.js';
import { checkLogin, endSession, requireRole, sameOrigin, startSession } from '../auth/session.js';
import { issueEnrolmentCode } from '../admin/service.js';
import type { AppDeps, AppEnv } from '../deps.js';
import { readForm } from '../http/body.js';
import { HttpError } from '../http/errors.js';
import { rateLimit } from '../http/rate-limit.js';
import type { Account } from '../storage/types.js';
import { devicesPage, loginPage, passwordPage, seamsPage, type SeamLine } from './pages.js';
import { reviewWebRoutes } from './review/routes.js';
import { SUPERVISOR_CSS } from './style.js';

const page = (c: Context, body: string, status: 200 | 400 | 401 | 403 = 200) => {
  c.header('Cache-Control', 'no-store');
  return c.html(body, status);
};

export function webRoutes(deps: AppDeps): Hono<AppEnv> {
  const app = new Hono<AppEnv>();
  const max = deps.config.limits.otherBytes;
  const supervisor = requireRole('supervisor', 'page');
  const me = (c: Context<AppEnv>): Account => c.get('account') as Account;
  app.use('*', sameOrigin());

  app.get('/style.css', (c) => {
    c.header('Content-Type', 'text/css; charset=utf-8');
    c.header('Cache-Control', 'no-cache');
    return c.body(SUPERVISOR_CSS);
  });

  app.get('/', (c) => c.redirect('/supervisor/review', 303));

  app.get('/login', (c) => page(c, loginPage(null)));

  app.post('/login', rateLimit(deps.limiters.login, 'sign-in', deps.config.trustProxy), async (c) => {
    const form = await readForm(c, max);
    const account = await checkLogin(deps, form.get('username') ?? '', form.get('password') ?? '');
    if (!account) {
      deps.log.warn('security', {
        what: 'signInFailed',
        username: (form.get('username') ?? '').slice(0, 80),
      });
      return page(c, loginPage('The name or password is not right.'), 401);
    }
    await startSession(deps, c, account);
    deps.log.info('signedIn', { account: account.username });
    return c.redirect(account.mustChangePassword ? '/supervisor/password' : '/supervisor/review', 303);
  });

  app.post('/logout', async (c) => {
    await endSession(deps, c);
    return c.redirect('/supervisor/login', 303);
  });

  app.get('/password', (c) => {
    const account = c.get('account');
    if (!account) return c.redirect('/supervisor/login', 303);
    return page(c, passwordPage(account.username, account.mustChangePassword, null));
  });

  app.post('/password', async (c) => {
    const account = c.get('account');
    if (!account) return c.redirect('/supervisor/login', 303);
    const form = await readForm(c, max);
    const next = form.get('next') ?? '';
    if (next.length < 10 || next.length > 1024) {
      return page(
        c,
        passwordPage(
          account.username,
          account.mustChangePassword,
          'The new password must be 10 to 1024 characters long.',
        ),
        400,
      );
    }
    try {
      await changePassword(deps, account, c.get('sessionTokenHash'), form.get('current') ?? '', next);
    } catch (error) {
      if (error instanceof HttpError)
        return page(c, passwordPage(account.username, account.mustChangePassword, error.message), 400);
      throw error;
    }
    return c.redirect('/supervisor/devices', 303);
  });

  app.get('/devices', supervisor, async (c) =>
    page(c, devicesPage(me(c).username, await deps.storage.listDevices(), null, null)),
  );

  app.post('/devices/code', supervisor, async (c) => {
    const code = await issueEnrolmentCode(deps, me(c));
    return page(c, devicesPage(me(c).username, await deps.storage.listDevices(), code, null));
  });

  app.post('/devices/:kid/name', supervisor, async (c) => {
    const form = await readForm(c, max);
    const name = (form.get('name') ?? '').trim();
    let notice: string;
    if (!name || name.length > 80) notice = 'A name must be 1 to 80 characters long; nothing was changed.';
    else if (await deps.storage.renameDevice(c.req.param('kid'), name)) notice = `Renamed to “${name}”.`;
    else notice = 'No such device.';
    return page(c, devicesPage(me(c).username, await deps.storage.listDevices(), null, notice));
  });

  app.post('/devices/:kid/revoke', supervisor, async (c) => {
    const form = await readForm(c, max);
    const kid = c.req.param('kid');
    let notice: string;
    if (form.get('confirm') !== 'yes') notice = 'Tick the box to confirm; the device was not revoked.';
    else if (await deps.storage.revokeDevice(kid, deps.now().toISOString())) {
      deps.log.info('revoked', { by: me(c).username, kid });
      notice = 'Revoked: the server refuses this device from now on.';
    } else notice = 'No such device.';
    return page(c, devicesPage(me(c).username, await deps.storage.listDevices(), null, notice));
  });

  app.route('/review', reviewWebRoutes(deps));

  app.get('/seams', supervisor, async (c) => {
    const lines: SeamLine[] = [];
    for (const id of await deps.storage.listSeamIds()) {
      const [row, material, grade, deviceGrades] = await Promise.all([
        deps.storage.getSeam(id),
        deps.storage.seamMaterial(id),
        deps.storage.getServerGrade(id),
        deps.storage.listDeviceGrades(id),
      ]);
      const label = row ? ((JSON.parse(row.setup) as { label?: string }).label ?? null) : null;
      lines.push({
        id,
        label,
        namespace: row?.namespace ?? 'live',
        records: material.records.length,
        serverGrade: grade ? gradeText(grade.state, grade.levelMet) : 'not graded yet',
        deviceGrades: deviceGrades.length
          ? deviceGrades
              .map((g) => {
                const d = JSON.parse(g.grade) as { state: string; levelMet: string | null };
                return gradeText(d.state, d.levelMet);
              })
              .join('; ')
          : 'none reported',
      });
    }
    return page(c, seamsPage(me(c).username, lines));
  });

  return app;
}

function gradeText(state: string, levelMet: string | null): string {
  const level = levelMet === null ? '' : levelMet === 'belowD' ? ' — below D' : ` — level ${levelMet} met`;
  return `${state}${level}`;
}
