// The supervisor's web pages under /supervisor. Forms post back here (same origin only); every page but sign-in
// needs a supervisor session.
import { Hono, type Context } from 'hono';
import { changePassword } from '../auth/routes.js';
import { checkLogin, endSession, requireRole, sameOrigin, startSession } from '../auth/session.js';
import { issueEnrolmentCode, tieDevice, type IssuedCode } from '../admin/service.js';
import { hashPassword } from '../auth/password.js';
import type { AppDeps, AppEnv } from '../deps.js';
import { readForm } from '../http/body.js';
import { HttpError } from '../http/errors.js';
import { rateLimit } from '../http/rate-limit.js';
import type { Account } from '../storage/types.js';
import { devicesPage, loginPage, passwordPage } from './pages.js';
import { assignSeam } from '../admin/service.js';
import { parseReviewQuery } from '../review/query.js';
import { SEAM_FIELDS } from '../seams/seam-fields.js';
import { checkAssignTo, checkRows, createSeams, type AssignTo, type RowProblem } from '../seams/service.js';
import { seamsPage } from './seams-page.js';
import { LIST_BYTES, seamImportRoutes } from './seam-import-routes.js';
import { reviewWebRoutes } from './review/routes.js';
import { SUPERVISOR_CSS } from './style.js';
import { TAG_SHEET_CSS } from './tag-sheet-style.js';
import { sheetChoice, tagSheetPage } from './tag-sheet-page.js';
import { seamTags } from '../seams/seam-tags.js';
import { foldSeam } from '../grading/fold.js';

