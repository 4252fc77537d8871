// The review pages under /supervisor/review (supervisor session; an inspector's session is refused): the queue,
// a seam with its decision form, the audit trail, downloads of a seam with its signed batches and of a batch
// exactly as received. Decisions are posted by the page's form; nothing here changes one after it is made.
import { Hono, type Context } from 'hono';
import { DECISION_OUTCOMES, JOSE_JSON, type DecisionOutcome } from '../../../protocol/index.js';
import { requireRole } from '../../auth/session.js';
import type { AppDeps, AppEnv } from '../../deps.js';
import { readForm } from '../../http/body.js';
import { HttpError } from '../../http/errors.js';
import { recordDecision, OUTCOME_TEXT } from '../../review/decisions.js';
import { parseReviewQuery } from '../../review/query.js';
import { fileSafe, reviewQueue, seamAudit, seamExport } from '../../review/service.js';
import { seamDetail } from '../../review/seam-detail.js';
import type { Account } from '../../storage/types.js';
import { auditPage } from './audit-page.js';
import { queuePage } from './queue-page.js';
import { seamPage } from './seam-page.js';
import { PRINT_JS, reportPage } from './report-page.js';
import { readingsExport, seamsExport, selectedSeams } from '../../review/exports.js';

/** Seams in one printed report at most (each is several pages). */
const MAX_REPORT = 200;

const page = (c: Context, body: string, status: 200 | 400 | 404 | 409 = 200) => {
  c.header('Cache-Control', 'no-store');
  return c.html(body, status);
};

export function download(c: Context, body: string, type: string, name: string) {
  c.header('Content-Type', type);
  c.header('Content-Disposition', `attachment; filename="${name}"`);
  c.header('Cache-Control', 'no-store');
  return c.body(body);
}

export function reviewWebRoutes(deps: AppDeps): Hono<AppEnv> {
  const app = new Hono<AppEnv>();
  const max = deps.config.limits.otherBytes;
  app.use('*', requireRole('supervisor', 'page'));
  const me = (c: Context<AppEnv>): Account => c.get('account') as Account;

  app.get('/', async (c) => {
    const query = parseReviewQuery(new URL(c.req.url).searchParams);
    const { page: result, choices, pending } = await reviewQueue(deps, query);
    return page(c, queuePage({ user: me(c).username, query, page: result, choices, pending }));
  });

  app.get('/seams/:id', async (c) => {
    const detail = await seamDetail(deps, c.req.param('id'));
    const notice = c.req.query('decided');
    return page(
      c,
      seamPage(me(c).username, detail, {
        notice:
          notice && notice in OUTCOME_TEXT ? `Recorded: ${OUTCOME_TEXT[notice as DecisionOutcome]}.` : null,
      }),
    );
  });

  app.post('/seams/:id/decisions', async (c) => {
    const seamId = c.req.param('id');
    const form = await readForm(c, max);
    const outcome = form.get('outcome') ?? '';
    const round = Number(form.get('round'));
    const basedOnText = form.get('basedOn') ?? '';
    const basedOn = basedOnText === '' ? Number.NaN : Number(basedOnText);
    try {
      if (!(DECISION_OUTCOMES as readonly string[]).includes(outcome))
        throw new HttpError(
          400,
          'invalid',
          'Choose an outcome: accept, send back for rework, or ask for more readings.',
        );
      if (!Number.isInteger(round) || round < 1 || round > 999)
        throw new HttpError(400, 'invalid', 'round: not a round');
      await recordDecision(deps, me(c), {
        seamId,
        round,
        outcome: outcome as DecisionOutcome,
        comment: (form.get('comment') ?? '').slice(0, 2000),
        ...(Number.isInteger(basedOn) && basedOn >= 0 ? { basedOn } : {}),
      });
    } catch (error) {
      if (!(error instanceof HttpError) || error.status === 404) throw error;
      const detail = await seamDetail(deps, seamId);
      return page(c, seamPage(me(c).username, detail, { error: error.message }), 400);
    }
    // Post, redirect, get: a reload does not record the decision twice.
    return c.redirect(`/supervisor/review/seams/${encodeURIComponent(seamId)}?decided=${outcome}`, 303);
  });

  app.get('/seams/:id/audit', async (c) => {
    const { detail, events } = await seamAudit(deps, c.req.param('id'));
    return page(c, auditPage(me(c).username, detail, events));
  });

  app.get('/seams/:id/export.json', async (c) => {
    const id = c.req.param('id');
    const bundle = await seamExport(deps, id);
    return download(
      c,
      `${JSON.stringify(bundle, null, 2)}\n`,
      'application/json; charset=utf-8',
      `${fileSafe(id)}.audit.json`,
    );
  });

  app.get('/print.js', (c) => {
    c.header('Content-Type', 'text/javascript; charset=utf-8');
    c.header('Cache-Control', 'no-cache');
    return c.body(PRINT_JS);
  });

  app.get('/export/readings.csv', async (c) =>
    download(
      c,
      await readingsExport(deps, new URL(c.req.url).searchParams),
      'text/csv; charset=utf-8',
      'readings.csv',
    ),
  );

  app.get('/export/seams.csv', async (c) =>
    download(
      c,
      await seamsExport(deps, new URL(c.req.url).searchParams),
      'text/csv; charset=utf-8',
      'seams.csv',
    ),
  );

  app.get('/report', async (c) => {
    const params = new URL(c.req.url).searchParams;
    const ids = await selectedSeams(deps, params, MAX_REPORT + 1);
    const details = [];
    for (const id of ids.slice(0, MAX_REPORT))
      details.push(await seamDetail(deps, id, { sensitivity: false }));
    const more = ids.length > MAX_REPORT;
    return page(c, reportPage(me(c).username, details, deps.now().toISOString(), more));
  });

  app.get('/batches/:file{.+\\.jws}', async (c) => {
    const id = c.req.param('file').replace(/\.jws$/, '');
    const batch = await deps.storage.getBatch(id);
    if (!batch) throw new HttpError(404, 'unknownBatch', 'no such batch');
    return download(c, batch.jws, JOSE_JSON, `${fileSafe(id)}.jws`);
  });

  return app;
}
