// The review as JSON, under /api/admin/review (mounted inside the supervisor API, so the same session and role
// checks apply): the queue with its counts and filter choices, a seam in full, its audit trail and its export.
import { Hono } from 'hono';
import type { AppDeps, AppEnv } from '../deps.js';
import { parseReviewQuery } from './query.js';
import { seamDetail, type SeamDetail } from './seam-detail.js';
import { reviewQueue, seamAudit, seamExport } from './service.js';
import { readingsExport, seamsExport } from './exports.js';

/** The seam detail as plain JSON (the device map becomes a list). */
export function detailJson(d: SeamDetail) {
  const { devices, review, ...rest } = d;
  return {
    ...rest,
    review: {
      summary: review.summary,
      stored: review.stored,
      grade: review.grade,
      assessment: review.assessment,
    },
    devices: [...devices.values()].map(({ publicJwk: _key, ...device }) => device),
  };
}

export function reviewApiRoutes(deps: AppDeps): Hono<AppEnv> {
  const app = new Hono<AppEnv>();

  app.get('/queue', async (c) => {
    const query = parseReviewQuery(new URL(c.req.url).searchParams);
    const { page, choices, pending } = await reviewQueue(deps, query);
    return c.json({ query, ...page, choices, pending });
  });

  app.get('/seams/:id', async (c) => c.json(detailJson(await seamDetail(deps, c.req.param('id')))));

  app.get('/seams/:id/audit', async (c) => c.json((await seamAudit(deps, c.req.param('id'))).events));

  app.get('/seams/:id/export.json', async (c) => c.json(await seamExport(deps, c.req.param('id'))));

  app.get('/export/readings.csv', async (c) => {
    c.header('Content-Type', 'text/csv; charset=utf-8');
    return c.body(await readingsExport(deps, new URL(c.req.url).searchParams));
  });

  app.get('/export/seams.csv', async (c) => {
    c.header('Content-Type', 'text/csv; charset=utf-8');
    return c.body(await seamsExport(deps, new URL(c.req.url).searchParams));
  });

  return app;
}
