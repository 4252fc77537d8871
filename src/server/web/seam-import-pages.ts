// The seam-list import's steps after the file is chosen: map the columns (with the first rows shown), then check
// every row and show each with its line and result before anything is kept. What the supervisor chose so far
// travels in hidden fields, so each step posts the whole list again and nothing is held on the server meanwhile.
import type { Account, Device } from '../storage/types.js';
import { SEAM_FIELDS, type SeamField } from '../seams/seam-fields.js';
import type { RowProblem, RowResult } from '../seams/service.js';
import { html, type Html } from './html.js';
import { layout } from './pages.js';
import { assignChoice, problemList } from './seams-page.js';

/** What the import's forms carry from step to step. */
export interface ListState {
  readonly csv: string;
  /** The name of the file the list came from, shown back to the supervisor. */
  readonly fileName: string;
  readonly mapping: Partial<Record<SeamField, string>>;
  readonly device: string;
  readonly inspector: string;
  readonly note: string;
}

const hiddenState = (state: ListState, withMapping: boolean): Html =>
  html`<textarea name="csv" hidden>${state.csv}</textarea>
    <input type="hidden" name="fileName" value="${state.fileName}" />
    ${
      withMapping
        ? SEAM_FIELDS.map((f) =>
            state.mapping[f.key]
              ? html`<input type="hidden" name="map.${f.key}" value="${state.mapping[f.key]}" />`
              : '',
          )
        : ''
    }
    <input type="hidden" name="device" value="${state.device}" />
    <input type="hidden" name="inspector" value="${state.inspector}" />
    <input type="hidden" name="note" value="${state.note}" />`;

const back = html`<p><a href="/supervisor/seams">← Seams</a></p>`;

export function mappingPage(input: {
  readonly user: string;
  readonly state: ListState;
  readonly headers: readonly string[];
  readonly rows: readonly Record<string, string>[];
  readonly lines: readonly number[];
  readonly devices: readonly Device[];
  readonly inspectors: readonly Account[];
  readonly problems?: readonly RowProblem[];
}): string {
  const preview = input.rows.slice(0, 5);
  const rowsRead = `${input.rows.length} row${input.rows.length === 1 ? '' : 's'} read.`;
  const { state } = input;
  return layout(
    'Map the seam list',
    html`${back}
      <h1>Map the seam list's columns</h1>
      ${problemList(input.problems ?? [])}
      <p>${state.fileName ? html`<strong>${state.fileName}</strong>: ` : ''}${rowsRead} The first rows:</p>
      <table>
        <thead>
          <tr>
            <th scope="col">Line</th>
            ${input.headers.map((h) => html`<th scope="col">${h}</th>`)}
          </tr>
        </thead>
        <tbody>
          ${preview.map(
            (r, i) =>
              html`<tr>
                <td>${input.lines[i] ?? ''}</td>
                ${input.headers.map((h) => html`<td>${r[h] ?? ''}</td>`)}
              </tr>`,
          )}
        </tbody>
      </table>
      <form method="post" action="/supervisor/seams/import/check">
        <textarea name="csv" hidden>${state.csv}</textarea>
        <input type="hidden" name="fileName" value="${state.fileName}" />
        <div class="columns">
          ${SEAM_FIELDS.map(
            (f) =>
              html`<label
                >${f.label}${f.required ? ' *' : ''}
                <select name="map.${f.key}">
                  <option value="">${f.required ? 'choose a column' : 'not in the list'}</option>
                  ${input.headers.map(
                    (h) =>
                      html`<option value="${h}" ${state.mapping[f.key] === h ? html`selected` : ''}>
                        ${h}
                      </option>`,
                  )}
                </select></label
              >`,
          )}
        </div>
        ${assignChoice(input.devices, input.inspectors, 'Assign every imported seam to (optional)')}
        <label
          >Note for the inspector <input type="text" name="note" maxlength="500" value="${state.note}"
        /></label>
        <button type="submit">Next: check every row</button>
      </form>`,
    input.user,
    { bodyClass: 'wide' },
  );
}

