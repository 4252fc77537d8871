import { useEffect, useMemo, useRef, useState } from 'preact/hooks';
import type { ParameterName, Reading } from '../../../domain/index.js';
import { LevelBadge } from '../../components/LevelBadge.js';
import { parseDecimal } from '../../components/parse-decimal.js';
import { InstrumentPicker, InstrumentSetup } from './InstrumentPanel.js';
import { PositionPanel } from './PositionPanel.js';
import { ReadingGradeView } from './ReadingGradeView.js';
import { ReadingList } from './ReadingList.js';
import { ToePicker } from './ToePicker.js';
import { ValueFields } from './ValueFields.js';
import { readExaminer } from './examiner.js';
import {
  checkSetting,
  confirmKey,
  confirmedKeys,
  loadSettings,
  localDate,
  readingInstrument,
  saveSetting,
  settingFor,
  type InstrumentSetting,
} from './instrument-settings.js';
import {
  canRunAlong,
  fieldsFor,
  fieldsOfReading,
  instrumentDef,
  instrumentOfReading,
  instrumentsFor,
  needsSide,
  needsToe,
  type InstrumentKey,
} from './instruments.js';
import {
  angularEntryOf,
  EMPTY_ANGULAR,
  EMPTY_LINEAR,
  linearEntryOf,
  type AngularEntry,
  type LinearEntry,
} from './misalignment-entry.js';
import {
  afterSave as nextAfterSave,
  checkPitch,
  clampToSeam,
  defaultRun,
  goNext,
  resumePosition,
  setPosition,
  setSampling,
  toeOrder,
  type AfterSave,
  type Cursor,
} from './positions.js';
import { checkNewReading } from './problems.js';
import {
  buildReading,
  buildRestore,
  buildWithdrawal,
  draftValuesOf,
  newReadingId,
  type FieldProblems,
} from './reading-builder.js';
import { describeReading, whereAlong } from './reading-summary.js';
import {
  rememberAfterSave,
  rememberedAfterSave,
  rememberedInstrument,
  rememberInstrument,
  rememberedPitch,
  rememberPitch,
} from './remembered.js';
import { afterUndo, loadSession, planUndoIn, saveSession, withEntry, type SessionEntry } from './session.js';
import { sidesWithToes } from './joint-geometry.js';
import { noteEngagement } from '../../pwa/persistence.js';
import { useGrade } from './use-grade.js';
import type { SeamData } from './use-seam-data.js';

const message = (e: unknown): string => (e instanceof Error ? e.message : String(e));

type Values = Partial<Record<ParameterName, number>>;

/** The latest round: new readings belong to it. */
const latestRound = (data: SeamData): number => Math.max(...data.file.rounds.map((r) => r.number));

/** A number field holding text that is not a number keeps its last good value; such a form must not be saved. */
function untypedField(form: HTMLFormElement | null): HTMLInputElement | null {
  const inputs = form ? [...form.querySelectorAll<HTMLInputElement>('input[inputmode="decimal"]')] : [];
  return inputs.find((i) => i.value.trim() !== '' && parseDecimal(i.value) === null) ?? null;
}

