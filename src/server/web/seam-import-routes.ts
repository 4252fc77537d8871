// The seam-list import under /supervisor/seams/import: the list as an uploaded file or pasted text, its columns
// mapped, every row checked and shown, then kept — all rows, or only the sound ones when the supervisor ticks that
// decision. A list with any problem is never kept in part by default.
import { Hono, type Context } from 'hono';
import { binaryAt, ByteDecoder } from '../../domain/import/text-decoding.js';
import { requireRole } from '../auth/session.js';
import type { AppDeps, AppEnv } from '../deps.js';
import { readFormData } from '../http/body.js';
import { HttpError } from '../http/errors.js';
import type { Account } from '../storage/types.js';
import { guessMapping, parseSeamList, rowValues, SEAM_FIELDS, type SeamField } from '../seams/seam-fields.js';
import { checkRows, createSeams, type AssignTo, type RowProblem } from '../seams/service.js';
import { mappingPage, previewPage, type ListState } from './seam-import-pages.js';

/** A seam list may be long: its forms take more than the usual cap. */
export const LIST_BYTES = 4 * 1024 * 1024;

const field = (form: FormData, name: string): string => {
  const value = form.get(name);
  return typeof value === 'string' ? value : '';
};

/** The list's text from an uploaded file: its encoding told by its bytes; a file that is not text is refused. */
function fileText(bytes: Uint8Array): string {
  const decoder = new ByteDecoder();
  const text = decoder.push(bytes) + decoder.end();
  if (binaryAt(text.slice(0, 65_536)) >= 0)
    throw new HttpError(400, 'invalid', 'the file is not a text (CSV) file: nothing was read from it');
  return text;
}

async function listState(form: FormData): Promise<ListState> {
  const file = form.get('file');
  const upload = file !== null && typeof file !== 'string' && file.size > 0 ? file : null;
  const mapping: Partial<Record<SeamField, string>> = {};
  for (const f of SEAM_FIELDS) {
    const column = field(form, `map.${f.key}`);
    if (column) mapping[f.key] = column;
  }
  return {
    csv: upload ? fileText(new Uint8Array(await upload.arrayBuffer())) : field(form, 'csv'),
    fileName: upload ? upload.name.slice(0, 200) : field(form, 'fileName').slice(0, 200),
    mapping,
    device: field(form, 'device'),
    inspector: field(form, 'inspector'),
    note: field(form, 'note').slice(0, 500),
  };
}

function assignTo(state: ListState): AssignTo | null {
  if (state.device && state.inspector)
    throw new HttpError(400, 'invalid', 'Choose a tablet or an inspector, not both.');
  const note = state.note ? { note: state.note } : {};
  if (state.device) return { deviceKid: state.device, ...note };
  if (state.inspector) return { inspector: state.inspector, ...note };
  return null;
}

/** Problems of the list as a whole: the file, the header, and required fields without a column. */
function listProblems(
  list: ReturnType<typeof parseSeamList>,
  mapping: ListState['mapping'] | null,
): RowProblem[] {
  const problems: RowProblem[] = [...list.problems];
  if (!list.headers.length || !list.rows.length)
    problems.push({ line: 0, message: 'the list needs a header row and at least one seam row' });
  if (mapping)
    for (const f of SEAM_FIELDS)
      if (f.required && !(mapping[f.key] && list.headers.includes(mapping[f.key] ?? '')))
        problems.push({ line: 0, message: `choose the column that holds “${f.label}”` });
  return problems;
}

export function seamImportRoutes(deps: AppDeps): Hono<AppEnv> {
  const app = new Hono<AppEnv>();
  app.use('*', requireRole('supervisor', 'page'));
  const me = (c: Context<AppEnv>): Account => c.get('account') as Account;
  const page = (c: Context, body: string, status: 200 | 400) => {
    c.header('Cache-Control', 'no-store');
    return c.html(body, status);
  };

  const mapping = async (c: Context<AppEnv>, state: ListState, extra: RowProblem[] = []) => {
    const list = parseSeamList(state.csv);
    const problems = [...extra, ...listProblems(list, null)];
    const [devices, inspectors] = await Promise.all([
      deps.storage.listDevices(),
      deps.storage.listAccounts('inspector'),
    ]);
    const known = Object.keys(state.mapping).length > 0;
    return page(
      c,
      mappingPage({
        user: me(c).username,
        state: { ...state, mapping: known ? state.mapping : guessMapping(list.headers) },
        headers: list.headers,
        rows: list.rows,
        lines: list.lines,
        devices,
        inspectors,
        problems,
      }),
      problems.length ? 400 : 200,
    );
  };

  /** Checks every row under the mapping; keeps nothing. */
  const check = async (state: ListState) => {
    const list = parseSeamList(state.csv);
    const problems = listProblems(list, state.mapping);
    if (problems.length) return { problems, seams: [], results: [] };
    const checked = await checkRows(
      deps,
      list.rows.map((r) => rowValues(r, state.mapping)),
      list.lines,
    );
    return { problems, seams: checked.seams, results: checked.results };
  };

  app.post('/map', async (c) => {
    const form = await readFormData(c, LIST_BYTES);
    let state: ListState;
    try {
      state = await listState(form);
    } catch (error) {
      if (!(error instanceof HttpError) || error.status >= 500) throw error;
      const empty = { csv: '', fileName: '', mapping: {}, device: '', inspector: '', note: '' };
      return mapping(c, empty, [{ line: 0, message: error.message }]);
    }
    return mapping(c, state);
  });

  app.post('/check', async (c) => {
    const state = await listState(await readFormData(c, LIST_BYTES));
    const { problems, results } = await check(state);
    const refused = problems.length > 0;
    return page(c, previewPage({ user: me(c).username, state, results, problems }), refused ? 400 : 200);
  });

  app.post('/', async (c) => {
    const form = await readFormData(c, LIST_BYTES);
    const state = await listState(form);
    const { problems, seams, results } = await check(state);
    const bad = results.filter((r) => r.problem !== undefined);
    // Rows with problems are left out only by the supervisor's explicit decision, never by default.
    const soundOnly = field(form, 'soundOnly') === 'yes';
    if (problems.length || !seams.length || (bad.length && !soundOnly))
      return page(c, previewPage({ user: me(c).username, state, results, problems, refused: true }), 400);
    let target: AssignTo | null;
    try {
      target = assignTo(state);
      await createSeams(deps, me(c), seams, target);
    } catch (error) {
      if (!(error instanceof HttpError) || error.status >= 500) throw error;
      return page(
        c,
        previewPage({
          user: me(c).username,
          state,
          results,
          problems: [{ line: 0, message: error.message }],
          refused: true,
        }),
        400,
      );
    }
    // The Seams page lists seams from their review facts: let the new ones show at once.
    await deps.regrader.idle();
    await deps.reviewIndexer.idle();
    const left = bad.length
      ? ` ${bad.length} row${bad.length === 1 ? '' : 's'} left out (line${bad.length === 1 ? '' : 's'} ${bad.map((r) => r.line).join(', ')}).`
      : '';
    const notice = `${seams.length} seam${seams.length === 1 ? '' : 's'} imported${target ? ' and assigned' : ''}.${left}`;
    deps.log.info('seamListImported', { by: me(c).username, kept: seams.length, leftOut: bad.length });
    return c.redirect(`/supervisor/seams?notice=${encodeURIComponent(notice)}`, 303);
  });

  return app;
}
