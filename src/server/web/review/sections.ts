// Sections of a seam shared by the review page and the printed inspection report: set-up, the server's grade beside
// the devices', imperfections per round, checklist, every reading (corrections shown as superseding), the
// assessment with its caution, each batch's signature and the decisions.
import {
  CHECKLIST_LABEL,
  PARAMETER_NAMES,
  PARAMETERS,
  type ChecklistGrade,
  type ImperfectionSummary,
  type RoundGrade,
  type Seam,
  type SeamAssessment,
} from '../../../domain/index.js';
import { assessmentView } from '../../../app/components/assessment-view.js';
import {
  ANSWER_LABEL,
  fmtMargin,
  fmtNumber,
  fmtToe,
  fmtValue,
  PARAM_LABEL,
  ROUND_KIND_LABEL,
} from '../../../app/components/format.js';
import { setupRows as tabletSetupRows } from '../../../app/components/setup-rows.js';
import { html, type Html } from '../html.js';
import type { BatchCheck, DecisionLine, ReadingLine, SeamDetail } from '../../review/seam-detail.js';
import { level, outcomeBadge, plural, stateText, utc, verdict } from './parts.js';

/** The set-up as the tablet shows it, and what the review adds: when welded, where, and the tags. */
export function setupRows(seam: Seam): [string, string][] {
  const rows = tabletSetupRows(seam);
  if (seam.weldedAt) rows.push(['Welding finished', utc(seam.weldedAt)]);
  if (seam.organisation) rows.push(['Organisation', seam.organisation]);
  if (seam.area) rows.push(['Area', seam.area]);
  if (seam.drawing)
    rows.push(['Drawing', `${seam.drawing}${seam.drawingPosition ? ` / ${seam.drawingPosition}` : ''}`]);
  if (seam.tags?.length) rows.push(['Tags', seam.tags.join(', ')]);
  return rows;
}

export const factsList = (rows: readonly (readonly [string, string])[]): Html =>
  html`<dl class="facts">
    ${rows.map(
      ([k, v]) =>
        html`<div>
          <dt>${k}</dt>
          <dd>${v}</dd>
        </div>`,
    )}
  </dl>`;

/** The server's own grade beside what each device reported; a difference is highlighted. */
export function gradeComparison(d: SeamDetail): Html {
  const s = d.review.summary;
  return html`<section class="panel grades" aria-labelledby="grades-title">
    <h2 id="grades-title">Grade: server and devices</h2>
    <table>
      <thead>
        <tr>
          <th scope="col">Graded by</th>
          <th scope="col">Level met</th>
          <th scope="col">State</th>
          <th scope="col">Readings</th>
          <th scope="col">When</th>
        </tr>
      </thead>
      <tbody>
        <tr>
          <th scope="row">Server (same grading core, from the records it holds)</th>
          <td>${verdict(s)}</td>
          <td>${stateText(s.state)}${s.gradedRound !== null ? `, round ${s.gradedRound}` : ''}</td>
          <td>${s.readingCount}</td>
          <td>${d.serverGrade ? utc(d.serverGrade.gradedAt) : 'now (re-grade pending)'}</td>
        </tr>
        ${d.deviceGrades.map(
          (g) =>
            html`<tr class="${g.levelMet !== s.levelMet ? 'mismatch-row' : ''}">
              <th scope="row">Device ${g.deviceName ?? g.deviceKid} (batch ${g.batchSeq})</th>
              <td>
                ${level(g.levelMet)}${g.levelMet !== s.levelMet ? html` <strong class="mismatch">⚠ differs from the server</strong>` : ''}
              </td>
              <td>${g.state ? stateText(g.state) : '—'}</td>
              <td>${g.readingCount ?? '—'}</td>
              <td>${utc(g.gradedAt)} (device clock)</td>
            </tr>`,
        )}
      </tbody>
    </table>
    ${d.deviceGrades.length ? '' : html`<p class="muted">No device reported its own grade for this seam.</p>`}
    ${
      d.mismatch
        ? html`<p class="mismatch" role="alert">
            ⚠ The newest device grade differs from the server's. The server's grade counts; check the readings
            left out or sent after the device graded.
          </p>`
        : ''
    }
    ${
      s.leftOut.length
        ? html`<h3>Left out of the server's grade</h3>
            <ul>
              ${s.leftOut.map((l) => html`<li><span class="kid">${l.recordId}</span>: ${l.reason}</li>`)}
            </ul>`
        : ''
    }
    ${
      s.unverifiedRows.length
        ? html`<p>
            <span class="mark mark-unverified">unverified</span> limit rows in play:
            ${s.unverifiedRows.join(', ')} (recalled values until a verified table is loaded).
          </p>`
        : ''
    }
    ${
      d.review.grade?.notes.length
        ? html`<ul class="notes">
            ${d.review.grade.notes.map((n) => html`<li>${n}</li>`)}
          </ul>`
        : ''
    }
  </section>`;
}

