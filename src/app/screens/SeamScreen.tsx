import { useEffect, useRef, useState } from 'preact/hooks';
import type {
  ChecklistItem,
  DetailId,
  Problem,
  RoundGrade,
  SeamAssessment,
  SeamGrade,
} from '../../domain/index.js';
import type {
  ChecklistAnswer,
  DecisionRecord,
  ReadingRecord,
  RoundRecord,
  SeamRecord,
} from '../../store/api.js';
import { DecisionPanel } from '../components/DecisionPanel.js';
import { ChecklistPanel } from '../components/ChecklistPanel.js';
import { ViewingPanel } from '../components/ViewingPanel.js';
import type { ViewingConditions } from '../../domain/model/viewing.js';
import { fmtLevel, fmtWhen, ROUND_KIND_LABEL } from '../components/format.js';
import { GradePanel } from '../components/GradePanel.js';
import { ImperfectionTable } from '../components/ImperfectionTable.js';
import { Lazy } from '../components/Lazy.js';
import { LinkedTags } from '../components/LinkedTags.js';
import { ReadingList } from '../components/ReadingList.js';
import { SetupSummary } from '../components/SetupSummary.js';
import { StripChart } from '../components/StripChart.js';
import { summaryFromGrade } from '../components/summary.js';
import { hrefOf } from '../router.js';
import { gradeInWorker } from '../services/grading.js';
import { getStore } from '../services/store.js';
import { onPulled } from '../services/pull-events.js';

type Graded =
  { ok: true; grade: SeamGrade; assessment: SeamAssessment } | { ok: false; problems: Problem[] } | null;

// The assessment panel carries the charts and the fatigue catalogue: loaded after the seam's grade shows.
const loadAssessment = () => import('../components/AssessmentPanel.js');

interface Loaded {
  readonly rec: SeamRecord;
  readonly rounds: RoundRecord[];
  readonly readings: ReadingRecord[];
  readonly decisions: DecisionRecord[];
  /** Decisions not seen before this screen showed them (marked seen as it opens). */
  readonly unseen: ReadonlySet<string>;
}

const errorText = (e: unknown) => (e instanceof Error ? e.message : String(e));

function roundState(g: RoundGrade | undefined): string {
  if (!g) return 'not graded yet';
  if (!g.complete) return `incomplete (${g.checklist.unanswered.length} checklist items open)`;
  return `complete, level ${fmtLevel(g.levelMet)}${g.meetsRequired === false ? ', below required' : g.meetsRequired ? ', meets required' : ''}`;
}

function RoundDetail(props: {
  readonly round: RoundRecord;
  readonly grade: RoundGrade | undefined;
  readonly seamLength: number;
  readonly latest: boolean;
  readonly onAnswer: (item: ChecklistItem, answer: ChecklistAnswer) => Promise<void>;
  readonly onViewing: (conditions: ViewingConditions) => Promise<void>;
}) {
  const { round, grade } = props;
  return (
    <div class="round-detail">
      <h3>
        Round {round.number}: {ROUND_KIND_LABEL[round.kind] ?? round.kind}
      </h3>
      <p>
        Started {fmtWhen(round.startedAt)}
        {round.examiner ? ` by ${round.examiner.name}` : ''} — {roundState(grade)}
        {grade && grade.borderlineCount
          ? `; ${grade.borderlineCount} value${grade.borderlineCount === 1 ? '' : 's'} borderline`
          : ''}
        {grade && grade.supersededReadings.length
          ? `; ${grade.supersededReadings.length} corrected reading${grade.supersededReadings.length === 1 ? '' : 's'} not counted`
          : ''}
      </p>
      {grade ? (
        <>
          <h4>Readings along the seam</h4>
          <StripChart
            readings={grade.readings}
            seamLength={props.seamLength}
            caption={`Round ${round.number}`}
          />
          <h4>Imperfections</h4>
          <ImperfectionTable round={grade} />
        </>
      ) : null}
      <h4>Viewing and lighting</h4>
      <ViewingPanel round={round} {...(props.latest ? { onSave: props.onViewing } : {})} />
      <h4>Visual checklist</h4>
      {props.latest ? null : (
        <p class="note">An earlier round: its answers are history and cannot be changed here.</p>
      )}
      <ChecklistPanel
        round={round}
        grade={grade?.checklist}
        seamLength={props.seamLength}
        {...(props.latest ? { onAnswer: props.onAnswer } : {})}
      />
    </div>
  );
}

