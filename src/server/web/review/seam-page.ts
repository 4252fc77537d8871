// One seam for review: the server's grade beside the devices', the decision form and the decisions so far, the
// set-up, each round with its strip chart (limit lines), imperfections and checklist, every reading, the fatigue
// assessment, and the signature of every batch the records came in.
import { describeViewing } from '../../../domain/model/viewing.js';
import { DECISION_OUTCOMES } from '../../../protocol/index.js';
import { html, type Html } from '../html.js';
import { layout } from '../pages.js';
import { OUTCOME_TEXT } from '../../review/decisions.js';
import { currentRound, type SeamDetail } from '../../review/seam-detail.js';
import {
  assessmentSection,
  batchesTable,
  checklistTable,
  decisionsList,
  factsList,
  gradeComparison,
  imperfectionsTable,
  readingsTable,
  roundTitle,
  setupRows,
} from './sections.js';
import { stripSvg } from './strip-svg.js';
import { cautions, demoBadge, utc } from './parts.js';

export function seamLinks(id: string): Html {
  const e = encodeURIComponent(id);
  return html`<p class="links">
    <a href="/supervisor/review/seams/${e}/audit">Audit trail</a> ·
    <a href="/supervisor/review/seams/${e}/export.json" download>Seam with signed batches (JSON)</a> ·
    <a href="/supervisor/review/export/readings.csv?seam=${e}" download>Readings (CSV)</a> ·
    <a href="/supervisor/review/report?seam=${e}">Inspection report (print)</a>
  </p>`;
}

function decisionForm(d: SeamDetail, error: string | null, notice: string | null): Html {
  const round = currentRound(d);
  return html`<section class="panel decide" aria-labelledby="decide-title">
    <h2 id="decide-title">Decision on round ${round}</h2>
    ${notice ? html`<p class="notice" role="status">${notice}</p>` : ''}
    ${error ? html`<p class="error" role="alert">${error}</p>` : ''}
    <form method="post" action="/supervisor/review/seams/${encodeURIComponent(d.id)}/decisions">
      <input type="hidden" name="round" value="${round}" />
      <input type="hidden" name="basedOn" value="${d.latestRecordSeq}" />
      <fieldset>
        <legend>Outcome</legend>
        ${DECISION_OUTCOMES.map(
          (o) =>
            html`<label class="choice"
              ><input type="radio" name="outcome" value="${o}" required /> ${OUTCOME_TEXT[o]}${
                o === 'rework' ? ' (opens a new round on the tablet)' : ''
              }</label
            >`,
        )}
      </fieldset>
      <label
        >Comment (what the inspector is to do; needed unless you accept)
        <textarea name="comment" rows="3" maxlength="2000"></textarea>
      </label>
      <button type="submit">Record the decision</button>
    </form>
    <p class="muted">
      A decision is kept as it is made, signed by the server key, and cannot be changed: a later decision
      supersedes it. Tablets that work on this seam receive it when they next sync.
    </p>
    <h3>Decisions so far</h3>
    ${decisionsList(d.decisions)}
  </section>`;
}

export function seamPage(
  user: string,
  d: SeamDetail,
  messages: { readonly error?: string | null; readonly notice?: string | null } = {},
): string {
  const grade = d.review.grade;
  const seam = d.seam;
  return layout(
    seam?.label ?? d.id,
    html`<p><a href="/supervisor/review">← Review queue</a></p>
      <h1>${seam?.label ?? d.id}${demoBadge(d.namespace)}</h1>
      <p class="kid">${d.id}</p>
      ${seamLinks(d.id)}
      ${d.review.stored ? '' : html`<p class="notice" role="status">Records arrived since the last stored grade: this page shows a grade made now.</p>`}
      <div class="columns">
        ${gradeComparison(d)} ${decisionForm(d, messages.error ?? null, messages.notice ?? null)}
      </div>
      <section class="panel" aria-labelledby="setup-title">
        <h2 id="setup-title">Set-up</h2>
        ${seam ? factsList(setupRows(seam)) : html`<p>No set-up received yet.</p>`}
        ${
          d.assignments.length
            ? html`<h3>Assigned</h3>
                <ul>
                  ${d.assignments.map(
                    (a) =>
                      html`<li>
                        to
                        ${a.inspector !== null ? `inspector ${a.inspector}` : (a.deviceName ?? a.deviceKid ?? '—')}
                        by ${a.assignedBy ?? '—'}, ${utc(a.assignedAt)}${a.note ? ` — ${a.note}` : ''}
                      </li>`,
                  )}
                </ul>`
            : ''
        }
      </section>
      ${d.rounds.map((round) => {
        const g = grade?.rounds.find((r) => r.round === round.number);
        return html`<section class="panel round" aria-labelledby="round-${round.number}">
          <h2 id="round-${round.number}">${roundTitle(round.number, round.kind)}</h2>
          <p>
            Started ${utc(round.startedAt)} (device
            clock)${
              round.examiner
                ? ` by ${round.examiner.name}${round.examiner.qualification ? ` (${round.examiner.qualification})` : ''}`
                : ''
            }${g ? `; ${g.readingCount} current reading(s), ${g.borderlineCount} borderline value(s)` : ''}
          </p>
          <p class="viewing">
            Viewing and lighting:
            ${(() => {
              const v = d.review.folded.viewing.find((x) => x.round === round.number);
              return v
                ? `${describeViewing(v.conditions)} (${utc(v.recordedAt)}, device clock${v.records > 1 ? `; corrected ${v.records - 1} time(s)` : ''})`
                : 'not recorded on the tablet';
            })()}
          </p>
          ${
            g && seam
              ? html`<h3>Readings along the seam</h3>
                  ${stripSvg(g.readings, seam.length, `Round ${round.number}`)}
                  <h3>Imperfections</h3>
                  ${imperfectionsTable(g)}
                  <h3>Visual checklist</h3>
                  ${checklistTable(g.checklist)}`
              : html`<p class="muted">Not graded.</p>`
          }
        </section>`;
      })}
      <section class="panel" aria-labelledby="readings-title">
        <h2 id="readings-title">Every reading (${d.readings.length})</h2>
        <p class="muted">
          Nothing is hidden: a corrected reading stays, marked as superseded, beside the correction that
          replaces it.
        </p>
        ${readingsTable(d.readings)}
      </section>
      ${d.review.assessment ? assessmentSection(d.review.assessment) : ''}
      <section class="panel" aria-labelledby="batches-title">
        <h2 id="batches-title">Signed batches</h2>
        ${batchesTable(d.batches)}
      </section>
      ${cautions()}`,
    user,
    { bodyClass: 'wide' },
  );
}
