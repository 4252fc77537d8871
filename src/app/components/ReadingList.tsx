import { useState } from 'preact/hooks';
import { PARAMETER_NAMES, PARAMETERS, type Reading } from '../../domain/index.js';
import type { ReadingRecord } from '../../store/api.js';
import { fmtPosition, fmtToe, fmtValue, fmtWhen, PARAM_LABEL } from './format.js';

const PAGE = 50;

export interface ReadingStatus {
  /** Replaced by a later correction (the id of the one that replaced it). */
  readonly correctedBy?: string;
  /** Taken back by a withdrawal. */
  readonly withdrawnBy?: string;
}

/** Which readings were corrected or withdrawn, and by which later reading. Nothing is hidden or deleted. */
export function readingStatuses(records: readonly ReadingRecord[]): Map<string, ReadingStatus> {
  const out = new Map<string, ReadingStatus>();
  for (const { reading: r } of records) {
    if (r.supersedes === undefined) continue;
    out.set(r.supersedes, r.withdrawn ? { withdrawnBy: r.id } : { correctedBy: r.id });
  }
  return out;
}

/** Newest first by the device's order of entry (never by the clock, which may be wrong). */
export function newestFirst(records: readonly ReadingRecord[]): ReadingRecord[] {
  return [...records].sort((a, b) => b.localSeq - a.localSeq);
}

function valuesText(r: Reading): string {
  return PARAMETER_NAMES.filter((n) => r.values[n] !== undefined)
    .map((n) => `${PARAM_LABEL[n] ?? n} ${fmtValue(r.values[n], PARAMETERS[n].unit)}`)
    .join(', ');
}

function Entry({
  rec,
  status,
  byId,
}: {
  readonly rec: ReadingRecord;
  readonly status: ReadingStatus | undefined;
  readonly byId: Map<string, Reading>;
}) {
  const r = rec.reading;
  const target = r.supersedes === undefined ? undefined : byId.get(r.supersedes);
  const where = [fmtPosition(r), fmtToe(r.toe, r.side)].filter(Boolean).join(', ');
  const inactive = status?.correctedBy ?? status?.withdrawnBy;
  return (
    <li class={inactive ? 'reading reading-old' : 'reading'}>
      <div class="reading-head">
        <span class="reading-where">
          Round {r.round} · {where}
        </span>
        <span class="reading-kind">{r.sampling === 'targeted' ? '◆ targeted' : '● at pitch'}</span>
        {status?.correctedBy ? <span class="mark mark-old">corrected</span> : null}
        {status?.withdrawnBy ? <span class="mark mark-old">withdrawn</span> : null}
        {rec.namespace === 'demo' ? <span class="tag tag-demo">demo</span> : null}
      </div>
      {r.withdrawn ? (
        <p>
          <strong>Withdrawal</strong> of the reading {target ? `at ${fmtPosition(target)}` : r.supersedes} (it
          stays listed, marked withdrawn).
        </p>
      ) : (
        <p>
          {r.supersedes !== undefined ? (
            <strong>Correction of the reading {target ? `at ${fmtPosition(target)}` : r.supersedes}: </strong>
          ) : null}
          {valuesText(r) || 'no values'}
        </p>
      )}
      <p class="reading-who">
        {r.examiner?.name ?? 'examiner not recorded'} · {fmtWhen(r.recordedAt)} · instrument {r.instrument.id}
        {r.instrument.resolutionMm !== undefined ? ` (±${r.instrument.resolutionMm} mm)` : ''}
        {r.instrument.resolutionDeg !== undefined ? ` (±${r.instrument.resolutionDeg}°)` : ''}
        {r.source.kind === 'import' ? ` · imported (${r.source.importId})` : ''}
      </p>
    </li>
  );
}

/** Every reading of the seam, newest first; corrected and withdrawn ones stay, marked. */
export function ReadingList({ records }: { readonly records: readonly ReadingRecord[] }) {
  const [shown, setShown] = useState(PAGE);
  if (!records.length) return <p class="note">No readings yet. Use “Gauge readings” to add some.</p>;
  const statuses = readingStatuses(records);
  const byId = new Map(records.map((r) => [r.reading.id, r.reading]));
  const ordered = newestFirst(records);
  return (
    <>
      <ol class="readings">
        {ordered.slice(0, shown).map((rec) => (
          <Entry key={rec.reading.id} rec={rec} status={statuses.get(rec.reading.id)} byId={byId} />
        ))}
      </ol>
      {ordered.length > shown ? (
        <button type="button" onClick={() => setShown((n) => n + PAGE * 4)}>
          Show more ({ordered.length - shown} older)
        </button>
      ) : null}
    </>
  );
}