const cell = (value: string | number | undefined): string => (value === undefined ? '—' : String(value));

function resultRow(r: RowResult): Html {
  if (r.problem !== undefined)
    return html`<tr class="row-bad">
      <td>${r.line}</td>
      <td><span class="error">✗ not imported</span></td>
      <td colspan="6">${r.problem}</td>
    </tr>`;
  const s = r.seam;
  return html`<tr>
    <td>${r.line}</td>
    <td><span class="verdict-ok">✓ sound</span></td>
    <td>${s.label}<br /><span class="kid">${s.id}</span></td>
    <td>${s.joint.type}</td>
    <td>${cell(s.plate1.thickness)} / ${cell(s.plate2.thickness)}</td>
    <td>${cell(s.length)}</td>
    <td>${s.material.name}</td>
    <td>${s.acceptance.level}</td>
  </tr>`;
}

/**
 * Every row as checked. With no problem, one button keeps them all; with problems nothing has been kept, and the
 * supervisor may go back to the mapping or decide, by ticking a box, to keep only the sound rows.
 */
export function previewPage(input: {
  readonly user: string;
  readonly state: ListState;
  readonly results: readonly RowResult[];
  /** Problems of the list as a whole (a column not chosen, a malformed file). */
  readonly problems: readonly RowProblem[];
  /** The import itself was refused (rather than only checked). */
  readonly refused?: boolean;
}): string {
  const { state, results } = input;
  const bad = results.filter((r) => r.problem !== undefined);
  const sound = results.length - bad.length;
  const whole = input.problems.length > 0;
  const summary = `${results.length} row${results.length === 1 ? '' : 's'}: ${sound} sound, ${bad.length} with a problem.`;
  const target = state.device ? 'the tablet chosen' : state.inspector ? `inspector ${state.inspector}` : null;
  return layout(
    'Check the seam list',
    html`${back}
      <h1>Check the seam list</h1>
      ${
        input.refused || whole
          ? problemList([...input.problems, ...bad.map((r) => ({ line: r.line, message: r.problem ?? '' }))])
          : ''
      }
      <p role="status">
        ${state.fileName ? html`<strong>${state.fileName}</strong>: ` : ''}${summary} Nothing has been kept
        yet.
      </p>
      <table class="import-check">
        <thead>
          <tr>
            <th scope="col">Line</th>
            <th scope="col">Result</th>
            <th scope="col">Seam</th>
            <th scope="col">Joint</th>
            <th scope="col">t1 / t2 (mm)</th>
            <th scope="col">Length (mm)</th>
            <th scope="col">Material</th>
            <th scope="col">Level</th>
          </tr>
        </thead>
        <tbody>
          ${results.map(resultRow)}
        </tbody>
      </table>
      <form method="post" action="/supervisor/seams/import/map">
        ${hiddenState(state, true)}
        <button type="submit">Back: change the mapping</button>
      </form>
      ${
        !whole && sound > 0 && bad.length === 0
          ? html`<form method="post" action="/supervisor/seams/import">
              ${hiddenState(state, true)}
              <button type="submit">
                Import the ${sound}
                seam${sound === 1 ? '' : 's'}${target ? ` and assign them to ${target}` : ''}
              </button>
            </form>`
          : ''
      }
      ${
        !whole && sound > 0 && bad.length > 0
          ? html`<form method="post" action="/supervisor/seams/import">
              ${hiddenState(state, true)}
              <label
                ><input type="checkbox" name="soundOnly" value="yes" required /> Leave out the ${bad.length}
                row${bad.length === 1 ? '' : 's'} with a problem (lines ${bad.map((r) => r.line).join(', ')})
                and import only the ${sound} sound row${sound === 1 ? '' : 's'}</label
              >
              <button type="submit">Import only the sound rows</button>
            </form>`
          : ''
      }`,
    input.user,
    { bodyClass: 'wide' },
  );
}
