// The Seams page: set up a seam, import a seam list (CSV with a column mapping), and assign seams to tablets, which
// receive them, signed by the server key, on their next sync.
import type { Account, Device, ReviewQueueRow } from '../storage/types.js';
import { SEAM_FIELDS } from '../seams/seam-fields.js';
import type { RowProblem } from '../seams/service.js';
import { html, type Html } from './html.js';
import { inspectorSelect, layout } from './pages.js';
import { demoBadge, level } from './review/parts.js';

const deviceSelect = (devices: readonly Device[]): Html =>
  html`<select name="device">
    <option value="">no tablet</option>
    ${devices
      .filter((d) => d.revokedAt === null)
      .map((d) => html`<option value="${d.kid}">${d.name}</option>`)}
  </select>`;

/** The tablet and inspector choices of an assignment: one or the other. */
export const assignChoice = (
  devices: readonly Device[],
  inspectors: readonly Account[],
  what: string,
): Html =>
  html`<fieldset class="assign-to">
    <legend>${what}</legend>
    <label>Tablet ${deviceSelect(devices)}</label>
    <label>or inspector ${inspectorSelect(inspectors, 'inspector', null, 'no inspector')}</label>
  </fieldset>`;

export const problemList = (problems: readonly RowProblem[]): Html =>
  problems.length
    ? html`<div class="error" role="alert">
        <p>Nothing was kept. Put these right and try again:</p>
        <ul>
          ${problems.map((p) => html`<li>${p.line ? `Line ${p.line}: ` : ''}${p.message}</li>`)}
        </ul>
      </div>`
    : html``;

export function seamsPage(input: {
  readonly user: string;
  readonly seams: readonly ReviewQueueRow[];
  readonly total: number;
  readonly devices: readonly Device[];
  readonly inspectors: readonly Account[];
  readonly notice?: string | null;
  readonly problems?: readonly RowProblem[];
}): string {
  return layout(
    'Seams',
    html`<h1>Seams</h1>
      ${input.notice ? html`<p class="notice" role="status">${input.notice}</p>` : ''}
      ${problemList(input.problems ?? [])}
      <section class="panel" aria-labelledby="assign-title">
        <h2 id="assign-title">Assign seams to a tablet or an inspector</h2>
        <p class="muted">
          Seams assigned to an inspector reach every tablet that works for that inspector (see Devices).
        </p>
        <form method="post" action="/supervisor/seams/assign">
          <table>
            <thead>
              <tr>
                <th scope="col">Assign</th>
                <th scope="col">Seam</th>
                <th scope="col">Drawing</th>
                <th scope="col">Server grade</th>
              </tr>
            </thead>
            <tbody>
              ${
                input.seams.length
                  ? input.seams.map(
                      (s) =>
                        html`<tr>
                          <td>
                            <input
                              type="checkbox"
                              name="seam"
                              value="${s.seamId}"
                              aria-label="Assign ${s.label}"
                            />
                          </td>
                          <td>
                            <a href="/supervisor/review/seams/${encodeURIComponent(s.seamId)}">${s.label}</a
                            >${demoBadge(s.namespace)}<br /><span class="kid">${s.seamId}</span>
                          </td>
                          <td>${s.drawing ?? '—'}</td>
                          <td>${s.levelMet ? level(s.levelMet) : s.state}</td>
                        </tr>`,
                    )
                  : html`<tr>
                      <td colspan="4">No seam yet.</td>
                    </tr>`
              }
            </tbody>
          </table>
          ${
            input.total > input.seams.length
              ? html`<p class="muted">The first ${input.seams.length} of ${input.total} seams by label.</p>`
              : ''
          }
          ${assignChoice(input.devices, input.inspectors, 'Assign the ticked seams to')}
          <label>Note for the inspector <input type="text" name="note" maxlength="500" /></label>
          <button type="submit">Assign</button>
          <button type="submit" formaction="/supervisor/seams/tags" formmethod="get" class="secondary">
            Print the tag sheet of the ticked seams (or of those assigned to the tablet or inspector chosen)
          </button>
        </form>
      </section>
      <section class="panel" aria-labelledby="new-title">
        <h2 id="new-title">Set up a seam</h2>
        <form method="post" action="/supervisor/seams" class="seam-form">
          <div class="columns">
            ${SEAM_FIELDS.map(
              (f) =>
                html`<label
                  >${f.label}${f.required ? ' *' : ''}
                  <input type="text" name="${f.key}" ${f.required ? html`required` : ''} maxlength="200"
                /></label>`,
            )}
          </div>
          ${assignChoice(input.devices, input.inspectors, 'Assign it to (optional)')}
          <button type="submit">Set up the seam</button>
        </form>
      </section>
      <section class="panel" aria-labelledby="import-title">
        <h2 id="import-title">Import a seam list (CSV)</h2>
        <p>
          Choose a CSV file, or paste the list, with a header row. The next steps map its columns to the
          seam's fields and check every row, naming the line and the reason of each problem, before anything
          is kept.
        </p>
        <form method="post" action="/supervisor/seams/import/map" enctype="multipart/form-data">
          <label
            >Seam list file (CSV) <input type="file" name="file" accept=".csv,.txt,text/csv,text/plain"
          /></label>
          <label>or paste it here <textarea name="csv" rows="6"></textarea></label>
          <button type="submit">Next: map the columns</button>
        </form>
      </section>`,
    input.user,
    { bodyClass: 'wide' },
  );
}
