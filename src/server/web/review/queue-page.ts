// The review queue: synced seams with the filters a supervisor uses (flags with their counts, welder, procedure,
// drawing, area, device, inspector, inspection days, text), sortable columns and pages of 50, so a yard of
// thousands of seams renders one page at a time. A GET form: filters, sorting and paging are plain links.
import { html, type Html } from '../html.js';
import { layout } from '../pages.js';
import { queryParams } from '../../review/query.js';
import type {
  Choice,
  ReviewChoices,
  ReviewFlag,
  ReviewQuery,
  ReviewQueuePage,
  ReviewQueueRow,
  ReviewSort,
} from '../../storage/types.js';
import { demoBadge, level, outcomeBadge, plural, utc, verdict } from './parts.js';

export const FLAG_TEXT: Record<ReviewFlag, string> = {
  belowRequired: 'Below the required level',
  fatBelow: 'Fatigue class below the required FAT',
  samplingShort: 'Sampling not adequate',
  borderline: 'Borderline readings',
  unreviewed: 'Not yet reviewed',
};

const FAT_TEXT: Record<string, string> = {
  meets: 'meets',
  below: '✘ below',
  notAssessable: 'not assessable',
};

function select(name: string, label: string, choices: readonly Choice[], value: string | null): Html {
  return html`<label class="filter"
    >${label}
    <select name="${name}">
      <option value="">any</option>
      ${choices.map(
        (c) =>
          html`<option value="${c.value}" ${c.value === value ? html`selected` : ''}>
            ${c.label} (${c.count})
          </option>`,
      )}
    </select></label
  >`;
}

function sortLink(q: ReviewQuery, key: ReviewSort, label: string): Html {
  const active = q.sort === key;
  const descending = active ? !q.descending : false;
  const href = `/supervisor/review?${queryParams(q, { sort: key, descending, offset: 0 }).toString()}`;
  const mark = active ? (q.descending ? ' ▼' : ' ▲') : '';
  return html`<th scope="col" ${active ? html`aria-sort="${q.descending ? 'descending' : 'ascending'}"` : ''}>
    <a href="${href}">${label}${mark}</a>
  </th>`;
}

function row(r: ReviewQueueRow): Html {
  const href = `/supervisor/review/seams/${encodeURIComponent(r.seamId)}`;
  return html`<tr class="${r.meetsRequired === false ? 'row-below' : ''}" data-seam="${r.seamId}">
    <td>
      <a href="${href}">${r.label}</a>${demoBadge(r.namespace)}<br /><span class="kid">${r.seamId}</span>
      ${r.tags.length ? html`<br /><span class="muted">Tags: ${r.tags.join(', ')}</span>` : ''}
    </td>
    <td>
      ${verdict(r)}
      ${
        r.gradeMismatch
          ? html`<br /><span class="mismatch">⚠ device said ${level(r.deviceLevelMet)}</span>`
          : ''
      }
      ${r.unverifiedRows ? html`<br /><span class="muted">${plural(r.unverifiedRows, 'unverified row')}</span>` : ''}
    </td>
    <td>${r.borderlineCount ? html`<span class="flagged">◆ ${r.borderlineCount}</span>` : '0'}</td>
    <td>${r.fatFlag ? FAT_TEXT[r.fatFlag] : '—'}</td>
    <td>
      ${r.samplingAdequate === null ? '—' : r.samplingAdequate ? 'adequate' : html`<span class="flagged">✘ not adequate</span>`}
    </td>
    <td>${r.welder ?? '—'}</td>
    <td>${r.procedure ?? '—'}</td>
    <td>${r.drawing ?? '—'}${r.area ? html`<br /><span class="muted">${r.area}</span>` : ''}</td>
    <td>
      ${r.inspectedLast ?? '—'}<br /><span class="muted"
        >round ${r.latestRound ?? '—'}, ${plural(r.readingCount, 'reading')}</span
      >
    </td>
    <td>
      ${
        r.decision
          ? html`${outcomeBadge(r.decision.outcome)}<br /><span class="muted"
                >${r.decision.decidedByName}, ${utc(r.decision.decidedAt)}</span
              >`
          : ''
      }
      ${
        r.basedOn > 0 && !r.reviewed
          ? html`<br /><span class="unreviewed"
                >● ${r.decision ? 'new records since' : 'not yet reviewed'}</span
              >`
          : ''
      }
    </td>
  </tr>`;
}

