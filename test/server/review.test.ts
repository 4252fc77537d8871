// The supervisor's review: every review endpoint refuses without a session and refuses an inspector's session;
// the queue's filters, counts, sorting and pages on a seeded yard; the seam detail (corrections superseding,
// batch signatures, server grade beside the device's); decisions as signed, immutable events that reach the
// device through pull; the audit trail and the export a third party verifies with jose alone.
import { flattenedVerify, importJWK, type JWK } from 'jose';
import { createHash } from 'node:crypto';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { GRADE_CAUTION, INDICATIVE_CAUTION } from '../../src/domain/index.js';
import { verifyServerItem, type Decision, type PullReply } from '../../src/protocol/index.js';
import { escapeHtml } from '../../src/server/web/html.js';
import { bodies } from './records.js';
import { inspectorCookie, queue, seedYard } from './review-seed.js';
import { jsonOf, ORIGIN, testServer, type TestServer } from './support.js';

const form = (fields: Record<string, string>) => new URLSearchParams(fields).toString();

async function page(server: TestServer, path: string): Promise<{ status: number; text: string }> {
  const res = await server.request(path, { headers: { cookie: await server.supervisorCookie() } });
  return { status: res.status, text: await res.text() };
}

async function decideByForm(server: TestServer, seamId: string, fields: Record<string, string>) {
  return server.request(`/supervisor/review/seams/${encodeURIComponent(seamId)}/decisions`, {
    method: 'POST',
    headers: {
      cookie: await server.supervisorCookie(),
      origin: ORIGIN,
      'content-type': 'application/x-www-form-urlencoded',
    },
    body: form(fields),
  });
}

const API = [
  ['GET', '/api/admin/review/queue'],
  ['GET', '/api/admin/review/seams/x'],
  ['GET', '/api/admin/review/seams/x/audit'],
  ['GET', '/api/admin/review/seams/x/export.json'],
  ['POST', '/api/admin/decisions'],
  ['GET', '/api/admin/decisions/x'],
  ['PUT', '/api/admin/decisions/x'],
  ['PATCH', '/api/admin/decisions/x'],
  ['DELETE', '/api/admin/decisions/x'],
  ['GET', '/api/admin/review/export/readings.csv'],
  ['GET', '/api/admin/review/export/seams.csv'],
] as const;

const PAGES = [
  ['GET', '/supervisor/review'],
  ['GET', '/supervisor/review/seams/x'],
  ['POST', '/supervisor/review/seams/x/decisions'],
  ['GET', '/supervisor/review/seams/x/audit'],
  ['GET', '/supervisor/review/seams/x/export.json'],
  ['GET', '/supervisor/review/batches/x.jws'],
  ['GET', '/supervisor/review/export/readings.csv'],
  ['GET', '/supervisor/review/export/seams.csv'],
  ['GET', '/supervisor/review/report?seam=x'],
] as const;

describe('review endpoints: supervisors only', () => {
  it('refuses every review endpoint without a session: 401 from the API, the sign-in page for pages', async () => {
    const server = await testServer();
    await seedYard(server);
    for (const [method, path] of API) {
      const res = await server.request(path, {
        method,
        headers: { origin: ORIGIN, 'content-type': 'application/json' },
        body: method === 'GET' ? null : '{}',
      });
      expect(res.status, `${method} ${path}`).toBe(401);
    }
    for (const [method, path] of PAGES) {
      const res = await server.request(path, {
        method,
        headers: { origin: ORIGIN, 'content-type': 'application/x-www-form-urlencoded' },
        body: method === 'GET' ? null : 'outcome=accepted&round=1',
      });
      expect(res.status, `${method} ${path}`).toBe(303);
      expect(res.headers.get('location')).toBe('/supervisor/login');
      expect(await res.text()).not.toContain('Seam ');
    }
    // Nothing was decided by any of those requests.
    expect((await server.storage.dumpRecordTables())['records']?.length).toBeGreaterThan(0);
    expect(server.storage.database.prepare('SELECT count(*) AS n FROM decisions').get()).toEqual({ n: 0 });
  });

  it("refuses an inspector's session on every review endpoint (403)", async () => {
    const server = await testServer();
    const { seams } = await seedYard(server);
    const cookie = await inspectorCookie(server);
    const real = (path: string) => path.replace('/x', `/${seams.alpha.id}`);
    for (const [method, path] of [...API, ...PAGES]) {
      const res = await server.request(real(path), {
        method,
        headers: {
          cookie,
          origin: ORIGIN,
          'content-type': path.startsWith('/api') ? 'application/json' : 'application/x-www-form-urlencoded',
        },
        body:
          method === 'GET'
            ? null
            : path.startsWith('/api')
              ? JSON.stringify({ seamId: seams.alpha.id, round: 1, outcome: 'accepted' })
              : 'outcome=accepted&round=1',
      });
      expect(res.status, `${method} ${path}`).toBe(403);
      expect(await res.text()).not.toContain(seams.alpha.label);
    }
    expect(server.storage.database.prepare('SELECT count(*) AS n FROM decisions').get()).toEqual({ n: 0 });
  });
});

