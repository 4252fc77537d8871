// The printable inspection report, one per seam (a selection prints one after another, each from a new page),
// laid out for A4 by the print rules of the stylesheet ("Page x of y" in the page margin).
//
// Where each item comes from (shown on the report beside each heading as well):
//  - ISO 17637 (visual testing of fusion welds), its test-report clause, from memory: organisation, the object
//    examined and its drawing, joint type, material and thickness, welding process, acceptance criteria, extent
//    of examination, viewing and lighting conditions with the aids used, the results against the acceptance
//    criteria with the location of each imperfection, the examiner's name, the date, and a reference to the
//    standard.
//  - ISO 5817 / ISO 6520-1: the quality levels, the rows and the reference numbers of the imperfections.
//  - Common practice (document control and traceability, not a clause of those standards): report number and
//    revision, page x of y, the examiner's qualification, instrument resolution and calibration date, the visual
//    checklist, the reviewer's decision with date, both device and server times.
//  - Beadbook's own rules: rows that rest on recalled values are marked unverified; the safety caution.
import { DECISION_OUTCOMES } from '../../../protocol/index.js';
import { describeViewing } from '../../../domain/model/viewing.js';
import { fmtNumber } from '../../../app/components/format.js';
import { html, type Html } from '../html.js';
import { layout } from '../pages.js';
import type { SeamDetail } from '../../review/seam-detail.js';
import { OUTCOME_TEXT } from '../../review/decisions.js';
import { assessmentSection, checklistTable, factsList, imperfectionsTable, roundTitle } from './sections.js';
import { cautions, level, utc, verdict } from './parts.js';

const source = (text: string): Html => html`<span class="source">[${text}]</span>`;

const ISO17637 = 'ISO 17637, test report, from memory';
const COMMON = 'common practice';

function instruments(d: SeamDetail): string[] {
  const seen = new Map<string, string>();
  for (const { reading: r } of d.readings) {
    const i = r.instrument;
    if (seen.has(i.id)) continue;
    const res = [
      i.resolutionMm !== undefined ? `${fmtNumber(i.resolutionMm)} mm` : null,
      i.resolutionDeg !== undefined ? `${fmtNumber(i.resolutionDeg)}°` : null,
    ].filter(Boolean);
    seen.set(
      i.id,
      `${i.id}${i.kind ? ` (${i.kind})` : ''}: resolution ${res.length ? res.join(' / ') : 'not recorded'}, calibrated ${i.calibratedOn ?? 'date not recorded'}`,
    );
  }
  return [...seen.values()];
}

function examiners(d: SeamDetail): string[] {
  const names = new Map<string, string>();
  const add = (e: { name: string; qualification?: string | undefined } | undefined) => {
    if (e && !names.has(e.name))
      names.set(e.name, e.qualification ? `${e.name} (${e.qualification})` : e.name);
  };
  for (const r of d.rounds) add(r.examiner);
  for (const { reading } of d.readings) add(reading.examiner);
  return [...names.values()];
}

/** Each round's conditions as the inspector recorded them; a round without them leaves blanks to fill in. */
function viewingList(d: SeamDetail): Html {
  const byRound = new Map(d.review.folded.viewing.map((v) => [v.round, v]));
  if (!d.rounds.length) return html`<p>No round received.</p>`;
  return html`<ul class="viewing">
    ${d.rounds.map((r) => {
      const v = byRound.get(r.number);
      return v
        ? html`<li>
            ${roundTitle(r.number, r.kind)}: ${describeViewing(v.conditions)}. Recorded ${utc(v.recordedAt)}
            (device clock)${v.records > 1 ? `, corrected ${v.records - 1} time(s)` : ''}.
          </li>`
        : html`<li>
            ${roundTitle(r.number, r.kind)}: not recorded on the tablet — state them here. Viewing direct /
            remote; illuminance ______ lx; distance ______ mm; angle ______°; aids: ______.
          </li>`;
    })}
  </ul>`;
}