function governingText(round: RoundGrade, s: ImperfectionSummary): string | null {
  const r = round.readings.find((x) => x.readingId === s.worst.readingId);
  return r?.imperfections.find((g) => g.rowId === s.rowId)?.governing.text ?? null;
}

/** Results per imperfection of a round, with location of the worst reading and the limit row's status. */
export function imperfectionsTable(round: RoundGrade): Html {
  if (!round.imperfections.length)
    return html`<p class="muted">No gauge readings graded in round ${round.round}.</p>`;
  return html`<table class="imperfections">
    <caption>
      Imperfections graded in round ${round.round}, worst reading of each
    </caption>
    <thead>
      <tr>
        <th scope="col">ISO 5817 row</th>
        <th scope="col">ISO 6520-1</th>
        <th scope="col">Imperfection</th>
        <th scope="col">Worst value</th>
        <th scope="col">Location</th>
        <th scope="col">Limit at required level</th>
        <th scope="col">Margin</th>
        <th scope="col">Level met</th>
        <th scope="col">Verdict</th>
      </tr>
    </thead>
    <tbody>
      ${round.imperfections.map((s) => {
        const limit = governingText(round, s);
        return html`<tr class="${s.meetsRequired ? '' : 'row-below'}">
          <td>${s.row}</td>
          <td>${s.refs.join(', ')}</td>
          <th scope="row">
            ${s.title}
            ${s.limitStatus === 'unverified' ? html`<span class="mark mark-unverified">unverified ${s.unverifiedLevels.join(', ')}</span>` : ''}
            ${s.worst.borderline ? html`<span class="mark mark-borderline">≈ borderline</span>` : ''}
          </th>
          <td>${fmtValue(s.worst.measured, s.unit)}</td>
          <td>${fmtNumber(s.worst.position)} mm (${plural(s.readings, 'reading')})</td>
          <td>${s.required}: ${fmtValue(s.worst.governingLimit, s.unit)}${limit ? ` (${limit})` : ''}</td>
          <td>${fmtMargin(s.worst.margin, s.unit)}</td>
          <td>${level(s.levelMet)}</td>
          <td>${s.meetsRequired ? '✔ meets' : '✘ below'} required ${s.required}</td>
        </tr>`;
      })}
    </tbody>
  </table>`;
}

export function checklistTable(c: ChecklistGrade): Html {
  return html`<table class="checklist">
      <thead>
        <tr>
          <th scope="col">Item (ISO 6520-1)</th>
          <th scope="col">Answer</th>
          <th scope="col">Level met</th>
          <th scope="col">Status</th>
        </tr>
      </thead>
      <tbody>
        ${c.items.map(
          (i) =>
            html`<tr class="${i.meetsRequired === false ? 'row-below' : ''}">
              <th scope="row">${CHECKLIST_LABEL[i.item]} (${i.ref})</th>
              <td>
                ${ANSWER_LABEL[i.answer] ?? i.answer}${i.position !== undefined ? ` at ${fmtNumber(i.position)} mm` : ''}
              </td>
              <td>${level(i.levelMet)}</td>
              <td>
                ${i.status === 'unverified' ? html`<span class="mark mark-unverified">unverified</span>` : i.status}
              </td>
            </tr>`,
        )}
      </tbody>
    </table>
    <p>
      ${c.state === 'complete' ? 'Checklist complete.' : `Checklist incomplete: ${c.unanswered.length} item(s) unanswered.`}
      ${c.notAccessible.length ? ` Not accessible: ${c.notAccessible.map((i) => CHECKLIST_LABEL[i]).join(', ')}.` : ''}
    </p>`;
}

const STATUS_TEXT: Record<ReadingLine['status'], string> = {
  current: 'counts',
  superseded: 'superseded',
  withdrawn: 'withdrawn',
  withdrawal: 'withdrawal',
  leftOut: 'left out',
};

function valuesText(line: ReadingLine): string {
  const v = line.reading.values;
  const parts: string[] = [];
  for (const name of PARAMETER_NAMES) {
    const x = v[name];
    if (x !== undefined) parts.push(`${PARAM_LABEL[name] ?? name} ${fmtValue(x, PARAMETERS[name].unit)}`);
  }
  return parts.join('; ') || '—';
}

