import type { ImperfectionSummary, RoundGrade } from '../../domain/index.js';
import { fmtLevel, fmtMargin, fmtNumber, fmtValue } from './format.js';

/** The limit text at the required level for the worst reading of a row, e.g. "h ≤ 1 mm + 0.1·b, max 5 mm". */
export function governingText(round: RoundGrade, s: ImperfectionSummary): string | null {
  const r = round.readings.find((x) => x.readingId === s.worst.readingId);
  return r?.imperfections.find((g) => g.rowId === s.rowId)?.governing.text ?? null;
}

function verdictWords(s: ImperfectionSummary): string {
  const base = s.meetsRequired ? `meets required ${s.required}` : `below required ${s.required}`;
  const failed = s.shortRule.filter((c) => !c.passes);
  if (!failed.length) return base;
  const f = failed[0];
  return f
    ? `${base}; too much in total at ${f.level}: ${fmtNumber(f.worstMm)} mm within ${fmtNumber(f.windowMm)} mm from ${fmtNumber(f.worstWindowStart)} mm (at most ${fmtNumber(f.allowedMm)} mm)`
    : base;
}

/** One row per graded imperfection of a round: where it is worst, against which limit, and the verdict in words. */
export function ImperfectionTable({ round }: { readonly round: RoundGrade }) {
  if (!round.imperfections.length) {
    return <p class="note">No gauge readings graded in this round yet.</p>;
  }
  return (
    <div class="table-wrap">
      <table class="resp imperfections">
        <caption>Imperfections graded in round {round.round}, worst reading of each</caption>
        <thead>
          <tr>
            <th scope="col">Row</th>
            <th scope="col">ISO 6520-1</th>
            <th scope="col">Imperfection</th>
            <th scope="col">Worst value</th>
            <th scope="col">Where</th>
            <th scope="col">Limit at required level</th>
            <th scope="col">Margin</th>
            <th scope="col">Level met</th>
            <th scope="col">Verdict</th>
          </tr>
        </thead>
        <tbody>
          {round.imperfections.map((s) => {
            const limit = governingText(round, s);
            return (
              <tr key={s.rowId} class={s.meetsRequired ? 'row-ok' : 'row-below'}>
                <td data-label="Row">{s.row}</td>
                <td data-label="ISO 6520-1">{s.refs.join(', ')}</td>
                <th scope="row" data-label="Imperfection">
                  {s.title}
                  {s.limitStatus === 'unverified' ? (
                    <span class="mark mark-unverified" title="limit rests on recalled values">
                      unverified {s.unverifiedLevels.join(', ')}
                    </span>
                  ) : null}
                  {s.worst.borderline ? <span class="mark mark-borderline">≈ borderline</span> : null}
                </th>
                <td data-label="Worst value">{fmtValue(s.worst.measured, s.unit)}</td>
                <td data-label="Where">
                  {fmtNumber(s.worst.position)} mm ({s.readings} reading{s.readings === 1 ? '' : 's'})
                </td>
                <td data-label={`Limit at ${s.required}`}>
                  {s.required}: {fmtValue(s.worst.governingLimit, s.unit)}
                  {limit ? <span class="limit-text"> ({limit})</span> : null}
                </td>
                <td data-label="Margin">{fmtMargin(s.worst.margin, s.unit)}</td>
                <td data-label="Level met">{fmtLevel(s.levelMet)}</td>
                <td data-label="Verdict">
                  <span aria-hidden="true">{s.meetsRequired ? '✓ ' : '✗ '}</span>
                  {verdictWords(s)}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