/** A tag sheet holds at most this many seams and labels (some 20 A4 sheets): enough for a day's work. */
const MAX_SHEET_SEAMS = 500;
const MAX_SHEET_LABELS = 500;

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
    return c.body(SUPERVISOR_CSS + TAG_SHEET_CSS);
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

  const devicesView = async (
    c: Context<AppEnv>,
    code: IssuedCode | null,
    notice: string | null,
    status: 200 | 400 = 200,
  ) => {
    const [devices, inspectors] = await Promise.all([
      deps.storage.listDevices(),
      deps.storage.listAccounts('inspector'),
    ]);
    return page(c, devicesPage(me(c).username, devices, code, notice, inspectors), status);
  };
  const refusal = async (c: Context<AppEnv>, work: () => Promise<Response>) => {
    try {
      return await work();
    } catch (error) {
      if (!(error instanceof HttpError) || error.status >= 500) throw error;
      return devicesView(c, null, `${error.message}; nothing was changed.`, 400);
    }
  };

  app.get('/devices', supervisor, async (c) => devicesView(c, null, null));

  app.post('/devices/code', supervisor, async (c) => {
    const form = await readForm(c, max);
    return refusal(c, async () =>
      devicesView(c, await issueEnrolmentCode(deps, me(c), form.get('inspector') || null), null),
    );
  });

  app.post('/devices/:kid/inspector', supervisor, async (c) => {
    const form = await readForm(c, max);
    const inspector = form.get('inspector') || null;
    return refusal(c, async () => {
      await tieDevice(deps, me(c), c.req.param('kid'), inspector);
      const name = (await deps.storage.getDevice(c.req.param('kid')))?.name ?? '';
      return devicesView(
        c,
        null,
        inspector
          ? `${name} now works for ${inspector}: it receives the seams assigned to ${inspector} on its next sync.`
          : `${name} works for no inspector now.`,
      );
    });
  });

  app.post('/inspectors', supervisor, async (c) => {
    const form = await readForm(c, max);
    const username = (form.get('username') ?? '').trim();
    const password = form.get('password') ?? '';
    if (!/^[A-Za-z0-9._-]{1,40}$/.test(username))
      return devicesView(
        c,
        null,
        'A name may hold 1 to 40 letters, digits, dots, dashes and underscores.',
        400,
      );
    if (password.length < 10 || password.length > 1024)
      return devicesView(c, null, 'The password must be 10 to 1024 characters long.', 400);
    if (await deps.storage.findAccount(username))
      return devicesView(c, null, `An account named “${username}” exists already.`, 400);
    await deps.storage.createAccount({
      username,
      role: 'inspector',
      passwordHash: await hashPassword(password, deps.config.scryptCost),
      mustChangePassword: false,
      createdAt: deps.now().toISOString(),
    });
    deps.log.info('accountCreated', { by: me(c).username, username, role: 'inspector' });
    return devicesView(c, null, `Inspector “${username}” added.`);
  });

  app.post('/devices/:kid/name', supervisor, async (c) => {
    const form = await readForm(c, max);
    const name = (form.get('name') ?? '').trim();
    let notice: string;
    if (!name || name.length > 80) notice = 'A name must be 1 to 80 characters long; nothing was changed.';
    else if (await deps.storage.renameDevice(c.req.param('kid'), name)) notice = `Renamed to “${name}”.`;
    else notice = 'No such device.';
    return devicesView(c, null, notice);
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
    return devicesView(c, null, notice);
  });

  app.route('/review', reviewWebRoutes(deps));

  const seamsView = async (c: Context<AppEnv>, extra: { notice?: string; problems?: RowProblem[] } = {}) => {
    const [listed, devices, inspectors] = await Promise.all([
      deps.storage.reviewQueue({ ...parseReviewQuery(new URLSearchParams('sort=label')), limit: 500 }),
      deps.storage.listDevices(),
      deps.storage.listAccounts('inspector'),
    ]);
    return seamsPage({
      user: me(c).username,
      seams: listed.rows,
      total: listed.total,
      devices,
      inspectors,
      ...extra,
    });
  };
  /** The tablet or the inspector the form names (a 400 when it names both), with the note. */
  const deviceOf = (form: URLSearchParams): AssignTo | null => {
    const kid = form.get('device') ?? '';
    const inspector = form.get('inspector') ?? '';
    if (kid && inspector) throw new HttpError(400, 'invalid', 'Choose a tablet or an inspector, not both.');
    const note = form.get('note') ? { note: (form.get('note') ?? '').slice(0, 500) } : {};
    if (kid) return { deviceKid: kid, ...note };
    if (inspector) return { inspector, ...note };
    return null;
  };

  app.get('/seams', supervisor, async (c) =>
    page(c, await seamsView(c, { notice: c.req.query('notice') ?? '' })),
  );

  app.post('/seams', supervisor, async (c) => {
    const form = await readForm(c, max);
    const values = Object.fromEntries(SEAM_FIELDS.map((f) => [f.key, form.get(f.key) ?? '']));
    const { seams, problems } = await checkRows(deps, [values]);
    if (problems.length) return page(c, await seamsView(c, { problems }), 400);
    try {
      await createSeams(deps, me(c), seams, deviceOf(form));
    } catch (error) {
      if (!(error instanceof HttpError) || error.status >= 500) throw error;
      return page(c, await seamsView(c, { problems: [{ line: 0, message: error.message }] }), 400);
    }
    // The Seams page lists seams from their review facts: let the new ones show at once.
    await deps.regrader.idle();
    await deps.reviewIndexer.idle();
    return c.redirect(
      `/supervisor/seams?notice=${encodeURIComponent(`Seam “${seams[0]?.label ?? ''}” set up.`)}`,
      303,
    );
  });

  app.route('/seams/import', seamImportRoutes(deps));

  // The tag sheet of the ticked seams (seam=…, repeatable) and of the seams assigned to a tablet or an inspector.
  app.get('/seams/tags', supervisor, async (c) => {
    const query = new URL(c.req.url).searchParams;
    const ids = new Set(query.getAll('seam').filter(Boolean));
    const selection: [string, string][] = [...ids].map((id) => ['seam', id]);
    const kid = query.get('device') ?? '';
    const inspector = query.get('inspector') ?? '';
    if (kid) {
      for (const id of await deps.storage.assignedSeams({ deviceKid: kid })) ids.add(id);
      selection.push(['device', kid]);
    }
    if (inspector) {
      const account = await deps.storage.findAccount(inspector);
      if (account?.role === 'inspector')
        for (const id of await deps.storage.assignedSeams({ inspectorId: account.id })) ids.add(id);
      selection.push(['inspector', inspector]);
    }
    if (!ids.size)
      return page(
        c,
        await seamsView(c, {
          problems: [
            {
              line: 0,
              message:
                'Tick at least one seam, or choose a tablet or an inspector with seams assigned, to print their tags.',
            },
          ],
        }),
        400,
      );
    const seams = [];
    for (const id of [...ids].slice(0, MAX_SHEET_SEAMS)) {
      const material = await deps.storage.seamMaterial(id);
      const setup = foldSeam(material).seam;
      if (!setup) continue;
      seams.push({ id, label: setup.label, tags: seamTags(material) });
    }
    return page(
      c,
      tagSheetPage({
        user: me(c).username,
        seams,
        choice: sheetChoice(query),
        selection,
        max: MAX_SHEET_LABELS,
      }),
    );
  });

  app.post('/seams/assign', supervisor, async (c) => {
    const form = await readForm(c, LIST_BYTES);
    const ids = form.getAll('seam');
    let assign: AssignTo | null;
    try {
      assign = deviceOf(form);
      if (!assign || !ids.length)
        throw new HttpError(400, 'invalid', 'Tick at least one seam and choose a tablet or an inspector.');
      // Every target and seam is checked before the first assignment, so a refusal leaves nothing half done.
      await checkAssignTo(deps, assign);
      for (const seamId of ids)
        if (!(await deps.storage.getSeam(seamId)) && (await deps.storage.latestRecordSeq(seamId)) === 0)
          throw new HttpError(404, 'unknownSeam', `no seam "${seamId}" is known to this server`);
      for (const seamId of ids) await assignSeam(deps, me(c), { seamId, ...assign });
    } catch (error) {
      if (!(error instanceof HttpError) || error.status >= 500) throw error;
      return page(c, await seamsView(c, { problems: [{ line: 0, message: error.message }] }), 400);
    }
    const them = ids.length === 1 ? 'it' : 'them';
    const notice =
      assign.deviceKid !== undefined
        ? `${ids.length} seam${ids.length === 1 ? '' : 's'} assigned to ${(await deps.storage.getDevice(assign.deviceKid))?.name ?? assign.deviceKid}; the tablet receives ${them} on its next sync.`
        : `${ids.length} seam${ids.length === 1 ? '' : 's'} assigned to inspector ${assign.inspector}; every tablet working for ${assign.inspector} receives ${them} on its next sync.`;
    return c.redirect(`/supervisor/seams?notice=${encodeURIComponent(notice)}`, 303);
  });

  return app;
}