describe('review queue', () => {
  it('filters the seeded yard by each flag, with a count per flag', async () => {
    const server = await testServer();
    await seedYard(server);
    const all = await queue(server);
    // Default order: worst level first (below-required D, then D, C, B), not yet inspected last.
    expect(all.labels).toEqual(['bravo', 'charlie', 'delta', 'alpha', 'echo', 'foxtrot']);
    expect(all.total).toBe(6);
    expect(all.counts).toEqual({
      belowRequired: 1,
      fatBelow: 1,
      samplingShort: 4,
      borderline: 1,
      unreviewed: 5,
    });
    // ISO 5817:2014 row 1.12: 100° meets D (≥ 90°) but not C (≥ 110°); bravo asks for C.
    expect((await queue(server, 'flag=belowRequired')).labels).toEqual(['bravo']);
    // e = 2 mm on t = 10 mm: km 1.6, FAT equivalent 65 below the required 80 (see test/unit/fatigue-class).
    expect((await queue(server, 'flag=fatBelow')).labels).toEqual(['charlie']);
    // Four toe angles within the 1° resolution: adequate; one or two positions are not (seams alpha only).
    expect((await queue(server, 'flag=samplingShort&sort=label')).labels).toEqual([
      'bravo',
      'charlie',
      'delta',
      'echo',
    ]);
    // 110.5° read at 1° resolution is within the resolution of C's 110° limit: borderline.
    expect((await queue(server, 'flag=borderline')).labels).toEqual(['delta']);
    // foxtrot has no record yet: nothing to review.
    expect((await queue(server, 'flag=unreviewed&sort=label')).labels).toEqual([
      'alpha',
      'bravo',
      'charlie',
      'delta',
      'echo',
    ]);
    // Flags combine; the counts stay those of the selection without flags.
    const both = await queue(server, 'flag=samplingShort&flag=borderline');
    expect(both.labels).toEqual(['delta']);
    expect(both.scope).toBe(6);
    expect(both.counts['samplingShort']).toBe(4);
  });

  it('filters by welder, procedure, drawing, area, device, inspector, inspection days and text', async () => {
    const server = await testServer();
    const { tabletA, tabletB } = await seedYard(server);
    const labels = async (q: string) => (await queue(server, `${q}&sort=label`)).labels;
    expect(await labels('welder=W-1')).toEqual(['alpha', 'charlie']);
    expect(await labels('welder=W-3')).toEqual(['delta', 'echo']);
    expect(await labels('procedure=WPS-B')).toEqual(['bravo', 'delta']);
    expect(await labels('drawing=D-2')).toEqual(['bravo', 'echo']);
    expect(await labels('area=Bay 1')).toEqual(['alpha', 'charlie']);
    expect(await labels(`device=${tabletA.kid}`)).toEqual(['alpha', 'charlie', 'echo']);
    expect(await labels(`device=${tabletB.kid}`)).toEqual(['bravo', 'delta']);
    expect(await labels('inspector=Ann')).toEqual(['alpha', 'delta', 'echo']);
    expect(await labels('inspector=Bo')).toEqual(['bravo', 'charlie']);
    // Inspection days by the device clocks, both ends inclusive.
    expect(await labels('from=2026-11-12&to=2026-11-16')).toEqual(['bravo', 'charlie', 'echo']);
    expect(await labels('from=2026-11-17')).toEqual(['delta']);
    expect(await labels('to=2026-11-10')).toEqual(['alpha']);
    expect(await labels('q=TAG-ECHO')).toEqual(['echo']);
    expect(await labels(`q=${'charl'}`)).toEqual(['charlie']);
    // Combined with a flag; the counts are those within the welder choice.
    const w1 = await queue(server, 'welder=W-1&flag=fatBelow');
    expect(w1.labels).toEqual(['charlie']);
    expect(w1.scope).toBe(2);
    expect(w1.counts).toMatchObject({ fatBelow: 1, belowRequired: 0, unreviewed: 2 });
    // Unknown flags, sort keys and malformed dates are dropped, never passed to the database.
    expect(await labels("flag=x';DROP TABLE decisions;--&from=yesterday")).toHaveLength(6);
    // The choices list each value with its count.
    const res = await jsonOf<{ choices: { welders: unknown[]; inspectors: unknown[] } }>(
      await server.admin('GET', '/review/queue'),
    );
    expect(res.choices.welders).toEqual([
      { value: 'W-1', label: 'W-1', count: 2 },
      { value: 'W-2', label: 'W-2', count: 1 },
      { value: 'W-3', label: 'W-3', count: 2 },
      { value: 'W-9', label: 'W-9', count: 1 },
    ]);
    expect(res.choices.inspectors).toEqual([
      { value: 'Ann', label: 'Ann', count: 3 },
      { value: 'Bo', label: 'Bo', count: 2 },
    ]);
  });

  it('sorts both ways and pages, with a stable order', async () => {
    const server = await testServer();
    await seedYard(server);
    expect((await queue(server, 'sort=label&dir=desc')).labels).toEqual([
      'foxtrot',
      'echo',
      'delta',
      'charlie',
      'bravo',
      'alpha',
    ]);
    expect((await queue(server, 'sort=inspected&dir=desc')).labels).toEqual([
      'delta',
      'echo',
      'charlie',
      'bravo',
      'alpha',
      'foxtrot',
    ]);
    const first = await queue(server, 'sort=label&size=4');
    const second = await queue(server, 'sort=label&size=4&page=2');
    expect(first.labels).toEqual(['alpha', 'bravo', 'charlie', 'delta']);
    expect(second.labels).toEqual(['echo', 'foxtrot']);
    expect(second.total).toBe(6);
    // The page shows the same: links keep the filters, and a next page link.
    const html = (await page(server, '/supervisor/review?sort=label&size=4&flag=samplingShort')).text;
    expect(html).toContain('Page 1 of 1');
    expect(html).toContain('Sampling not adequate <span class="count" data-flag="samplingShort">(4)</span>');
    const paged = (await page(server, '/supervisor/review?sort=label&size=2')).text;
    expect(paged).toContain('Page 1 of 3');
    expect(paged).toContain('href="/supervisor/review?sort=label&amp;size=2&amp;page=2"');
  });

  it('marks a seam not yet reviewed again when records arrive after its decision', async () => {
    const server = await testServer();
    const { seams, tabletB } = await seedYard(server);
    await server.admin('POST', '/decisions', {
      seamId: seams.bravo.id,
      round: 1,
      outcome: 'rework',
      comment: 'Dress the toe at 100 mm',
    });
    expect((await queue(server, 'flag=unreviewed&sort=label')).labels).toEqual([
      'alpha',
      'charlie',
      'delta',
      'echo',
    ]);
    // The tablet opens round 2 and sends a new reading.
    tabletB.add('round', 'r2-bravo', bodies.round(seams.bravo.id, 2));
    await tabletB.send(server, await tabletB.seal());
    await server.settle();
    const again = await queue(server, 'flag=unreviewed&sort=label');
    expect(again.labels).toContain('bravo');
    const row = (
      await jsonOf<{ rows: { label: string; decision: { outcome: string } | null; latestRound: number }[] }>(
        await server.admin('GET', '/review/queue?q=bravo'),
      )
    ).rows[0];
    expect(row?.decision?.outcome).toBe('rework');
    expect(row?.latestRound).toBe(2);
  });
});

