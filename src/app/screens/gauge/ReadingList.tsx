import { useState } from 'preact/hooks';
import type { Reading, Seam } from '../../../domain/index.js';
import { describeReading } from './reading-summary.js';

const SHOWN = 20;

/**
 * This seam's readings that count now, newest first, each with a Correct button. Replaced and withdrawn readings
 * stay in the record; they are counted here, not listed.
 */
export function ReadingList(props: {
  readonly seam: Seam;
  /** Current readings in entry order. */
  readonly readings: readonly Reading[];
  readonly replacedCount: number;
  readonly sessionIds: ReadonlySet<string>;
  readonly correctingId: string | null;
  readonly onCorrect: (r: Reading) => void;
}) {
  const [all, setAll] = useState(false);
  // Only the rows shown are copied and reversed: a seam may hold thousands of readings.
  const total = props.readings.length;
  const list = (all ? [...props.readings] : props.readings.slice(Math.max(0, total - SHOWN))).reverse();
  return (
    <details class="gauge-list">
      <summary>
        Correct a reading ({props.readings.length} that count
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