/** Every reading the server holds, in round and position order: who, when, device, instrument, and status. */
export function readingsTable(lines: readonly ReadingLine[]): Html {
  if (!lines.length) return html`<p class="muted">No readings received.</p>`;
  return html`<table class="readings">
    <thead>
      <tr>
        <th scope="col">Round</th>
        <th scope="col">Position</th>
        <th scope="col">Where</th>
        <th scope="col">Values</th>
        <th scope="col">Instrument</th>
        <th scope="col">Examiner</th>
        <th scope="col">Recorded (device clock)</th>
        <th scope="col">Device</th>
        <th scope="col">Received (server)</th>
        <th scope="col">Status</th>
      </tr>
    </thead>
    <tbody>
      ${lines.map((l) => {
        const r = l.reading;
        const ins = r.instrument;
        const res = [
          ins.resolutionMm !== undefined ? `${fmtNumber(ins.resolutionMm)} mm` : null,
          ins.resolutionDeg !== undefined ? `${fmtNumber(ins.resolutionDeg)}°` : null,
        ].filter(Boolean);
        return html`<tr class="reading-${l.status}" id="reading-${r.id}">
          <td>${r.round}</td>
          <td>
            ${r.start !== undefined && r.end !== undefined ? `${fmtNumber(r.start)}–${fmtNumber(r.end)} mm` : r.position !== undefined ? `${fmtNumber(r.position)} mm` : '—'}
          </td>
          <td>${fmtToe(r.toe, r.side)}${r.sampling === 'targeted' ? ' (targeted)' : ''}</td>
          <td>${r.withdrawn ? 'withdraws the reading it supersedes' : valuesText(l)}</td>
          <td>
            ${ins.id}${res.length ? `, resolution ${res.join(' / ')}` : ''}${ins.calibratedOn ? `, calibrated ${ins.calibratedOn}` : ''}
          </td>
          <td>
            ${r.examiner ? `${r.examiner.name}${r.examiner.qualification ? ` (${r.examiner.qualification})` : ''}` : '—'}
          </td>
          <td>${utc(r.recordedAt)}</td>
          <td>
            ${l.deviceName ?? (l.deviceKid ? html`<span class="kid">${l.deviceKid}</span>` : 'server (demo or set-up)')}
          </td>
          <td>${utc(l.receivedAt)}</td>
          <td>
            <span class="status status-${l.status}">${STATUS_TEXT[l.status]}</span>
            ${l.supersededBy ? html`<br />by <a href="#reading-${l.supersededBy}" class="kid">${l.supersededBy}</a>` : ''}
            ${r.supersedes ? html`<br />replaces <a href="#reading-${r.supersedes}" class="kid">${r.supersedes}</a>` : ''}
            ${l.leftOutReason ? html`<br />${l.leftOutReason}` : ''}
          </td>
        </tr>`;
      })}
    </tbody>
  </table>`;
}