describe('seam detail', () => {
  it('shows every reading with who, when, device and instrument, the correction superseding, and the batch signatures', async () => {
    const server = await testServer();
    const { seams, readings, tabletA } = await seedYard(server);
    const [wrong, right] = readings['echo'] ?? [];
    const { text, status } = await page(server, `/supervisor/review/seams/${seams.echo.id}`);
    expect(status).toBe(200);
    // The superseded reading stays, marked, next to the correction that replaces it.
    expect(text).toContain(`<tr class="reading-superseded" id="reading-${wrong?.id}">`);
    expect(text).toContain(`by <a href="#reading-${right?.id}" class="kid">${right?.id}</a>`);
    expect(text).toContain(`replaces <a href="#reading-${wrong?.id}" class="kid">${wrong?.id}</a>`);
    expect(text).toContain('toe angle α 95°');
    expect(text).toContain('TG-7, resolution 0.1 mm / 1°');
    expect(text).toContain('Ann (VT level 2)');
    expect(text).toContain('2026-11-16 08:05:00 UTC');
    expect(text).toContain('Tablet A');
    // Server grade beside the device's, the difference highlighted.
    expect(text).toContain('✔ B (C required)');
    const deviceRow = /<tr class="mismatch-row">[\s\S]*?<\/tr>/.exec(text)?.[0] ?? '';
    expect(deviceRow).toContain('Device Tablet A (batch 1)');
    expect(deviceRow).toMatch(/D\s*<strong class="mismatch">⚠ differs from the server<\/strong>/);
    expect(text).toContain('The newest device grade differs from the server');
    // Each batch verified again with the enrolled key: verified, its kid, the device's name.
    expect(text).toContain('✔ verified');
    expect(text).toContain(`<td class="kid">${tabletA.kid}</td>`);
    // The strip chart with limit lines, drawn on the server.
    expect(text).toMatch(/<svg\s+xmlns="http:\/\/www.w3.org\/2000\/svg"\s+role="img"/);
    expect(text).toContain('<g class="limit limit-B">');
    // The fatigue assessment and both cautions.
    expect(text).toContain('Fatigue assessment');
    expect(text).toContain(INDICATIVE_CAUTION);
    expect(text).toContain(escapeHtml(GRADE_CAUTION));
    // The JSON form says the same.
    const json = await jsonOf<{
      readings: { status: string; supersededBy: string | null }[];
      batches: { verified: boolean; kid: string; deviceName: string }[];
      mismatch: boolean;
      review: { assessment: { caution: string } };
    }>(await server.admin('GET', `/review/seams/${seams.echo.id}`));
    expect(json.readings.map((r) => r.status)).toEqual(['superseded', 'current']);
    expect(json.batches).toEqual([
      expect.objectContaining({ verified: true, kid: tabletA.kid, deviceName: 'Tablet A' }),
    ]);
    expect(json.mismatch).toBe(true);
    expect(json.review.assessment.caution).toBe(INDICATIVE_CAUTION);
  });

  it('shows a batch whose stored body no longer verifies as not verified', async () => {
    const server = await testServer();
    const { seams, tabletA } = await seedYard(server);
    const db = server.storage.database;
    const row = db.prepare('SELECT batch_id, jws FROM batches WHERE device_kid = ?').get(tabletA.kid) as {
      batch_id: string;
      jws: string;
    };
    const jws = JSON.parse(row.jws) as { signature: string };
    const s = jws.signature;
    const flipped = `${s.slice(0, 10)}${s[10] === 'A' ? 'B' : 'A'}${s.slice(11)}`;
    db.prepare('UPDATE batches SET jws = ? WHERE batch_id = ?').run(
      JSON.stringify({ ...jws, signature: flipped }),
      row.batch_id,
    );
    const json = await jsonOf<{ batches: { verified: boolean; problem: string }[] }>(
      await server.admin('GET', `/review/seams/${seams.alpha.id}`),
    );
    expect(json.batches).toEqual([
      expect.objectContaining({
        verified: false,
        problem: expect.stringContaining('signature does not verify'),
      }),
    ]);
    const bravo = await jsonOf<{ batches: { verified: boolean }[] }>(
      await server.admin('GET', `/review/seams/${seams.bravo.id}`),
    );
    expect(bravo.batches.map((b) => b.verified)).toEqual([true]);
  });
});

