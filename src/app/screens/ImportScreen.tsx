import { proxy } from 'comlink';
import { useEffect, useRef, useState } from 'preact/hooks';
import type { Inspection } from '../../domain/import/index.js';
import type { Seam } from '../../domain/index.js';
import { uuidv7 } from '../../store/index.js';
import type { ImportProgress, ReadOutcome } from '../../../workers/import-api.js';
import { hrefOf, navigate } from '../router.js';
import { startImportWorker, type ImportWorker } from '../services/import-worker.js';
import { getStore } from '../services/store.js';
import {
  choicesFrom,
  mappingFrom,
  rateText,
  TARGET_OPTIONS,
  targetLabel,
  type ColumnChoice,
} from './import/import-view.js';
import { loadProfiles, saveProfile } from './import/saved-mappings.js';
import './import.css';

type Kind = 'table' | 'profiles';
type Step =
  | { readonly name: 'pick' }
  | { readonly name: 'mapping'; readonly file: File; readonly inspection: Extract<Inspection, { ok: true }> }
  | {
      readonly name: 'reading';
      readonly file: File;
      readonly progress: ImportProgress;
      readonly started: number;
    }
  | {
      readonly name: 'review';
      readonly file: File;
      readonly outcome: ReadOutcome;
      readonly importId: string;
      readonly signature?: string;
    }
  | { readonly name: 'done'; readonly count: number; readonly quarantined: number; readonly sha256: string };

const UNITS = ['', 'mm', 'um', 'inch', 'm', 'deg', 'rad'] as const;
const errorText = (e: unknown) => (e instanceof Error ? e.message : String(e));

