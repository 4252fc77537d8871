// The supervisor API (JSON, session with the supervisor role). Documented in DEVELOPERS.md; tests seed their
// data through it.
import { Hono } from 'hono';
import * as v from 'valibot';
import { DECISION_OUTCOMES, KID_PATTERN } from '../../protocol/index.js';
import { hashPassword } from '../auth/password.js';
import { newPasswordSchema } from '../auth/routes.js';
import { requireRole, sameOrigin } from '../auth/session.js';
import type { AppDeps, AppEnv } from '../deps.js';
import { mediaType, readJson } from '../http/body.js';
import { HttpError } from '../http/errors.js';
import { parseInput } from '../http/validate.js';
import type { Account } from '../storage/types.js';
import { reviewApiRoutes } from '../review/api-routes.js';
import {
  assignSeam,
  checkSeamSetup,
  decide,
  issueEnrolmentCode,
  putSeam,
  seamView,
  tieDevice,
} from './service.js';

const id = v.pipe(
  v.string('must be a string'),
  v.minLength(1, 'must not be empty'),
  v.maxLength(64, 'must be at most 64 characters'),
);
const kid = v.pipe(v.string(), v.regex(KID_PATTERN, 'must be a device kid'));
const deviceName = v.pipe(
  v.string('must be a string'),
  v.trim(),
  v.minLength(1, 'must not be empty'),
  v.maxLength(80, 'must be at most 80 characters'),
);

const username = v.pipe(
  v.string(),
  v.regex(/^[A-Za-z0-9._-]{1,40}$/, 'may hold 1 to 40 letters, digits, dots, dashes and underscores'),
);
const accountInput = v.strictObject({
  username,
  password: newPasswordSchema,
  role: v.picklist(['supervisor', 'inspector'], 'must be "supervisor" or "inspector"'),
});
const seamInput = v.strictObject({ seam: v.unknown() });
const assignmentInput = v.pipe(
  v.strictObject({
    seamId: id,
    deviceKid: v.optional(kid),
    inspector: v.optional(username),
    note: v.optional(v.pipe(v.string(), v.maxLength(500))),
  }),
  v.check(
    (i) => (i.deviceKid === undefined) !== (i.inspector === undefined),
    'name either deviceKid (a tablet) or inspector (an inspector account), not both',
  ),
);
const codeInput = v.strictObject({ inspector: v.optional(v.nullable(username)) });
const tieInput = v.strictObject({ inspector: v.nullable(username) });
const decisionInput = v.strictObject({
  seamId: id,
  round: v.pipe(v.number(), v.integer(), v.minValue(1), v.maxValue(999)),
  outcome: v.picklist(DECISION_OUTCOMES, `must be one of ${DECISION_OUTCOMES.join(', ')}`),
  comment: v.optional(v.pipe(v.string(), v.maxLength(2000))),
  basedOn: v.optional(v.pipe(v.number(), v.integer(), v.minValue(0))),
});
const renameInput = v.strictObject({ name: deviceName });

