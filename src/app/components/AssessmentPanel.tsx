// Loaded lazily by the seam screen: the charts and the catalogue stay out of the first paint.
import { useState } from 'preact/hooks';
import { DETAIL_IDS, DETAILS, type DetailId, type SeamAssessment } from '../../domain/index.js';
import { assessmentView, type FatView, type KmView } from './assessment-view.js';
import { Caution } from './Caution.js';
import { RankedBars } from './RankedBars.js';
import { RunningMeanChart } from './RunningMeanChart.js';
import './assessment.css';

export interface AssessmentPanelProps {
  readonly assessment: SeamAssessment;
  readonly seamLength: number;
  /** Present when the seam's set-up has fatigue data, so an engineer's choice of detail can be saved with it. */
  readonly onOverride?: (detail: DetailId | null) => Promise<void>;
}

function KmSection({ km }: { readonly km: KmView }) {
  return (
    <section aria-labelledby="km-title">
      <h3 id="km-title">Misalignment km</h3>
      <p>{km.summary}</p>
      {km.facts.length ? (
        <dl class="facts">
          {km.facts.map((f) => (
            <div key={f.label}>
              <dt>{f.label}</dt>
              <dd>
                <strong>{f.value}</strong>
                {f.note ? <span class="note"> — {f.note}</span> : null}
              </dd>
            </div>
          ))}
        </dl>
      ) : null}
      {km.assumptions.length ? (
        <details>
          <summary>Assumptions ({km.assumptions.length})</summary>
          <ul class="notes">
            {km.assumptions.map((a) => (
              <li key={a}>{a}</li>
            ))}
          </ul>
        </details>
      ) : null}
    </section>
  );
}

function OverridePicker({
  fat,
  onOverride,
}: {
  readonly fat: FatView;
  readonly onOverride: (detail: DetailId | null) => Promise<void>;
}) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <div class="field">
      <label for="detail-override">Detail class (an engineer’s choice replaces the one the seam earns)</label>
      <select
        id="detail-override"
        disabled={busy}
        value={fat.overrideId ?? ''}
        onChange={(e) => {
          const v = (e.currentTarget as HTMLSelectElement).value;
          setBusy(true);
          setError(null);
          onOverride(v ? (v as DetailId) : null).then(
            () => setBusy(false),
            (err: unknown) => {
              setError(err instanceof Error ? err.message : String(err));
              setBusy(false);
            },
          );
        }}
      >
        <option value="">The class the measured seam earns</option>
        {DETAIL_IDS.map((id) => (
          <option key={id} value={id}>
            {id}: {DETAILS[id].title}
          </option>
        ))}
      </select>
      {error ? (
        <p role="alert" class="help help-error">
          ⚠ Not saved: {error}
        </p>
      ) : null}
    </div>
  );
}

function FatSection({
  fat,
  onOverride,
}: Pick<AssessmentPanelProps, 'onOverride'> & { readonly fat: FatView }) {
  return (
    <section aria-labelledby="fat-title">
      <h3 id="fat-title">Fatigue class</h3>
      <p class={`fat-flag fat-${fat.flag}`}>
        <span class="fat-symbol" aria-hidden="true">
          {fat.symbol}
        </span>{' '}
        <strong>{fat.verdict}</strong> (indicative). {fat.numbers}.
      </p>
      {fat.missing.length ? (
        <p>
          <strong>Missing to assess it:</strong> {fat.missing.join('; ')}.
        </p>
      ) : null}
      <p>{fat.chosen}.</p>
      {fat.why.length ? (
        <ul class="notes">
          {fat.why.map((w) => (
            <li key={w}>Why: {w}</li>
          ))}
        </ul>
      ) : null}
      {fat.canOverride && onOverride ? (
        <OverridePicker fat={fat} onOverride={onOverride} />
      ) : (
        <p class="note">
          To choose another detail class, give the seam its fatigue data (set-up file, section fatigue).
        </p>
      )}
      <h4>Indicative life</h4>
      <p>{fat.life}</p>
      {fat.lifeCurve ? <p class="note">S-N curve: {fat.lifeCurve}.</p> : null}
      <p>{fat.effectiveNotch}</p>
    </section>
  );
}

/** km, toe ranking, the fatigue-class flag, life, what drives it and sampling adequacy, with the caution. */
export default function AssessmentPanel({ assessment, seamLength, onOverride }: AssessmentPanelProps) {
  const v = assessmentView(assessment, onOverride !== undefined);
  return (
    <section class="panel assessment" aria-labelledby="assessment-title">
      <h2 id="assessment-title">Fatigue assessment (indicative)</h2>
      <Caution indicative />
      <p class="note">
        {v.round === null ? 'Nothing measured yet.' : `From round ${v.round}.`}
        {v.assumptions.length ? ` Assumed: ${v.assumptions.join('; ')}.` : ''}
      </p>
      <KmSection km={v.km} />

      <section aria-labelledby="toes-title">
        <h3 id="toes-title">Crack-site ranking</h3>
        {v.toes.crackSite ? <p class="crack-site">{v.toes.crackSite}</p> : null}
        {v.toes.rows.length ? (
          <ol class="toe-ranking">
            {v.toes.rows.map((t) => (
              <li key={t.label}>
                <strong>{t.label}</strong> at {t.where}: Kt,eff {t.factor}; {t.bending}
                {t.flags.length ? ` [${t.flags.join(', ')}]` : ''}
              </li>
            ))}
          </ol>
        ) : (
          <p>No toe measured that can be ranked yet.</p>
        )}
        {v.toes.note ? <p class="note">Note: {v.toes.note}</p> : null}
        {v.toes.notRanked.length ? (
          <ul class="notes">
            {v.toes.notRanked.map((r) => (
              <li key={r}>Not ranked: {r}</li>
            ))}
          </ul>
        ) : null}
      </section>

      <FatSection fat={v.fat} {...(onOverride ? { onOverride } : {})} />

      <section aria-labelledby="drivers-title">
        <h3 id="drivers-title">What drives it</h3>
        <p class="note">
          Each measured input moved by its measurement uncertainty, one at a time: the longest bar is the
          reading that matters most.
        </p>
        {v.drivers.bars.length ? <RankedBars title={v.drivers.title} bars={v.drivers.bars} /> : null}
        <RankedBars title="What drives the toe factors" bars={v.drivers.toeBars} />
        {v.drivers.unaffected.length ? (
          <p class="note">No effect: {v.drivers.unaffected.join('; ')}.</p>
        ) : null}
      </section>

      <section aria-labelledby="sampling-title">
        <h3 id="sampling-title">Enough positions measured?</h3>
        {v.sampling.rows.length ? (
          v.sampling.rows.map((row) => (
            <div class="sampling-row" key={row.label}>
              <p class="advice">
                <span aria-hidden="true">{row.settled ? '● ' : '○ '}</span>
                {row.advice}
              </p>
              {row.means.length >= 2 ? <RunningMeanChart row={row} seamLength={seamLength} /> : null}
            </div>
          ))
        ) : (
          <p>No positions at the pitch yet.</p>
        )}
        <p class="note">{v.sampling.caveat}</p>
      </section>
    </section>
  );
}