export function queuePage(input: {
  readonly user: string;
  readonly query: ReviewQuery;
  readonly page: ReviewQueuePage;
  readonly choices: ReviewChoices;
  readonly pending: number;
}): string {
  const { query: q, page, choices } = input;
  const pageNo = Math.floor(q.offset / q.limit) + 1;
  const pages = Math.max(1, Math.ceil(page.total / q.limit));
  const first = page.total ? q.offset + 1 : 0;
  const last = Math.min(q.offset + q.limit, page.total);
  const params = queryParams(q, { offset: 0 });
  const link = (p: number) =>
    `/supervisor/review?${queryParams(q, { offset: (p - 1) * q.limit }).toString()}`;
  return layout(
    'Review',
    html`<h1>Review queue</h1>
      ${
        input.pending
          ? html`<p class="notice" role="status">
              ${plural(input.pending, 'seam')} received lately ${input.pending === 1 ? 'is' : 'are'} being
              assessed; reload in a moment to see ${input.pending === 1 ? 'it' : 'them'} up to date.
            </p>`
          : ''
      }
      <form method="get" action="/supervisor/review" class="filters panel" aria-label="Filters">
        <fieldset>
          <legend>Show seams that are</legend>
          ${(Object.keys(FLAG_TEXT) as ReviewFlag[]).map(
            (f) =>
              html`<label class="flag"
                ><input
                  type="checkbox"
                  name="flag"
                  value="${f}"
                  ${q.flags.includes(f) ? html`checked` : ''}
                />
                ${FLAG_TEXT[f]} <span class="count" data-flag="${f}">(${page.counts[f]})</span></label
              >`,
          )}
        </fieldset>
        <div class="filter-row">
          ${select('welder', 'Welder', choices.welders, q.welder)}
          ${select('procedure', 'Procedure (WPS)', choices.procedures, q.procedure)}
          ${select('drawing', 'Drawing', choices.drawings, q.drawing)}
          ${select('area', 'Area', choices.areas, q.area)}
          ${select('device', 'Device', choices.devices, q.deviceKid)}
          ${select('inspector', 'Inspector', choices.inspectors, q.inspector)}
        </div>
        <div class="filter-row">
          <label class="filter"
            >Inspected from <input type="date" name="from" value="${q.from ?? ''}"
          /></label>
          <label class="filter">to <input type="date" name="to" value="${q.to ?? ''}" /></label>
          <label class="filter"
            >Label, id or tag <input type="search" name="q" value="${q.text ?? ''}" maxlength="200"
          /></label>
          <input type="hidden" name="sort" value="${q.sort}" />
          ${q.descending ? html`<input type="hidden" name="dir" value="desc" />` : ''}
          <button type="submit">Apply</button>
          <a href="/supervisor/review">Clear</a>
        </div>
      </form>
      <p class="summary" role="status">
        <strong class="total">${page.total}</strong> matching
        ${page.total === 1 ? 'seam' : 'seams'}${q.flags.length ? html` of ${page.scope} in the selection` : ''};
        showing ${first}–${last}. Counts beside each flag are within the welder, procedure, drawing, area,
        device, inspector, day and text choices.
      </p>
      <p class="exports">
        Export this selection:
        <a href="/supervisor/review/export/seams.csv?${params.toString()}" download>seam summaries (CSV)</a> ·
        <a href="/supervisor/review/export/readings.csv?${params.toString()}" download>readings (CSV)</a> ·
        <a href="/supervisor/review/report?${params.toString()}">inspection reports (print)</a>
      </p>
      <table class="queue">
        <thead>
          <tr>
            ${sortLink(q, 'label', 'Seam')} ${sortLink(q, 'level', 'Server grade')}
            ${sortLink(q, 'borderline', 'Borderline')}
            <th scope="col">FAT flag</th>
            <th scope="col">Sampling</th>
            ${sortLink(q, 'welder', 'Welder')} ${sortLink(q, 'procedure', 'WPS')}
            ${sortLink(q, 'drawing', 'Drawing / area')} ${sortLink(q, 'inspected', 'Inspected')}
            ${sortLink(q, 'decision', 'Decision')}
          </tr>
        </thead>
        <tbody>
          ${
            page.rows.length
              ? page.rows.map(row)
              : html`<tr>
                  <td colspan="10">No seam matches these filters.</td>
                </tr>`
          }
        </tbody>
      </table>
      <nav class="pages" aria-label="Pages">
        ${pageNo > 1 ? html`<a href="${link(pageNo - 1)}" rel="prev">← Previous</a>` : ''}
        <span>Page ${pageNo} of ${pages}</span>
        ${pageNo < pages ? html`<a href="${link(pageNo + 1)}" rel="next">Next →</a>` : ''}
      </nav>`,
    input.user,
    { bodyClass: 'wide' },
  );
}