export function adminRoutes(deps: AppDeps): Hono<AppEnv> {
  const app = new Hono<AppEnv>();
  const max = deps.config.limits.otherBytes;
  app.use('*', sameOrigin(), requireRole('supervisor', 'api'));
  app.use('*', async (c, next) => {
    await next();
    c.header('Cache-Control', 'no-store');
  });
  const who = (account: Account | null): Account => account as Account;

  app.get('/devices', async (c) => c.json(await deps.storage.listDevices()));

  app.post('/enrolment-codes', async (c) => {
    // An empty body asks for a code for a device that works for no inspector in particular.
    const { inspector } =
      mediaType(c) === null ? { inspector: null } : parseInput(codeInput, await readJson(c, max));
    return c.json(await issueEnrolmentCode(deps, who(c.get('account')), inspector ?? null), 201);
  });

  app.get('/inspectors', async (c) => c.json(await deps.storage.listAccounts('inspector')));

  app.put('/devices/:kid/inspector', async (c) => {
    const { inspector } = parseInput(tieInput, await readJson(c, max));
    await tieDevice(deps, who(c.get('account')), c.req.param('kid'), inspector);
    return c.json(await deps.storage.getDevice(c.req.param('kid')));
  });

  app.patch('/devices/:kid', async (c) => {
    const { name } = parseInput(renameInput, await readJson(c, max));
    if (!(await deps.storage.renameDevice(c.req.param('kid'), name)))
      throw new HttpError(404, 'unknownDevice', 'no such device');
    return c.json(await deps.storage.getDevice(c.req.param('kid')));
  });

  app.post('/devices/:kid/revoke', async (c) => {
    const target = c.req.param('kid');
    if (!(await deps.storage.revokeDevice(target, deps.now().toISOString())))
      throw new HttpError(404, 'unknownDevice', 'no such device');
    deps.log.info('revoked', { by: who(c.get('account')).username, kid: target });
    return c.json(await deps.storage.getDevice(target));
  });

  app.post('/accounts', async (c) => {
    const input = parseInput(accountInput, await readJson(c, max));
    if (await deps.storage.findAccount(input.username))
      throw new HttpError(409, 'exists', 'an account with this name exists');
    const account = await deps.storage.createAccount({
      username: input.username,
      role: input.role,
      passwordHash: await hashPassword(input.password, deps.config.scryptCost),
      mustChangePassword: false,
      createdAt: deps.now().toISOString(),
    });
    return c.json(account, 201);
  });

  app.put('/seams/:id', async (c) => {
    const { seam: input } = parseInput(seamInput, await readJson(c, max));
    const seam = checkSeamSetup(input);
    if (seam.id !== c.req.param('id'))
      throw new HttpError(400, 'invalid', 'seam.id: must equal the id in the address');
    const result = await putSeam(deps, who(c.get('account')), seam, 'live');
    return c.json({ id: seam.id, result }, result === 'created' ? 201 : 200);
  });

  app.get('/seams', async (c) => {
    const ids = await deps.storage.listSeamIds();
    const seams = [];
    for (const seamId of ids) {
      const [row, grade] = await Promise.all([
        deps.storage.getSeam(seamId),
        deps.storage.getServerGrade(seamId),
      ]);
      seams.push({
        id: seamId,
        namespace: row?.namespace ?? 'live',
        state: grade?.state ?? null,
        levelMet: grade?.levelMet ?? null,
      });
    }
    return c.json(seams);
  });

  app.get('/seams/:id', async (c) => c.json(await seamView(deps, c.req.param('id'))));

  app.post('/assignments', async (c) => {
    const input = parseInput(assignmentInput, await readJson(c, max));
    const target =
      input.deviceKid !== undefined ? { deviceKid: input.deviceKid } : { inspector: input.inspector ?? '' };
    return c.json(
      await assignSeam(deps, who(c.get('account')), {
        seamId: input.seamId,
        ...target,
        ...(input.note !== undefined ? { note: input.note } : {}),
      }),
      201,
    );
  });

  app.post('/decisions', async (c) => {
    const input = parseInput(decisionInput, await readJson(c, max));
    return c.json(await decide(deps, who(c.get('account')), input), 201);
  });

  app.get('/decisions/:id', async (c) => {
    const decision = await deps.storage.getDecision(c.req.param('id'));
    if (!decision) throw new HttpError(404, 'unknownDecision', 'no such decision');
    return c.json(decision);
  });

  // A decision is an immutable event: it is never changed or removed, only followed by a later decision.
  app.on(['PUT', 'PATCH', 'DELETE'], '/decisions/:id', async (c) => {
    deps.log.warn('security', {
      what: 'decisionChangeRefused',
      by: who(c.get('account')).username,
      method: c.req.method,
      id: c.req.param('id').slice(0, 80),
    });
    throw new HttpError(
      405,
      'immutable',
      'decisions cannot be changed or removed: record a new decision on the seam instead',
      { Allow: 'GET' },
    );
  });

  app.route('/review', reviewApiRoutes(deps));

  app.get('/records', async (c) => {
    const seamId = c.req.query('seamId');
    const deviceKid = c.req.query('deviceKid');
    const records = await deps.storage.listRecords({
      ...(seamId !== undefined ? { seamId } : {}),
      ...(deviceKid !== undefined ? { deviceKid } : {}),
    });
    return c.json(records.map((r) => ({ ...r, body: JSON.parse(r.body) as unknown })));
  });

  app.get('/parked', async (c) =>
    c.json((await deps.storage.listParked()).map((r) => ({ ...r, record: JSON.parse(r.record) as unknown }))),
  );

  app.get('/batches/:id', async (c) => {
    const batch = await deps.storage.getBatch(c.req.param('id'));
    if (!batch) throw new HttpError(404, 'unknownBatch', 'no such batch');
    return c.json(batch);
  });

  app.get('/security-events', async (c) => {
    const limit = Math.min(1000, Math.max(1, Number(c.req.query('limit') ?? 100) || 100));
    return c.json(await deps.storage.listSecurityEvents(limit));
  });

  /** Waits until every scheduled re-grade and review-facts update has finished (tests use it before reading). */
  app.post('/regrade/wait', async (c) => {
    await deps.regrader.idle();
    await deps.reviewIndexer.idle();
    return c.body(null, 204);
  });

  return app;
}