function oneReport(d: SeamDetail, printedAt: string): Html {
  const seam = d.seam;
  const grade = d.review.grade;
  const s = d.review.summary;
  const decision = d.decisions[d.decisions.length - 1] ?? null;
  const graded =
    grade?.rounds.find((r) => r.round === grade.gradedRound) ?? grade?.rounds[grade.rounds.length - 1];
  const days = d.readings.map((l) => l.reading.recordedAt).sort();
  const current = d.readings.filter((l) => l.status === 'current').length;
  return html`<article class="report" data-seam="${d.id}">
    <header class="report-head">
      <div>
        <h1>Visual inspection report — ${seam?.label ?? d.id}</h1>
        <p>
          Visual testing of fusion welds, reported after ISO 17637; quality levels to ISO 5817.
          ${source(ISO17637)}
        </p>
      </div>
      <div>
        <p>
          <strong>Report no. BB-${d.id}</strong>, revision ${d.decisions.length} ${source(COMMON)}<br />
          Printed ${utc(printedAt)}<br />
          <span class="muted"
            >Revision counts the review decisions recorded; page numbers are in the footer.</span
          >
        </p>
      </div>
    </header>
    <h2>Object ${source(ISO17637)}</h2>
    ${
      seam
        ? factsList([
            ['Organisation', seam.organisation ?? 'not recorded'],
            [
              'Object / seam',
              `${seam.label} (${d.id})${d.namespace === 'demo' ? ' — DEMO data, invented' : ''}`,
            ],
            [
              'Drawing',
              seam.drawing
                ? `${seam.drawing}${seam.drawingPosition ? ` / ${seam.drawingPosition}` : ''}`
                : 'not recorded',
            ],
            ['Area', seam.area ?? 'not recorded'],
            [
              'Joint',
              `${seam.joint.type}${seam.joint.preparation ? `, ${seam.joint.preparation}` : ''}, ${seam.joint.sides}-sided, ${seam.joint.setting}`,
            ],
            [
              'Material and thickness',
              `${seam.material.name}${seam.material.group ? ` (group ${seam.material.group})` : ''}, t1 = ${fmtNumber(seam.plate1.thickness)} mm, t2 = ${fmtNumber(seam.plate2.thickness)} mm`,
            ],
            ['Welding process (ISO 4063)', seam.process ?? 'not recorded'],
            ['Welder / procedure', `${seam.welder ?? '—'} / ${seam.procedure ?? '—'}`],
            ['Length', `${fmtNumber(seam.length)} mm${seam.circumferential ? ', circumferential' : ''}`],
          ])
        : html`<p>No set-up received.</p>`
    }
    <h2>Acceptance criteria ${source(ISO17637)} ${source('ISO 5817')}</h2>
    <p>
      ${seam?.acceptance.edition ?? '—'}, required quality level
      ${s.requiredLevel ?? '—'}${seam?.acceptance.preset ? ` (${seam.acceptance.preset})` : ''}.
      ${
        s.unverifiedRows.length
          ? html`<strong class="mark mark-unverified"
                >UNVERIFIED limit rows: ${s.unverifiedRows.join(', ')}</strong
              >
              — limits recalled, not checked against a licensed copy of the standard.`
          : 'Every limit row in play is verified or transcribed.'
      }
    </p>
    <h2>Extent of examination and rounds ${source(ISO17637)}</h2>
    <p>
      ${d.rounds.length} round(s):
      ${d.rounds.map((r) => `${roundTitle(r.number, r.kind)}, started ${utc(r.startedAt)} (device clock)`).join('; ')}.
      ${current} current reading(s) of ${d.readings.length}
      held${days.length ? `, recorded ${utc(days[0])} to ${utc(days[days.length - 1])} (device clocks)` : ''}.
      Graded round: ${s.gradedRound ?? 'none complete'}.
    </p>
    <h2>Viewing and lighting conditions, aids ${source(ISO17637)}</h2>
    ${viewingList(d)}
    <h3>Instruments ${source(COMMON)}</h3>
    ${
      instruments(d).length
        ? html`<ul>
            ${instruments(d).map((i) => html`<li>${i}</li>`)}
          </ul>`
        : html`<p>None recorded.</p>`
    }
    <h2>Results ${source(ISO17637)} ${source('ISO 5817 rows, ISO 6520-1 numbers')}</h2>
    <p class="result">Quality level met: ${verdict(s)} — level ${level(s.levelMet)}</p>
    ${graded ? imperfectionsTable(graded) : html`<p>No graded round.</p>`}
    <h3>Visual checklist ${source(COMMON)}</h3>
    ${graded ? checklistTable(graded.checklist) : html`<p>—</p>`}
    ${d.review.assessment ? assessmentSection(d.review.assessment, { drivers: false }) : ''}
    <h2>Decision ${source(COMMON)}</h2>
    ${
      decision
        ? html`<p class="decision-line">
            <strong>Decision: ${OUTCOME_TEXT[decision.outcome]}</strong> on round ${decision.round} by
            ${decision.decidedByName}, ${utc(decision.decidedAt)} (server
            time)${decision.comment ? html` — “${decision.comment}”` : ''}.
            ${decision.verified ? 'Signature verified with the server key.' : 'Signature does not verify.'}
          </p>`
        : html`<p class="decision-line">
            <strong>Decision: not yet reviewed</strong>
            (${DECISION_OUTCOMES.map((o) => OUTCOME_TEXT[o]).join(' / ')}).
          </p>`
    }
    <h2>Examiner and reviewer ${source(ISO17637)} ${source(COMMON)}</h2>
    <div class="signatures">
      <div>
        Examiner: ${examiners(d).join(', ') || 'not recorded'}<br />
        Inspected ${days.length ? `${utc(days[0])} (device clock)` : '—'}<br />Signature:
      </div>
      <div>
        Reviewer: ${decision?.decidedByName ?? '—'}<br />
        Reviewed ${decision ? `${utc(decision.decidedAt)} (server clock)` : '—'}<br />Signature:
      </div>
    </div>
    ${cautions()}
  </article>`;
}

export function reportPage(
  user: string,
  details: readonly SeamDetail[],
  printedAt: string,
  truncated: boolean,
): string {
  return layout(
    details.length === 1 ? `Report ${details[0]?.seam?.label ?? ''}` : `Reports (${details.length})`,
    html`<p class="no-print">
        <button type="button" data-print>Print</button> or use the browser's Print (Ctrl+P / ⌘P); choose “Save
        as PDF” for a file.
        ${truncated ? `Only the first ${details.length} seams of the selection are included: narrow it to print the rest.` : ''}
      </p>
      ${details.length ? details.map((d) => oneReport(d, printedAt)) : html`<p>No seam matches this selection.</p>`}`,
    user,
    { bodyClass: 'wide', script: '/supervisor/review/print.js' },
  );
}

/** The print button's script (served from this origin; the CSP allows no inline script). */
export const PRINT_JS = `document.querySelector('[data-print]')?.addEventListener('click', () => window.print());\n`;