/** The reading-entry form and its results, for a seam that has at least one round. */
export function GaugeEntry(props: {
  readonly data: SeamData;
  /** Reads what changed since `data` (after a save or an undo). */
  readonly refresh: () => Promise<SeamData | null>;
}) {
  const { data } = props;
  const { store, file } = data;
  const seam = file.seam;
  const seamId = data.record.id;
  const round = latestRound(data);
  const length = seam.length;

  // Instrument in the hand, set once per session.
  const available = useMemo(() => instrumentsFor(seam), [seam]);
  const [instrument, setInstrument] = useState<InstrumentKey>(() => {
    const last = rememberedInstrument(localStorage);
    return available.find((d) => d.key === last)?.key ?? available[0]?.key ?? 'toe';
  });
  const [settings, setSettings] = useState(() => loadSettings(localStorage));
  const [confirmed, setConfirmed] = useState(() => confirmedKeys(sessionStorage));
  const setting = settingFor(settings, instrument);
  const settingOk = Object.keys(checkSetting(instrument, setting, localDate(new Date()))).length === 0;
  const instrumentReady = confirmed.has(instrument) && settingOk;

  // Where along the seam and across it.
  const [pitch, setPitch] = useState<number | undefined>(() => rememberedPitch(localStorage));
  const [cursor, setCursor] = useState<Cursor>(() => {
    const at = clampToSeam(resumePosition(data.entryOrder, round), length);
    return { position: at, pitchPosition: at, sampling: 'atPitch', toe: { plate: 1, side: 'face' } };
  });
  const [positionBlank, setPositionBlank] = useState(false);
  const [nextNote, setNextNote] = useState<string | null>(null);
  const [runsAlong, setRunsAlong] = useState(false);
  const [run, setRun] = useState<{ start: number | undefined; end: number | undefined }>({
    start: undefined,
    end: undefined,
  });
  const [afterSave, setAfterSave] = useState<AfterSave>(() => rememberedAfterSave(localStorage));

  // The values being entered.
  const [values, setValues] = useState<Values>({});
  const [linear, setLinear] = useState<LinearEntry>(EMPTY_LINEAR);
  const [angular, setAngular] = useState<AngularEntry>(EMPTY_ANGULAR);
  const [problems, setProblems] = useState<FieldProblems>({});
  const [epoch, setEpoch] = useState(0);
  const [focusTick, setFocusTick] = useState(0);
  const [busy, setBusy] = useState(false);
  const [status, setStatus] = useState('');

  // A correction in progress: the reading it replaces, and where the at-pitch series stood before it.
  const [correction, setCorrection] = useState<{ target: Reading; saved: Cursor } | null>(null);
  const [sessionIds, setSessionIds] = useState<SessionEntry[]>(() => loadSession(sessionStorage, seamId));

  const formRef = useRef<HTMLFormElement>(null);
  const { shown, grade } = useGrade(store, seamId);

  // The seam's standing on opening, so the inspector sees where it stands before the first entry.
  useEffect(() => {
    void grade(file, round, 'Seam so far', null, false);
    // Graded once on opening; later grades follow each save and undo.
  }, []);

  useEffect(() => {
    if (focusTick === 0) return;
    const first = formRef.current?.querySelector<HTMLElement>(
      '.gauge-values input, .gauge-values .gauge-option',
    );
    first?.focus();
  }, [focusTick]);

  const target = correction?.target ?? null;
  const allFields = target ? fieldsOfReading(target) : fieldsFor(instrument, seam);
  const runsAlongPossible = allFields.some(canRunAlong);
  const fields = runsAlong ? allFields.filter(canRunAlong) : allFields;
  const toeMode = needsToe(fields) ? 'toe' : needsSide(fields) ? 'side' : null;
  const toes = toeOrder(sidesWithToes(seam));
  const resolutionMm = (target ? target.instrument.resolutionMm : setting.resolutionMm) ?? 0.1;
  const resolutionDeg = (target ? target.instrument.resolutionDeg : setting.resolutionDeg) ?? 1;
  const pitchError = checkPitch(pitch, length);

  // Readings a later one corrected or withdrew; the context keeps them by id, so nothing is recounted per save.
  const replacedCount = data.context.supersededBy.size;
  const undoPlan = planUndoIn(sessionIds, data.context);
  const sessionSet = useMemo(() => new Set(sessionIds.map((e) => e.id)), [sessionIds]);

  // A message goes as soon as the field it is about changes; the rest stay until the next save.
  const clearProblems = (...keys: (keyof FieldProblems)[]) =>
    setProblems((p) => {
      if (!keys.some((k) => k in p)) return p;
      return Object.fromEntries(
        Object.entries(p).filter(([k]) => !keys.includes(k as keyof FieldProblems) && k !== 'form'),
      ) as FieldProblems;
    });

  const clearEntry = () => {
    setValues({});
    setLinear((l) => ({ ...EMPTY_LINEAR, surface: l.surface }));
    setAngular(EMPTY_ANGULAR);
    setProblems({});
    setEpoch((n) => n + 1);
  };

  const chooseInstrument = (key: InstrumentKey) => {
    setInstrument(key);
    rememberInstrument(localStorage, key);
    setRunsAlong(false);
    clearEntry();
  };

  const confirmInstrument = (s: InstrumentSetting) => {
    setSettings(saveSetting(localStorage, instrument, s));
    setConfirmed(new Set(confirmKey(sessionStorage, instrument)));
    setFocusTick((n) => n + 1);
  };

  const editInstrument = () => {
    const next = new Set(confirmed);
    next.delete(instrument);
    setConfirmed(next);
  };

  const onNext = () => {
    if (pitch === undefined || pitchError) {
      setNextNote(`Set the pitch first: ${pitchError ?? ''}`);
      return;
    }
    const step = goNext(cursor, pitch, length);
    setCursor(step);
    setPositionBlank(false);
    setNextNote(
      step.atEnd
        ? `Already at the end of the seam (${length} mm).`
        : step.clamped
          ? `Stopped at the end of the seam (${length} mm): the pitch would pass it.`
          : `Position ${step.position} mm.`,
    );
  };

  const toggleRunsAlong = (on: boolean) => {
    setRunsAlong(on);
    if (on) {
      const r = defaultRun(cursor.position, pitch ?? 50, length);
      setRun(r);
    }
    setProblems({});
  };

  const startCorrection = (r: Reading) => {
    setCorrection({ target: r, saved: correction?.saved ?? cursor });
    const key = instrumentOfReading(r);
    if (key && available.some((d) => d.key === key)) setInstrument(key);
    setValues(draftValuesOf(r));
    const { plate1, plate2 } = seam;
    setLinear(
      r.values.linearMisalignment === undefined
        ? EMPTY_LINEAR
        : linearEntryOf(r.values.linearMisalignment, r.misalignmentBasis, plate1.thickness, plate2.thickness),
    );
    setAngular(
      r.values.angularMisalignment === undefined
        ? EMPTY_ANGULAR
        : angularEntryOf(r.values.angularMisalignment),
    );
    const along = r.start !== undefined && r.end !== undefined;
    setRunsAlong(along);
    setRun({ start: r.start, end: r.end });
    const side = r.toe?.side ?? r.side ?? cursor.toe.side;
    setCursor({
      position: r.position ?? cursor.position,
      pitchPosition: cursor.pitchPosition,
      sampling: r.sampling,
      toe: { plate: r.toe?.plate ?? cursor.toe.plate, side },
    });
    setPositionBlank(false);
    setProblems({});
    setEpoch((n) => n + 1);
    setStatus(`Correcting the reading ${describeReading(r, seam)}.`);
    formRef.current?.scrollIntoView({ block: 'start' });
    setFocusTick((n) => n + 1);
  };

  const cancelCorrection = () => {
    if (correction) setCursor(correction.saved);
    setCorrection(null);
    setRunsAlong(false);
    clearEntry();
    setStatus('Correction cancelled; nothing was saved.');
  };

  const stamp = () => ({
    id: newReadingId(() => crypto.randomUUID()),
    recordedAt: new Date().toISOString(),
    examiner: readExaminer(localStorage),
  });

  const save = async () => {
    if (busy) return;
    const bad = untypedField(formRef.current);
    if (bad) {
      setProblems({ form: 'a field holds text that is not a number: fix the field marked ⚠' });
      bad.focus();
      return;
    }
    if (!target && !instrumentReady) {
      setProblems({
        instrument: `set and confirm the ${instrumentDef(instrument).name.toLowerCase()} first`,
      });
      document.getElementById('gauge-instrument')?.scrollIntoView({ block: 'start' });
      return;
    }
    const s = stamp();
    const built = buildReading(
      {
        fields,
        values,
        linear,
        angular,
        where: cursor.toe,
        runsAlong,
        position: positionBlank ? undefined : cursor.position,
        start: run.start,
        end: run.end,
        sampling: cursor.sampling,
      },
      {
        ...s,
        round: target?.round ?? round,
        seam,
        instrument: target ? target.instrument : readingInstrument(instrument, setting),
        supersedes: target?.id,
      },
    );
    const found = built.ok ? checkNewReading(data.context, built.reading) : built.problems;
    if (!built.ok || Object.keys(found).length) {
      setProblems(found);
      setStatus('Not saved: see the messages by the fields.');
      const firstBad = formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]');
      (firstBad ?? formRef.current?.querySelector<HTMLElement>('.gauge-form-problem'))?.focus();
      return;
    }
    const reading = built.reading;
    setBusy(true);
    try {
      await store.appendReading(seamId, reading);
    } catch (e) {
      setBusy(false);
      setProblems({ form: `Not saved (${message(e)}). What you typed is still here: try Save again.` });
      setStatus('Not saved.');
      return;
    }
    // The inspector has done real work here: ask the browser, once, to keep this device's data.
    void noteEngagement().catch(() => undefined);
    const ids = withEntry(sessionIds, { id: reading.id, correction: target !== null });
    setSessionIds(ids);
    saveSession(sessionStorage, seamId, ids);
    // Where the next entry goes.
    if (correction) {
      setCursor(correction.saved);
      setCorrection(null);
    } else if (pitch !== undefined && !pitchError) {
      const next = nextAfterSave(
        { ...cursor, position: reading.position ?? cursor.position },
        afterSave,
        pitch,
        length,
        toes,
      );
      setCursor(next);
      setNextNote(next.atEnd ? `End of the seam (${length} mm) reached.` : null);
    }
    setPositionBlank(false);
    setRunsAlong(false);
    clearEntry();
    setBusy(false);
    setFocusTick((n) => n + 1);
    const what = `${target ? 'Correction saved' : 'Saved'}: ${describeReading(reading, seam)}.`;
    setStatus(`${what} Grading…`);
    const fresh = await props.refresh();
    if (!fresh) return;
    await grade(
      fresh.file,
      reading.round,
      target ? 'Correction saved' : 'Reading saved',
      reading,
      true,
      // Said together with the grade, so both reach the screen in one render.
      (text) => setStatus(`${what} ${text}.`),
    );
  };

  const undo = async () => {
    if (busy) return;
    const plan = planUndoIn(sessionIds, data.context);
    if (plan.kind === 'nothing') {
      setStatus(`Nothing to undo: ${plan.reason}.`);
      return;
    }
    const s = stamp();
    const rec =
      plan.kind === 'withdraw'
        ? buildWithdrawal(plan.target, s)
        : buildRestore(plan.original, plan.target, s);
    const found = checkNewReading(data.context, rec);
    if (Object.keys(found).length) {
      setProblems({ form: `Undo refused: ${Object.values(found).join('; ')}` });
      return;
    }
    setBusy(true);
    try {
      await store.appendReading(seamId, rec);
    } catch (e) {
      setBusy(false);
      setProblems({ form: `Undo not saved (${message(e)}). Try again.` });
      return;
    }
    const ids = afterUndo(sessionIds, plan, rec.id);
    setSessionIds(ids);
    saveSession(sessionStorage, seamId, ids);
    setBusy(false);
    // A withdrawn entry is usually one to take again: go back to where it was.
    const back = plan.kind === 'withdraw' ? plan.target : null;
    if (back?.position !== undefined) {
      setCursor({
        position: back.position,
        pitchPosition: back.sampling === 'atPitch' ? back.position : cursor.pitchPosition,
        sampling: back.sampling,
        toe: back.toe ?? cursor.toe,
      });
      setPositionBlank(false);
      setNextNote(`Back at ${back.position} mm, where the withdrawn entry was.`);
      setFocusTick((n) => n + 1);
    }
    const what =
      plan.kind === 'withdraw'
        ? `Withdrawn (kept on record): ${describeReading(plan.target, seam)}.`
        : `Correction undone; the earlier values count again: ${describeReading(plan.original, seam)}.`;
    setStatus(`${what} Grading…`);
    const fresh = await props.refresh();
    if (!fresh) return;
    const said = await grade(
      fresh.file,
      plan.target.round,
      plan.kind === 'withdraw' ? 'Last entry withdrawn' : 'Correction undone',
      plan.kind === 'withdraw' ? null : rec,
      true,
      (text) => setStatus(`${what} ${text}.`),
    );
    if (said === null) setStatus(what);
  };

  const onSubmit = (e: Event) => {
    e.preventDefault();
    void save();
  };

  const where = cursor.toe;
  const toeHint =
    toeMode === 'toe' && needsSide(fields)
      ? 'The toe counts for toe values; the side of the chosen toe counts for side values.'
      : undefined;

  return (
    <div class="gauge-layout">
      <div class="gauge-main">
        {target ? (
          <div class="gauge-correcting" role="region" aria-label="Correction">
            <p>
              <strong>Correcting</strong> (round {target.round}): {describeReading(target, seam)}
            </p>
            <p class="help">
              Saving records a new reading that replaces this one; the original stays on record. Instrument
              kept: {target.instrument.id}.
            </p>
            <button type="button" onClick={cancelCorrection}>
              Cancel correction
            </button>
          </div>
        ) : (
          <section id="gauge-instrument" class="gauge-card" aria-label="Instrument">
            <InstrumentPicker seam={seam} value={instrument} onChange={chooseInstrument} />
            <InstrumentSetup
              key={`${instrument}-${instrumentReady ? 'ok' : 'open'}`}
              instrument={instrument}
              setting={setting}
              confirmed={instrumentReady}
              onConfirm={confirmInstrument}
              onEdit={editInstrument}
            />
            {problems.instrument ? <p class="help help-error">⚠ {problems.instrument}</p> : null}
          </section>
        )}
        <form ref={formRef} class="gauge-form" onSubmit={onSubmit} aria-label="Reading" noValidate>
          {problems.form ? (
            <p class="gauge-form-problem" role="alert" tabIndex={-1}>
              ⚠ {problems.form}
            </p>
          ) : null}
          <PositionPanel
            length={length}
            position={positionBlank ? undefined : cursor.position}
            onPosition={(x) => {
              clearProblems('position');
              setPositionBlank(x === undefined);
              if (x !== undefined) setCursor(setPosition(cursor, x, length));
            }}
            pitch={pitch}
            onPitch={(x) => {
              setPitch(x);
              if (x !== undefined && !checkPitch(x, length)) rememberPitch(localStorage, x);
            }}
            pitchError={pitchError}
            onNext={onNext}
            nextNote={nextNote}
            sampling={cursor.sampling}
            onSampling={(sm) => setCursor(setSampling(cursor, sm))}
            runsAlong={runsAlongPossible ? runsAlong : null}
            onRunsAlong={toggleRunsAlong}
            start={run.start}
            end={run.end}
            onStart={(x) => {
              clearProblems('start', 'end');
              setRun({ ...run, start: x });
            }}
            onEnd={(x) => {
              clearProblems('start', 'end');
              setRun({ ...run, end: x });
            }}
            afterSave={afterSave}
            onAfterSave={(a) => {
              setAfterSave(a);
              rememberAfterSave(localStorage, a);
            }}
            toeMode={toeMode === 'toe'}
            problems={problems}
            correcting={target !== null}
          />
          {toeMode ? (
            <ToePicker
              seam={seam}
              where={where}
              mode={toeMode}
              onChange={(w) => {
                setCursor({ ...cursor, toe: w });
                clearProblems('where');
              }}
              error={problems.where}
              hint={toeHint}
            />
          ) : null}
          <fieldset class="gauge-group" key={epoch}>
            <legend>
              {target ? 'Corrected values' : `${instrumentDef(instrument).name} readings`}{' '}
              <span class="gauge-sub">
                steps {resolutionMm} mm
                {fields.some((f) => f === 'toeAngle' || f === 'angularMisalignment')
                  ? ` / ${resolutionDeg}°`
                  : ''}
              </span>
            </legend>
            {!fields.length ? <p>This instrument reads nothing on this joint.</p> : null}
            <ValueFields
              seam={seam}
              fields={fields}
              side={where.side}
              values={values}
              onValue={(name, v) => {
                clearProblems(name);
                setValues((prev) => {
                  const rest = Object.entries(prev).filter(([k]) => k !== name);
                  return Object.fromEntries(v === undefined ? rest : [...rest, [name, v]]) as Values;
                });
              }}
              linear={linear}
              onLinear={(e) => {
                setLinear(e);
                clearProblems('linearMisalignment', 'misalignmentBasis');
              }}
              angular={angular}
              onAngular={(e) => {
                setAngular(e);
                clearProblems('angularMisalignment');
              }}
              resolutionMm={resolutionMm}
              resolutionDeg={resolutionDeg}
              problems={problems}
            />
          </fieldset>
          <div class="gauge-actions">
            <button type="submit" class="gauge-primary" aria-disabled={busy ? 'true' : 'false'}>
              {target ? 'Save correction' : 'Save reading'} <span class="gauge-sub">(Enter)</span>
            </button>
            {target ? null : (
              <button
                type="button"
                class="gauge-undo"
                onClick={() => void undo()}
                aria-label={
                  undoPlan.kind === 'nothing'
                    ? 'Undo last entry: nothing to undo'
                    : `Undo last entry: ${describeReading(undoPlan.target, seam)}`
                }
                aria-disabled={undoPlan.kind === 'nothing' || busy ? 'true' : 'false'}
                title={undoPlan.kind === 'nothing' ? undoPlan.reason : undefined}
              >
                Undo last entry
                {undoPlan.kind === 'nothing' ? null : (
                  <span class="gauge-sub"> ({whereAlong(undoPlan.target)})</span>
                )}
              </button>
            )}
          </div>
          <p class="gauge-status" role="status" aria-live="polite">
            {status}
          </p>
          {!target && shown?.grade?.levelMet ? (
            <p class="gauge-last">
              This reading:{' '}
              <LevelBadge levelMet={shown.grade.levelMet} required={shown.required ?? undefined} />{' '}
              {/* A button, not an in-page link: the app routes by the location hash. */}
              <button
                type="button"
                onClick={() => {
                  const h = document.getElementById('gauge-result-title');
                  h?.scrollIntoView({ block: 'start' });
                }}
              >
                Details
              </button>
            </p>
          ) : null}
        </form>
      </div>
      <aside class="gauge-side" aria-label="Results and readings">
        {shown ? (
          <ReadingGradeView
            seam={seam}
            heading={shown.heading}
            reading={shown.reading}
            grade={shown.grade}
            soFar={shown.soFar}
            required={shown.required}
            pending={shown.pending}
            error={shown.error}
          />
        ) : null}
        <ReadingList
          seam={seam}
          entryOrder={data.entryOrder}
          supersededBy={data.context.supersededBy}
          counting={data.context.counting}
          replacedCount={replacedCount}
          sessionIds={sessionSet}
          correctingId={target?.id ?? null}
          onCorrect={startCorrection}
        />
      </aside>
    </div>
  );
}