/** km, toe ranking, FAT flag, life, sensitivity and sampling adequacy, with the caution they always carry. */
export function assessmentSection(
  a: SeamAssessment,
  options: { readonly drivers: boolean } = { drivers: true },
): Html {
  const v = assessmentView(a, false);
  return html`<section class="panel assessment" aria-labelledby="assessment-title">
    <h2 id="assessment-title">
      Fatigue assessment${v.round !== null ? `, round ${v.round}` : ''} (indicative)
    </h2>
    <p class="caution-inline" role="note">⚠ ${v.caution}</p>
    <h3>Misalignment (km)</h3>
    <p>${v.km.summary}</p>
    ${factsList(v.km.facts.map((f) => [f.label, f.note ? `${f.value} (${f.note})` : f.value] as const))}
    <h3>Toe ranking</h3>
    ${
      v.toes.rows.length
        ? html`<table>
            <thead>
              <tr>
                <th scope="col">Rank</th>
                <th scope="col">Toe</th>
                <th scope="col">Where</th>
                <th scope="col">Kt,eff</th>
                <th scope="col">Bending</th>
              </tr>
            </thead>
            <tbody>
              ${v.toes.rows.map(
                (t) =>
                  html`<tr>
                    <td>${t.rank}</td>
                    <td>${t.label}</td>
                    <td>${t.where}</td>
                    <td>${t.factor}</td>
                    <td>${t.bending}${t.flags.length ? ` (${t.flags.join('; ')})` : ''}</td>
                  </tr>`,
              )}
            </tbody>
          </table>`
        : html`<p class="muted">No toe ranked.</p>`
    }
    ${v.toes.crackSite ? html`<p>${v.toes.crackSite}</p>` : ''}
    ${v.toes.notRanked.length ? html`<p class="muted">Not ranked: ${v.toes.notRanked.join('; ')}</p>` : ''}
    <h3>Fatigue class</h3>
    <p class="fat fat-${v.fat.flag}"><strong>${v.fat.symbol} ${v.fat.verdict}</strong>: ${v.fat.numbers}.</p>
    <p>${v.fat.chosen}.</p>
    ${v.fat.missing.length ? html`<p class="muted">Missing: ${v.fat.missing.join('; ')}.</p>` : ''}
    <p>${v.fat.effectiveNotch}</p>
    <h3>Life</h3>
    <p>${v.fat.life}${v.fat.lifeCurve ? ` ${v.fat.lifeCurve}.` : ''}</p>
    ${
      options.drivers
        ? html`<h3>${v.drivers.title}</h3>
            ${
              v.drivers.bars.length || v.drivers.toeBars.length
                ? html`<ul>
                    ${[...v.drivers.bars, ...v.drivers.toeBars].map((b) => html`<li>${b.label}: ${b.text}</li>`)}
                  </ul>`
                : html`<p class="muted">No input changes the result within its uncertainty.</p>`
            }`
        : ''
    }
    <h3>Sampling adequacy</h3>
    <p class="muted">${v.sampling.caveat}</p>
    ${
      v.sampling.rows.length
        ? html`<ul>
            ${v.sampling.rows.map((r) => html`<li>${r.settled ? '● ' : '○ '}${r.advice}</li>`)}
          </ul>`
        : html`<p class="muted">No at-pitch readings to judge.</p>`
    }
    ${
      v.assumptions.length
        ? html`<details>
            <summary>Assumptions</summary>
            <ul>
              ${v.assumptions.map((x) => html`<li>${x}</li>`)}
            </ul>
          </details>`
        : ''
    }
  </section>`;
}

/** Each batch that brought records of the seam, its signature checked again now against the enrolled key. */
export function batchesTable(batches: readonly BatchCheck[]): Html {
  if (!batches.length)
    return html`<p class="muted">
      No signed batch: the seam's records were made on the server (demo or set-up).
    </p>`;
  return html`<table class="batches">
    <thead>
      <tr>
        <th scope="col">Batch</th>
        <th scope="col">Signature</th>
        <th scope="col">Key id (kid)</th>
        <th scope="col">Enrolled device</th>
        <th scope="col">Device batch no.</th>
        <th scope="col">Records</th>
        <th scope="col">Received (server)</th>
      </tr>
    </thead>
    <tbody>
      ${batches.map(
        (b) =>
          html`<tr class="${b.verified ? '' : 'row-below'}">
            <td class="kid">${b.batchId}</td>
            <td>
              ${b.verified ? html`<span class="sig-ok">✔ verified</span>` : html`<span class="sig-bad">✘ not verified: ${b.problem}</span>`}
            </td>
            <td class="kid">${b.kid ?? '—'}</td>
            <td>
              ${b.deviceName ?? '—'}${b.deviceRevokedAt ? html` <span class="badge revoked">revoked ${utc(b.deviceRevokedAt)}</span>` : ''}
            </td>
            <td>${b.deviceSeq}</td>
            <td>${b.recordCount}</td>
            <td>${utc(b.receivedAt)}</td>
          </tr>`,
      )}
    </tbody>
  </table>`;
}

export function decisionsList(decisions: readonly DecisionLine[]): Html {
  if (!decisions.length) return html`<p class="muted">No decision yet.</p>`;
  return html`<ol class="decisions">
    ${decisions.map(
      (d) =>
        html`<li data-decision="${d.id}">
          ${outcomeBadge(d.outcome)} on round ${d.round} by <strong>${d.decidedByName}</strong>,
          ${utc(d.decidedAt)} ${d.comment ? html`<blockquote>${d.comment}</blockquote>` : ''}
          <span class="muted"
            >Server grade then: ${level(d.serverLevelMet)}; seen records up to #${d.basedOn};
            ${d.verified ? '✔ signature verified' : '✘ signature does not verify'} (server key).</span
          >
        </li>`,
    )}
  </ol>`;
}

export const roundTitle = (n: number, kind: string): string =>
  `Round ${n}: ${ROUND_KIND_LABEL[kind] ?? kind}`;