describe('decisions', () => {
  it('records a decision from the page as a signed event that the device pulls and verifies', async () => {
    const server = await testServer();
    const { seams, tabletB } = await seedYard(server);
    const missing = await decideByForm(server, seams.bravo.id, {
      outcome: 'rework',
      round: '1',
      comment: '',
    });
    expect(missing.status).toBe(400);
    expect(await missing.text()).toContain('a comment is needed');
    const res = await decideByForm(server, seams.bravo.id, {
      outcome: 'rework',
      round: '1',
      basedOn: '999999',
      comment: 'Grind the toe at 100 mm',
    });
    expect(res.status).toBe(400);
    const ok = await decideByForm(server, seams.bravo.id, {
      outcome: 'rework',
      round: '1',
      comment: 'Grind the toe at 100 mm',
    });
    // Without the page's basedOn the decision covers every record held: the seam counts as reviewed.
    expect((await queue(server, 'flag=unreviewed')).labels).not.toContain('bravo');
    expect(ok.status).toBe(303);
    expect(ok.headers.get('location')).toBe(`/supervisor/review/seams/${seams.bravo.id}?decided=rework`);
    const shown = (await page(server, ok.headers.get('location') ?? '')).text;
    expect(shown).toContain('Recorded: Sent back for rework.');
    expect(shown).toContain('Grind the toe at 100 mm');
    expect(shown).toContain('✔ signature verified');

    const pulled = await tabletB.pull(server, null);
    const reply = pulled.body as PullReply;
    const items = await Promise.all(
      reply.items.map((i) =>
        verifyServerItem(
          i,
          { kid: server.deps.serverKey.kid, jwk: server.deps.serverKey.publicJwk },
          tabletB.kid,
        ),
      ),
    );
    const decision = items.find((i) => i.type === 'decision') as Decision;
    expect(decision).toMatchObject({
      seamId: seams.bravo.id,
      round: 1,
      outcome: 'rework',
      comment: 'Grind the toe at 100 mm',
      decidedBy: 'supervisor',
    });
  });

  it('keeps decisions immutable: the API refuses to change or remove one, and so does the database', async () => {
    const server = await testServer();
    const { seams } = await seedYard(server);
    const first = await jsonOf<{ id: string }>(
      await server.admin('POST', '/decisions', { seamId: seams.alpha.id, round: 1, outcome: 'accepted' }),
    );
    const before = await jsonOf<Record<string, unknown>>(await server.admin('GET', `/decisions/${first.id}`));
    for (const method of ['PUT', 'PATCH', 'DELETE']) {
      const res = await server.admin(method, `/decisions/${first.id}`, {
        outcome: 'rework',
        comment: 'changed',
      });
      expect(res.status, method).toBe(405);
      expect(await jsonOf(res)).toMatchObject({ error: 'immutable' });
      expect(res.headers.get('allow')).toBe('GET');
    }
    expect(await jsonOf(await server.admin('GET', `/decisions/${first.id}`))).toEqual(before);
    const db = server.storage.database;
    expect(() => db.prepare("UPDATE decisions SET outcome = 'rework' WHERE id = ?").run(first.id)).toThrow(
      /decisions are immutable/,
    );
    expect(() => db.prepare('DELETE FROM decisions WHERE id = ?').run(first.id)).toThrow(/never removed/);
    expect(() => db.prepare("UPDATE changes SET item = '{}' WHERE item_id = ?").run(first.id)).toThrow(
      /immutable/,
    );
    expect(() => db.prepare('DELETE FROM changes').run()).toThrow(/never removed/);
    expect(await jsonOf(await server.admin('GET', `/decisions/${first.id}`))).toEqual(before);

    // A later decision supersedes it, chained to it by the SHA-256 of its signed event.
    const second = await jsonOf<{ id: string }>(
      await server.admin('POST', '/decisions', {
        seamId: seams.alpha.id,
        round: 1,
        outcome: 'moreReadings',
        comment: 'Two more positions near the end',
      }),
    );
    const rows = await server.storage.listDecisions(seams.alpha.id);
    expect(rows.map((r) => r.id)).toEqual([first.id, second.id]);
    const key = await importJWK(server.deps.serverKey.publicJwk as JWK, 'ES256');
    const events = [];
    for (const row of rows) {
      const verified = await flattenedVerify(JSON.parse(row.jws), key);
      expect(verified.protectedHeader).toEqual({
        alg: 'ES256',
        kid: server.deps.serverKey.kid,
        typ: 'beadbook-decision+jws',
      });
      events.push(JSON.parse(new TextDecoder().decode(verified.payload)) as Record<string, unknown>);
    }
    expect(events[0]).toMatchObject({
      id: first.id,
      outcome: 'accepted',
      previous: null,
      decidedBy: 'supervisor',
    });
    expect(events[1]).toMatchObject({
      id: second.id,
      outcome: 'moreReadings',
      previous: {
        id: first.id,
        jwsSha256: createHash('sha256')
          .update(rows[0]?.jws ?? '')
          .digest('hex'),
      },
    });
  });
});

