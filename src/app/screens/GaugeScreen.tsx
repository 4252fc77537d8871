import { useState } from 'preact/hooks';
import { EXECUTION_CLASS_PRESETS } from '../../domain/index.js';
import { hrefOf } from '../router.js';
import { GaugeEntry } from './gauge/GaugeEntry.js';
import { readExaminer } from './gauge/examiner.js';
import { useSeamData, type SeamData } from './gauge/use-seam-data.js';
import './gauge.css';

const ROUND_KIND: Record<string, string> = {
  first: 'first inspection',
  afterRepair: 'after repair',
  additional: 'additional inspection',
};

const JOINT: Record<string, string> = {
  butt: 'butt',
  filletT: 'fillet T',
  cruciform: 'cruciform',
  lap: 'lap',
};

function SeamFacts({ data }: { readonly data: SeamData }) {
  const { seam, rounds } = data.file;
  const latest = [...rounds].sort((a, b) => b.number - a.number)[0];
  const acc = seam.acceptance;
  const preset = acc.preset ? EXECUTION_CLASS_PRESETS[acc.preset] : null;
  // Per-imperfection levels (from the preset or set on the seam) are counted here; the grade names each one.
  const setApart = Object.keys({ ...preset?.overrides, ...acc.overrides }).length;
  const required = `${acc.preset ? `${acc.preset}: ` : ''}level ${acc.level ?? preset?.level ?? '?'}${
    setApart ? `, other levels for ${setApart} imperfection number${setApart === 1 ? '' : 's'}` : ''
  }`;
  return (
    <dl class="gauge-facts">
      <div>
        <dt>Seam length</dt>
        <dd>{seam.length} mm</dd>
      </div>
      <div>
        <dt>Round</dt>
        <dd>{latest ? `${latest.number} (${ROUND_KIND[latest.kind] ?? latest.kind})` : 'none yet'}</dd>
      </div>
      <div>
        <dt>Joint</dt>
        <dd>
          {JOINT[seam.joint.type] ?? seam.joint.type},{' '}
          {seam.joint.sides === 'one' ? 'one side' : 'both sides'} · plates {seam.plate1.thickness} /{' '}
          {seam.plate2.thickness} mm
        </dd>
      </div>
      <div>
        <dt>Required</dt>
        <dd>{required}</dd>
      </div>
    </dl>
  );
}

function NoRound({
  data,
  reload,
}: {
  readonly data: SeamData;
  readonly reload: () => Promise<SeamData | null>;
}) {
  const [error, setError] = useState<string | null>(null);
  const start = async () => {
    try {
      await data.store.startRound(data.record.id, 'first', readExaminer(localStorage));
      await reload();
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    }
  };
  return (
    <div class="gauge-card">
      <p>Readings belong to an inspection round, and this seam has none yet.</p>
      <button type="button" class="gauge-primary" onClick={() => void start()}>
        Start the first round
      </button>
      {error ? (
        <p class="help help-error" role="alert">
          ⚠ Could not start the round ({error}).
        </p>
      ) : null}
    </div>
  );
}

/** Gauge: reading entry at the seam, organised around the instrument in the inspector's hand. */
export default function GaugeScreen({ id }: { readonly id: string }) {
  const { state, reload, refresh } = useSeamData(id);
  const back = hrefOf({ name: 'seam', id });
  if (state.status === 'loading') return <p aria-busy="true">Loading the seam…</p>;
  if (state.status === 'missing') {
    return (
      <section aria-labelledby="gauge-title">
        <h1 id="gauge-title">Gauge</h1>
        <p role="alert">There is no seam with this id on this tablet.</p>
        <a href={hrefOf({ name: 'seams' })}>Back to the seams</a>
      </section>
    );
  }
  if (state.status === 'error') {
    return (
      <section aria-labelledby="gauge-title">
        <h1 id="gauge-title">Gauge</h1>
        <p role="alert">
          ⚠ The seam could not be read from this tablet's storage ({state.message}). Nothing is lost by
          reloading.
        </p>
        <a href={back}>Back to the seam</a>
      </section>
    );
  }
  const { data } = state;
  return (
    <section class="gauge" aria-labelledby="gauge-title">
      <header class="gauge-head">
        <a class="gauge-back" href={back}>
          ← Back to the seam
        </a>
        <h1 id="gauge-title">
          Gauge: {data.file.seam.label}
          {data.record.namespace === 'demo' ? <span class="tag tag-demo">demo</span> : null}
        </h1>
        <SeamFacts data={data} />
        <p class="gauge-caution-link">
          <a href={hrefOf({ name: 'caution' })}>Caution: what the grades mean and what they do not</a>
        </p>
      </header>
      {data.file.rounds.length ? (
        <GaugeEntry key={data.record.id} data={data} refresh={refresh} />
      ) : (
        <NoRound data={data} reload={reload} />
      )}
    </section>
  );
}