function StartRound({ next, onStart }: { readonly next: number; readonly onStart: () => Promise<void> }) {
  const [asking, setAsking] = useState(false);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  if (!asking) {
    return (
      <button type="button" onClick={() => setAsking(true)}>
        Start round after repair
      </button>
    );
  }
  return (
    <div class="confirm" role="group" aria-label="Start a new round">
      <p>
        Start round {next} after a repair? New readings and a new checklist go into round {next}; earlier
        rounds stay as history.
      </p>
      <div class="actions">
        <button
          type="button"
          class="primary"
          disabled={busy}
          onClick={() => {
            setBusy(true);
            onStart().then(
              () => {
                setAsking(false);
                setBusy(false);
              },
              (e: unknown) => {
                setError(errorText(e));
                setBusy(false);
              },
            );
          }}
        >
          Yes, start round {next}
        </button>
        <button type="button" onClick={() => setAsking(false)}>
          Cancel
        </button>
      </div>
      {error ? (
        <p role="alert" class="help help-error">
          ⚠ Not started: {error}
        </p>
      ) : null}
    </div>
  );
}

/** One seam: set-up, result, rounds with their checklist, the strip chart and every reading. */
export default function SeamScreen({ id }: { readonly id: string }) {
  const [data, setData] = useState<Loaded | 'loading' | 'missing'>('loading');
  const [graded, setGraded] = useState<Graded>(null);
  const [error, setError] = useState<string | null>(null);
  const [selected, setSelected] = useState<number | null>(null);
  const gradeSeq = useRef(0);

  /** Grades the stored seam in the worker; only the latest request's answer is shown. */
  const regrade = async () => {
    const seq = ++gradeSeq.current;
    const store = await getStore();
    const file = await store.seamFile(id);
    if (!file) return;
    const reply = await gradeInWorker(file);
    if (seq !== gradeSeq.current) return;
    setGraded(reply);
    if (reply.ok) await store.setSummary(id, summaryFromGrade(reply.grade, new Date().toISOString()));
  };

  const load = async () => {
    try {
      const store = await getStore();
      const rec = await store.getSeam(id);
      if (!rec) {
        setData('missing');
        return;
      }
      const [rounds, readings, decisions] = await Promise.all([
        store.listRounds(id),
        store.listReadings(id),
        store.listDecisions(id),
      ]);
      const unseen = new Set(decisions.filter((d) => d.seenAt === undefined).map((d) => d.id));
      setData({ rec, rounds, readings, decisions, unseen });
      // Shown now: the Seams list stops pointing these decisions out.
      if (unseen.size) await store.markDecisionsSeen(id);
      await regrade();
    } catch (e) {
      setError(errorText(e));
    }
  };

  useEffect(() => {
    setData('loading');
    setGraded(null);
    setSelected(null);
    void load();
    // A decision pulled while the seam is open shows at once (a rework decision also opens a round).
    return onPulled((outcome) => {
      if (outcome.kind === 'pulled' && outcome.applied.decisions) void load();
    });
  }, [id]);

  if (error) {
    return (
      <p role="alert" class="banner banner-bad">
        ⚠ This seam could not be read or graded ({error}). Reload the app to try again.
      </p>
    );
  }
  if (data === 'loading') return <p aria-busy="true">Loading the seam…</p>;
  if (data === 'missing') {
    return (
      <p role="alert">
        There is no seam with this id on this device.{' '}
        <a href={hrefOf({ name: 'seams' })}>Back to the seams</a>
      </p>
    );
  }
  const { rec, rounds, readings, decisions, unseen } = data;
  const seam = rec.seam;
  const sortedRounds = [...rounds].sort((a, b) => a.number - b.number);
  const latest = sortedRounds[sortedRounds.length - 1];
  const current = sortedRounds.find((r) => r.number === selected) ?? latest;
  const grade = graded?.ok ? graded.grade : null;

  const answer = async (item: ChecklistItem, a: ChecklistAnswer) => {
    if (!current) return;
    const store = await getStore();
    const updated = await store.answerChecklist(id, current.number, item, a);
    setData((d) =>
      typeof d === 'object'
        ? { ...d, rounds: d.rounds.map((r) => (r.number === updated.number ? updated : r)) }
        : d,
    );
    void regrade().catch((e: unknown) => setError(errorText(e)));
  };

  const recordViewing = async (conditions: ViewingConditions) => {
    if (!current) return;
    const store = await getStore();
    const updated = await store.recordViewing(id, current.number, conditions);
    setData((d) =>
      typeof d === 'object'
        ? { ...d, rounds: d.rounds.map((r) => (r.number === updated.number ? updated : r)) }
        : d,
    );
  };

  /** Saves an engineer's choice of fatigue detail (or clears it) with the seam's set-up, then grades again. */
  const overrideDetail = async (detail: DetailId | null) => {
    if (!seam.fatigue) return;
    const fatigue = { ...seam.fatigue };
    delete fatigue.detailOverride;
    const store = await getStore();
    const saved = await store.saveSeam({
      ...seam,
      fatigue: detail ? { ...fatigue, detailOverride: detail } : fatigue,
    });
    setData((d) => (typeof d === 'object' ? { ...d, rec: saved } : d));
    await regrade();
  };

  const startRound = async () => {
    const store = await getStore();
    const round = await store.startRound(id, 'afterRepair');
    setData((d) => (typeof d === 'object' ? { ...d, rounds: [...d.rounds, round] } : d));
    setSelected(round.number);
    await regrade();
  };

  return (
    <article class="seam" aria-labelledby="seam-title">
      <header class="seam-head">
        <h1 id="seam-title">
          {seam.label}
          {rec.namespace === 'demo' ? <span class="tag tag-demo">demo</span> : null}
        </h1>
        <p class="seam-meta">
          {seam.tags?.length ? <span>Tags: {seam.tags.join(', ')}</span> : null}
          {seam.drawing ? (
            <span>
              Drawing {seam.drawing}
              {seam.drawingPosition ? ` / ${seam.drawingPosition}` : ''}
            </span>
          ) : null}
        </p>
        <div class="actions">
          <a class="button primary big" href={hrefOf({ name: 'gauge', id })}>
            Gauge readings
          </a>
          <a class="button" href={hrefOf({ name: 'import', id })}>
            Import scanner file
          </a>
          <a class="button" href={hrefOf({ name: 'seamEdit', id })}>
            Edit set-up
          </a>
        </div>
        <LinkedTags seamId={id} />
      </header>

      <DecisionPanel decisions={decisions} unseen={unseen} />

      <div class="seam-top">
        {grade ? (
          <GradePanel grade={grade} />
        ) : graded && !graded.ok ? (
          <section class="panel" role="alert">
            <h2>This seam cannot be graded</h2>
            <p>The stored record has problems; fix the set-up or the readings named here:</p>
            <ul>
              {graded.problems.map((p) => (
                <li key={`${p.path}${p.message}`}>
                  {p.path}: {p.message}
                </li>
              ))}
            </ul>
          </section>
        ) : (
          <section class="panel" aria-busy="true">
            <h2>Seam result</h2>
            <p>Grading…</p>
          </section>
        )}
        <section class="panel" aria-labelledby="setup-title">
          <h2 id="setup-title">Set-up</h2>
          <SetupSummary seam={seam} />
          <a class="button" href={hrefOf({ name: 'seamEdit', id })}>
            Edit set-up
          </a>
        </section>
      </div>

      {graded?.ok ? (
        <Lazy
          load={loadAssessment}
          props={{
            assessment: graded.assessment,
            seamLength: seam.length,
            ...(seam.fatigue ? { onOverride: overrideDetail } : {}),
          }}
        />
      ) : null}

      <section class="panel" aria-labelledby="rounds-title">
        <h2 id="rounds-title">Rounds</h2>
        <div class="tabs" role="group" aria-label="Show a round of this seam">
          {sortedRounds.map((r) => {
            const on = r.number === current?.number;
            const g = grade?.rounds.find((x) => x.round === r.number);
            return (
              <button
                key={r.number}
                id={`round-tab-${r.number}`}
                type="button"
                aria-pressed={on}
                class={on ? 'tab tab-on' : 'tab'}
                onClick={() => setSelected(r.number)}
              >
                <span class="tab-title">
                  Round {r.number} · {ROUND_KIND_LABEL[r.kind] ?? r.kind}
                </span>
                <span class="tab-state">{roundState(g)}</span>
              </button>
            );
          })}
        </div>
        {current ? (
          <RoundDetail
            key={current.number}
            round={current}
            grade={grade?.rounds.find((x) => x.round === current.number)}
            seamLength={seam.length}
            latest={current.number === latest?.number}
            onAnswer={answer}
            onViewing={recordViewing}
          />
        ) : (
          <p>No round yet.</p>
        )}
        <StartRound next={(latest?.number ?? 0) + 1} onStart={startRound} />
      </section>

      <section class="panel" aria-labelledby="readings-title">
        <h2 id="readings-title">Readings ({readings.length})</h2>
        <ReadingList records={readings} />
      </section>
    </article>
  );
}