describe('audit', () => {
  it('lists every event in the server order and exports the seam so that jose alone verifies it offline', async () => {
    const server = await testServer();
    const { seams, tabletA } = await seedYard(server);
    await server.admin('POST', '/decisions', {
      seamId: seams.echo.id,
      round: 1,
      outcome: 'moreReadings',
      comment: 'Re-gauge at 100 mm',
    });
    const events = await jsonOf<{ kind: string; summary: string }[]>(
      await server.admin('GET', `/review/seams/${seams.echo.id}/audit`),
    );
    expect(events.map((e) => e.kind)).toEqual([...Array(14).fill('record'), 'decision']);
    expect(events[0]?.summary).toBe('set-up revision 1');
    expect(events[14]?.summary).toBe('moreReadings by supervisor: Re-gauge at 100 mm');

    const res = await server.request(`/supervisor/review/seams/${seams.echo.id}/export.json`, {
      headers: { cookie: await server.supervisorCookie() },
    });
    expect(res.headers.get('content-disposition')).toMatch(
      /^attachment; filename="[A-Za-z0-9_.-]+\.audit\.json"$/,
    );
    const bundle = (await res.json()) as {
      devices: { kid: string; jwk: JWK }[];
      batches: { jws: { protected: string; payload: string; signature: string }; received: string }[];
      decisions: { jws: { protected: string; payload: string; signature: string } }[];
      serverKey: { kid: string; jwk: JWK };
    };
    expect(bundle.devices.map((d) => d.kid)).toEqual([tabletA.kid]);
    for (const batch of bundle.batches) {
      const header = JSON.parse(Buffer.from(batch.jws.protected, 'base64url').toString('utf8')) as {
        kid: string;
      };
      const device = bundle.devices.find((d) => d.kid === header.kid);
      const verified = await flattenedVerify(batch.jws, await importJWK(device?.jwk as JWK, 'ES256'));
      const payload = JSON.parse(new TextDecoder().decode(verified.payload)) as {
        records: { seamId: string }[];
      };
      expect(payload.records.some((r) => r.seamId === seams.echo.id)).toBe(true);
      expect(JSON.parse(batch.received)).toEqual(batch.jws);
    }
    const serverKey = await importJWK(bundle.serverKey.jwk, 'ES256');
    for (const d of bundle.decisions) await expect(flattenedVerify(d.jws, serverKey)).resolves.toBeDefined();
    // The batch is downloadable exactly as received.
    const page = await server.request(`/supervisor/review/seams/${seams.echo.id}/audit`, {
      headers: { cookie: await server.supervisorCookie() },
    });
    const html = await page.text();
    const batchId = /href="\/supervisor\/review\/batches\/([^"]+)\.jws"/.exec(html)?.[1] ?? '';
    const raw = await server.request(`/supervisor/review/batches/${batchId}.jws`, {
      headers: { cookie: await server.supervisorCookie() },
    });
    expect(raw.headers.get('content-type')).toBe('application/jose+json');
    expect(await raw.text()).toBe((await server.storage.getBatch(decodeURIComponent(batchId)))?.jws);
  });
});

