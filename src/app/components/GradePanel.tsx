import type { RoundGrade, SeamGrade } from '../../domain/index.js';
import { Caution } from './Caution.js';
import { fmtLevel, fmtMargin, fmtNumber, fmtValue } from './format.js';
import { governingText } from './ImperfectionTable.js';
import { LevelBadge } from './LevelBadge.js';

/** The seam's grade in one panel: level met against required, why (the governing rule), where, and what is unsure. */
export function GradePanel({ grade }: { readonly grade: SeamGrade }) {
  const graded = grade.rounds.find((r) => r.round === grade.gradedRound) ?? null;
  const latest: RoundGrade | undefined = grade.rounds[grade.rounds.length - 1];
  const shown = graded ?? latest ?? null;
  const worst = shown?.worst ?? null;
  const worstRow = worst ? shown?.imperfections.find((s) => s.rowId === worst.rowId) : undefined;
  const worstLimit = shown && worstRow ? governingText(shown, worstRow) : null;
  const readings = grade.rounds.reduce((n, r) => n + r.readingCount, 0);
  const titles = new Map<string, string>();
  for (const r of grade.rounds) for (const s of r.imperfections) titles.set(s.rowId, `${s.row} ${s.title}`);
  // A checklist item can decide the level on its own (a crack is not permitted at any level).
  const checklistFails = (shown?.checklist.items ?? []).filter((i) => i.meetsRequired === false);
  const unverifiedChecklist = (shown?.checklist.items ?? []).filter(
    (i) => i.status === 'unverified' && i.answer === 'present',
  );
  return (
    <section class="panel grade" aria-labelledby="grade-title">
      <h2 id="grade-title">Seam result</h2>
      <p class="grade-badge">
        <LevelBadge
          levelMet={grade.levelMet}
          required={grade.requiredLevel}
          meets={grade.meetsRequired}
          state={readings === 0 && grade.meetsRequired !== false ? 'noReadings' : grade.state}
        />
      </p>
      {grade.state === 'incomplete' ? (
        <p class="incomplete">
          <strong>Incomplete:</strong> no round has its checklist fully answered, so the seam has not passed.
          {latest ? (
            <>
              {' '}
              Round {latest.round} so far:{' '}
              {latest.levelMet === null ? 'nothing graded yet' : `${fmtLevel(latest.levelMet)} (provisional)`}
              , {latest.checklist.unanswered.length} checklist item
              {latest.checklist.unanswered.length === 1 ? '' : 's'} still to answer.
            </>
          ) : null}
        </p>
      ) : (
        <p>
          Graded from round {grade.gradedRound}
          {graded && graded.round !== latest?.round ? ` (round ${latest?.round} is not complete yet)` : ''}:
          level met <strong>{fmtLevel(grade.levelMet)}</strong>, required{' '}
          <strong>{grade.requiredLevel}</strong>
          {grade.meetsRequired === null ? '' : grade.meetsRequired ? ' — meets it.' : ' — does not meet it.'}
        </p>
      )}
      {checklistFails.length ? (
        <dl class="facts">
          <div>
            <dt>Fails on the checklist</dt>
            <dd>
              <ul class="plain">
                {checklistFails.map((i) => (
                  <li key={i.item}>
                    <span aria-hidden="true">✗ </span>
                    {i.row} {i.label} (ISO 6520-1 {i.ref}) present
                    {i.position === undefined ? '' : ` at ${fmtNumber(i.position)} mm`}: level met{' '}
                    {fmtLevel(i.levelMet)}, required {i.required}
                  </li>
                ))}
              </ul>
            </dd>
          </div>
        </dl>
      ) : null}
      {worst ? (
        <dl class="facts">
          <div>
            <dt>{checklistFails.length ? 'Worst gauge reading' : 'Governing rule'}</dt>
            <dd>
              {worstRow?.row ?? worst.rowId} {worst.title}
              {worstLimit ? `: ${worstLimit}` : ''}
            </dd>
          </div>
          <div>
            <dt>Worst value</dt>
            <dd>
              {fmtValue(worst.measured, worst.unit)} against {fmtValue(worst.governingLimit, worst.unit)} —{' '}
              {fmtMargin(worst.margin, worst.unit)}
              {worst.borderline ? ' (≈ borderline: within the instrument resolution)' : ''}
            </dd>
          </div>
          <div>
            <dt>Worst position</dt>
            <dd>{fmtNumber(worst.position)} mm from the start mark</dd>
          </div>
        </dl>
      ) : (
        <p class="note">No gauge readings graded yet{shown ? ` in round ${shown.round}` : ''}.</p>
      )}
      {grade.unverifiedRows.length || unverifiedChecklist.length ? (
        <div class="unverified">
          <p>
            <strong>Unverified limits</strong> (resting on recalled values until a checked table is loaded):
          </p>
          <ul>
            {grade.unverifiedRows.map((id) => (
              <li key={id}>{titles.get(id) ?? id}</li>
            ))}
            {unverifiedChecklist.map((i) => (
              <li key={i.item}>
                {i.row} {i.label} (checklist)
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      <p class="note">
        Graded against {grade.edition}
        {grade.verifiedTable
          ? ` with the verified table “${grade.verifiedTable.name}” (${grade.verifiedTable.verifiedBy}, ${grade.verifiedTable.verifiedOn})`
          : ' with the built-in limits'}
        .
      </p>
      {grade.notes.length ? (
        <ul class="notes">
          {grade.notes.map((n) => (
            <li key={n}>{n}</li>
          ))}
        </ul>
      ) : null}
      <Caution />
    </section>
  );
}
