import { useState } from 'preact/hooks';
import type { Reading, Seam } from '../../../domain/index.js';
import { describeReading } from './reading-summary.js';
import { currentReadings, latestCurrent } from './session.js';

const SHOWN = 20;

/**
 * This seam's readings that count now, newest first, each with a Correct button. Replaced and withdrawn readings
 * stay in the record; they are counted here, not listed.
 */
export function ReadingList(props: {
  readonly seam: Seam;
  /** Every reading of the seam in entry order, withdrawals and superseded ones included. */
  readonly entryOrder: readonly Reading[];
  /** Reading id → the later reading that supersedes it. */
  readonly supersededBy: ReadonlyMap<string, string>;
  /** How many readings count now. */
  readonly counting: number;
  readonly replacedCount: number;
  readonly sessionIds: ReadonlySet<string>;
  readonly correctingId: string | null;
  readonly onCorrect: (r: Reading) => void;
}) {
  const [all, setAll] = useState(false);
  // Only the rows shown are looked for: a seam may hold thousands of readings, and this renders on every save.
  const total = props.counting;
  const list = all
    ? currentReadings(props.entryOrder).reverse()
    : latestCurrent(props.entryOrder, props.supersededBy, SHOWN);
  return (
    <details class="gauge-list">
      <summary>
        Correct a reading ({total} that count
        {props.replacedCount ? `, ${props.replacedCount} corrected or withdrawn kept on record` : ''})
      </summary>
      {list.length ? (
        <ol class="gauge-list-items" reversed>
          {list.map((r) => (
            <li key={r.id}>
              <span>
                <span class="gauge-sub">round {r.round}</span> {describeReading(r, props.seam)}
                {props.sessionIds.has(r.id) ? <span class="gauge-sub"> · this session</span> : null}
              </span>
              <button
                type="button"
                aria-pressed={props.correctingId === r.id}
                aria-label={`Correct the reading ${describeReading(r, props.seam)}`}
                onClick={() => props.onCorrect(r)}
              >
                Correct
              </button>
            </li>
          ))}
        </ol>
      ) : (
        <p>No readings yet.</p>
      )}
      {!all && total > SHOWN ? (
        <button type="button" onClick={() => setAll(true)}>
          Show all {total}
        </button>
      ) : null}
    </details>
  );
}