describe('exports and the report', () => {
  it('exports readings and seam summaries as CSV with units in the headers', async () => {
    const server = await testServer();
    const { seams, readings, tabletA } = await seedYard(server);
    const res = await server.request(`/supervisor/review/export/readings.csv?seam=${seams.echo.id}`, {
      headers: { cookie: await server.supervisorCookie() },
    });
    expect(res.headers.get('content-disposition')).toBe('attachment; filename="readings.csv"');
    const parsed = Papa.parse<Record<string, string>>(await res.text(), {
      header: true,
      skipEmptyLines: true,
    });
    const header = parsed.meta.fields ?? [];
    expect(header).toContain('toeAngle (deg)');
    expect(header).toContain('undercutDepth (mm)');
    expect(header).toContain('position (mm)');
    expect(header).toContain('recorded at UTC (device clock)');
    const [wrong, right] = readings['echo'] ?? [];
    const rows = parsed.data;
    expect(rows.map((r) => [r['reading id'], r['toeAngle (deg)'], r['status'], r['superseded by']])).toEqual([
      [wrong?.id, '95', 'superseded', right?.id],
      [right?.id, '150', 'current', ''],
    ]);
    expect(rows[0]?.['device name']).toBe('Tablet A');
    expect(rows[0]?.['device kid']).toBe(tabletA.kid);

    const summary = await (await server.admin('GET', '/review/export/seams.csv?flag=belowRequired')).text();
    const [head, line, more] = summary.trim().split('\r\n');
    expect(head).toContain('level met (server),meets required');
    expect(line).toContain(
      `${seams.bravo.id},Seam bravo,no,TAG-bravo,Bay 2,D-2,W-2,WPS-B,ISO 5817:2014,C,graded,D,no`,
    );
    expect(more).toBeUndefined();
  });

  it('prints the inspection report with the level, the decision, unverified rows marked and the caution', async () => {
    const server = await testServer();
    const { seams } = await seedYard(server);
    await server.admin('POST', '/decisions', {
      seamId: seams.bravo.id,
      round: 1,
      outcome: 'rework',
      comment: 'Dress the toe',
    });
    const { status, text } = await page(server, `/supervisor/review/report?seam=${seams.bravo.id}`);
    expect(status).toBe(200);
    expect(text).toContain(`Report no. BB-${seams.bravo.id}</strong>, revision 1`);
    expect(text).toMatch(/Quality level met:[\s\S]*?✘ D \(C required\)/);
    expect(text).toMatch(/Decision: Sent back for rework<\/strong>\s*on round 1 by\s*supervisor/);
    expect(text).toContain('UNVERIFIED limit rows');
    expect(text).toContain('[ISO 17637, test report, from memory]');
    expect(text).toContain('[common practice]');
    expect(text).toContain(escapeHtml(GRADE_CAUTION));
    expect(text).toContain(INDICATIVE_CAUTION);
    // A selection by the queue's filters prints one report per seam.
    const many = (await page(server, '/supervisor/review/report?welder=W-1')).text;
    expect(many.match(/<article class="report"/g)).toHaveLength(2);
  });
});