export default function ImportScreen({ id }: { readonly id: string }) {
  const [seam, setSeam] = useState<Seam | null>(null);
  const [round, setRound] = useState(1);
  const [kind, setKind] = useState<Kind>('table');
  const [step, setStep] = useState<Step>({ name: 'pick' });
  const [choices, setChoices] = useState<ColumnChoice[]>([]);
  const [error, setError] = useState<string | null>(null);
  const [position, setPosition] = useState('');
  const worker = useRef<ImportWorker | null>(null);

  useEffect(() => {
    void getStore().then(async (s) => {
      const rec = await s.getSeam(id);
      const rounds = await s.listRounds(id);
      setSeam(rec?.seam ?? null);
      setRound(rounds.reduce((m, r) => Math.max(m, r.number), 1));
    });
    return () => worker.current?.end();
  }, [id]);

  const ensureWorker = () => (worker.current ??= startImportWorker());
  const endWorker = () => {
    worker.current?.end();
    worker.current = null;
  };
  const reset = () => {
    endWorker();
    setError(null);
    setStep({ name: 'pick' });
  };

  async function onPick(file: File | undefined) {
    if (!file) return;
    setError(null);
    if (kind === 'profiles') return read(file);
    try {
      const inspection = await ensureWorker().api.inspect(file, loadProfiles());
      if (!inspection.ok) {
        setStep({
          name: 'review',
          file,
          outcome: { kind: 'refused', message: inspection.message, bytes: file.size },
          importId: '',
        });
        endWorker();
        return;
      }
      setChoices(
        choicesFrom(
          inspection.suggested,
          inspection.layout.columns.map((c) => c.name),
        ),
      );
      setStep({ name: 'mapping', file, inspection });
    } catch (e) {
      setError(errorText(e));
    }
  }

  async function read(file: File, inspection?: Extract<Inspection, { ok: true }>) {
    if (!seam) return;
    const importId = uuidv7();
    const context = { importId, seam, round, recordedAt: new Date().toISOString() };
    const started = performance.now();
    setStep({ name: 'reading', file, progress: { bytes: 0, size: file.size, items: 0 }, started });
    const onProgress = proxy((progress: ImportProgress) =>
      setStep((s) => (s.name === 'reading' ? { ...s, progress } : s)),
    );
    try {
      const api = ensureWorker().api;
      const outcome = inspection
        ? await api.readTable(file, mappingFrom(inspection.suggested, choices), context, onProgress)
        : await api.readProfiles(file, context, position === '' ? undefined : Number(position), onProgress);
      setStep({
        name: 'review',
        file,
        outcome,
        importId,
        ...(inspection ? { signature: inspection.signature } : {}),
      });
    } catch (e) {
      // A cancelled read ends its worker: the call rejects, and the screen is already back at the start.
      setError((s) => s ?? errorText(e));
    } finally {
      endWorker();
    }
  }

  async function store(s: Extract<Step, { name: 'review' }>) {
    const o = s.outcome;
    if (o.kind !== 'read') return;
    try {
      const st = await getStore();
      await st.appendImport(
        id,
        {
          importId: s.importId,
          seamId: id,
          kind,
          fileName: s.file.name,
          bytes: o.bytes,
          sha256: o.sha256,
          encoding: o.encoding,
          ...(o.mapping ? { mapping: JSON.stringify(o.mapping) } : {}),
          readingCount: o.readings.length,
          quarantined: o.quarantined,
          quarantineSample: o.quarantine.slice(0, 50).map(({ line, reason }) => ({ line, reason })),
          importedAt: '',
        },
        o.readings,
      );
      if (o.mapping && s.signature) saveProfile(s.signature, o.mapping);
      setStep({ name: 'done', count: o.readings.length, quarantined: o.quarantined, sha256: o.sha256 });
    } catch (e) {
      setError(errorText(e));
    }
  }

  if (!seam) return <p aria-busy="true">Loading the seam…</p>;
  return (
    <section class="import">
      <p>
        <a href={hrefOf({ name: 'seam', id })}>← {seam.label}</a>
      </p>
      <h1>Import a scanner file</h1>
      {error ? (
        <p role="alert" class="banner banner-bad">
          ⚠ {error}
        </p>
      ) : null}

      {step.name === 'pick' ? (
        <div class="panel">
          <fieldset>
            <legend>What the scanner exported</legend>
            <label>
              <input type="radio" name="kind" checked={kind === 'table'} onChange={() => setKind('table')} />{' '}
              A table of weld parameters (CSV, TSV, semicolons)
            </label>
            <label>
              <input
                type="radio"
                name="kind"
                checked={kind === 'profiles'}
                onChange={() => setKind('profiles')}
              />{' '}
              Raw profiles (x, z points per slice)
            </label>
          </fieldset>
          {kind === 'profiles' ? (
            <label>
              Position of a single profile, mm (files with a slice column carry their own)
              <input
                inputMode="decimal"
                value={position}
                onInput={(e) => setPosition(e.currentTarget.value)}
              />
            </label>
          ) : null}
          <label class="file-pick">
            Choose the file
            <input
              type="file"
              accept=".csv,.tsv,.txt,.dat,text/csv,text/plain"
              onChange={(e) => void onPick(e.currentTarget.files?.[0])}
            />
          </label>
          <p class="hint">
            Nothing is stored until you have seen what was read and what was set aside, and decided. Readings
            go into round {round}.
          </p>
        </div>
      ) : null}

      {step.name === 'mapping' ? (
        <div class="panel">
          <h2>Columns of {step.file.name}</h2>
          <p>
            {step.inspection.fromProfile
              ? 'Mapped from the profile saved for this scanner’s columns. '
              : 'Mapped from the column names: check each column. '}
            Separated by{' '}
            {step.inspection.layout.delimiter === '\t' ? 'tabs' : `"${step.inspection.layout.delimiter}"`},
            decimal mark "{step.inspection.layout.decimal}", {step.inspection.encoding}
            {step.inspection.layout.header ? ', with a header' : ', no header'}.
          </p>
          <div class="table-scroll">
            <table class="mapping">
              <thead>
                <tr>
                  {step.inspection.layout.columns.map((c, i) => (
                    <th key={c.index} scope="col">
                      <span>{c.name}</span>
                      <select
                        aria-label={`Column ${c.index} (${c.name}) holds`}
                        value={choices[i]?.target ?? ''}
                        onChange={(e) => {
                          const next = [...choices];
                          next[i] = {
                            target: e.currentTarget.value as ColumnChoice['target'],
                            unit: next[i]?.unit ?? '',
                          };
                          setChoices(next);
                        }}
                      >
                        <option value="">— not used —</option>
                        {TARGET_OPTIONS.map((t) => (
                          <option key={t} value={t}>
                            {targetLabel(t)}
                          </option>
                        ))}
                      </select>
                      <select
                        aria-label={`Unit of column ${c.index}`}
                        value={choices[i]?.unit ?? ''}
                        onChange={(e) => {
                          const next = [...choices];
                          next[i] = {
                            target: next[i]?.target ?? '',
                            unit: e.currentTarget.value as ColumnChoice['unit'],
                          };
                          setChoices(next);
                        }}
                      >
                        {UNITS.map((u) => (
                          <option key={u} value={u}>
                            {u === '' ? `unit: ${c.unit ?? 'as detected'}` : u}
                          </option>
                        ))}
                      </select>
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {step.inspection.layout.preview.slice(0, 8).map((r) => (
                  <tr key={r.line}>
                    {step.inspection.layout.columns.map((c) => (
                      <td key={c.index}>{r.cells[c.index - 1] ?? ''}</td>
                    ))}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <div class="actions">
            <button
              type="button"
              class="button primary big"
              onClick={() => void read(step.file, step.inspection)}
            >
              Read the file
            </button>
            <button type="button" class="button" onClick={reset}>
              Choose another file
            </button>
          </div>
        </div>
      ) : null}

      {step.name === 'reading' ? (
        <div class="panel" aria-live="polite">
          <h2>Reading {step.file.name}…</h2>
          <progress max={step.progress.size || 1} value={step.progress.bytes} aria-label="Read so far" />
          <p>
            {(step.progress.bytes / 1e6).toFixed(1)} of {(step.progress.size / 1e6).toFixed(1)} MB,{' '}
            {step.progress.items.toLocaleString('en')} {kind === 'table' ? 'rows' : 'slices'}{' '}
            {rateText(step.progress.items, step.progress.bytes, performance.now() - step.started)}
          </p>
          <button type="button" class="button" onClick={reset}>
            Cancel
          </button>
        </div>
      ) : null}

      {step.name === 'review' ? (
        <Review step={step} kind={kind} onImport={() => void store(step)} onDiscard={reset} />
      ) : null}

      {step.name === 'done' ? (
        <div class="panel" role="status">
          <h2>
            Imported {step.count} reading{step.count === 1 ? '' : 's'}
          </h2>
          <p>
            {step.quarantined ? `${step.quarantined} set aside, not imported. ` : ''}File SHA-256{' '}
            <code>{step.sha256}</code> is kept with the import.
          </p>
          <div class="actions">
            <button type="button" class="button primary big" onClick={() => navigate({ name: 'seam', id })}>
              See the graded seam
            </button>
            <button type="button" class="button" onClick={reset}>
              Import another file
            </button>
          </div>
        </div>
      ) : null}
    </section>
  );
}

function Review(props: {
  readonly step: Extract<Step, { name: 'review' }>;
  readonly kind: Kind;
  readonly onImport: () => void;
  readonly onDiscard: () => void;
}) {
  const o = props.step.outcome;
  if (o.kind === 'refused') {
    return (
      <div class="panel" role="alert">
        <h2>The file was refused</h2>
        <p class="refusal">
          {o.line ? `Line ${o.line}: ` : ''}
          {o.message}
        </p>
        <p>Nothing was stored.</p>
        <button type="button" class="button" onClick={props.onDiscard}>
          Choose another file
        </button>
      </div>
    );
  }
  const what = props.kind === 'table' ? 'rows' : 'slices';
  return (
    <div class="panel">
      <h2>What was read</h2>
      <p class="read-summary">
        {o.readings.length} reading{o.readings.length === 1 ? '' : 's'} ready from {o.items} {what};{' '}
        <strong>
          {o.quarantined} {what} set aside
        </strong>
        .
      </p>
      {o.quarantine.length ? (
        <>
          <h3>Set aside, with the reason</h3>
          <ul class="quarantine">
            {o.quarantine.slice(0, 100).map((q) => (
              <li key={`${q.line}-${q.reason}`}>
                Line {q.line}: {q.reason}
              </li>
            ))}
          </ul>
          {o.quarantine.length > 100 ? <p>… and {o.quarantined - 100} more.</p> : null}
        </>
      ) : null}
      <p class="hint">
        Importing adds the {o.readings.length} readings to the seam and keeps the file's hash with them;{' '}
        {o.quarantined ? `the ${o.quarantined} ${what} set aside are not imported. ` : ''}Nothing is stored
        until you choose.
      </p>
      <div class="actions">
        <button
          type="button"
          class="button primary big"
          disabled={!o.readings.length}
          onClick={props.onImport}
        >
          Import {o.readings.length} reading{o.readings.length === 1 ? '' : 's'}
          {o.quarantined ? `, leave ${o.quarantined} ${what} out` : ''}
        </button>
        <button type="button" class="button" onClick={props.onDiscard}>
          Discard
        </button>
      </div>
    </div>
  );
}
