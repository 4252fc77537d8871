import type { Level, Reading, ReadingGrade, Seam } from '../../../domain/index.js';
import { Caution } from '../../components/Caution.js';
import { LevelBadge } from '../../components/LevelBadge.js';
import {
  governingText,
  isUnverified,
  marginText,
  measuredText,
  notGradedText,
  type SoFar,
} from './grade-view.js';
import { describeReading } from './reading-summary.js';

/** The grade of the reading just saved, per imperfection, and the seam's standing so far. Grades come from the worker. */
export function ReadingGradeView(props: {
  readonly seam: Seam;
  readonly heading: string;
  readonly reading: Reading | null;
  readonly grade: ReadingGrade | null;
  readonly soFar: SoFar | null;
  readonly required: Level | null;
  readonly pending: boolean;
  readonly error: string | null;
}) {
  const { seam, reading, grade } = props;
  const required = props.required ?? undefined;
  const notGraded = grade ? notGradedText(grade.notGraded) : null;
  return (
    <section class="gauge-result" aria-labelledby="gauge-result-title" aria-busy={props.pending}>
      <h2 id="gauge-result-title">{props.heading}</h2>
      {reading ? <p class="gauge-reading-line">{describeReading(reading, seam)}</p> : null}
      {props.pending ? <p>Grading in the background…</p> : null}
      {props.error ? (
        <p class="help help-error" role="alert">
          ⚠ {props.error}
        </p>
      ) : null}
      {grade ? (
        <>
          {grade.imperfections.length ? (
            <ul class="gauge-imperfections">
              {grade.imperfections.map((g) => (
                <li key={g.rowId} class="gauge-imperfection">
                  <p class="gauge-imp-title">
                    <strong>{g.title}</strong>{' '}
                    <span class="gauge-sub">
                      row {g.row} ({g.refs.join(', ')})
                    </span>
                  </p>
                  <p>
                    <LevelBadge levelMet={g.levelMet} required={g.required} /> <span>{measuredText(g)}</span>
                  </p>
                  <p class="gauge-limit">
                    {governingText(g)} · <strong>{marginText(g)}</strong>
                  </p>
                  {g.borderline || isUnverified(g) ? (
                    <p class="gauge-markers">
                      {g.borderline ? (
                        <span>
                          <span class="mark mark-borderline">≈ borderline</span> within the gauge's resolution
                          of the limit: measure again, or with a finer gauge
                        </span>
                      ) : null}
                      {isUnverified(g) ? (
                        <span>
                          <span class="mark mark-unverified">? unverified</span> a limit in play rests on
                          recalled values
                        </span>
                      ) : null}
                    </p>
                  ) : null}
                  {g.notes.length ? <p class="help">{g.notes.join('; ')}</p> : null}
                </li>
              ))}
            </ul>
          ) : (
            <p>No quality-level row grades these values on this joint.</p>
          )}
          {notGraded ? <p class="help">{notGraded}</p> : null}
        </>
      ) : null}
      {props.soFar ? (
        <div class="gauge-sofar">
          {reading || grade ? <h3>Seam so far</h3> : null}
          <p>
            <LevelBadge levelMet={props.soFar.levelMet} required={required} state={props.soFar.state} />
          </p>
          <p>{props.soFar.text}</p>
        </div>
      ) : null}
      <Caution />
    </section>
  );
}
