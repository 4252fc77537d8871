import { useState } from 'preact/hooks';
import {
  CHECKLIST_ITEMS,
  CHECKLIST_LABEL,
  type ChecklistAnswerKind,
  type ChecklistGrade,
  type ChecklistItem,
  type Round,
} from '../../domain/index.js';
import type { ChecklistAnswer, RoundRecord } from '../../store/api.js';
import { ANSWER_LABEL, fmtLevel, fmtNumber } from './format.js';
import { NumberField } from './NumberField.js';
import { TextField } from './TextField.js';

export interface ChecklistPanelProps {
  readonly round: RoundRecord;
  readonly grade: ChecklistGrade | undefined;
  readonly seamLength: number;
  /** Absent for an earlier round: its answers are history and shown read-only. */
  readonly onAnswer?: (item: ChecklistItem, answer: ChecklistAnswer) => Promise<void>;
}

/** An answer as stored in a round (optional fields may be present as undefined). */
type StoredAnswer = Round['checklist'][ChecklistItem];

const SHAPE: Record<ChecklistAnswerKind, string> = { noneFound: '✓', present: '⚑', notAccessible: '⊘' };

function PresentForm(props: {
  readonly item: ChecklistItem;
  readonly seamLength: number;
  readonly initial: StoredAnswer;
  readonly onSave: (a: ChecklistAnswer) => void;
  readonly onCancel: () => void;
}) {
  const [position, setPosition] = useState<number | undefined>(props.initial?.position);
  const [note, setNote] = useState(props.initial?.note ?? '');
  const [error, setError] = useState<string | undefined>(undefined);
  const save = () => {
    if (position === undefined) return setError('say where along the seam it is, in mm from the start mark');
    if (position < 0 || position > props.seamLength)
      return setError(`must lie on the seam: 0 to ${fmtNumber(props.seamLength)} mm`);
    const a: ChecklistAnswer = note.trim()
      ? { answer: 'present', position, note: note.trim() }
      : { answer: 'present', position };
    props.onSave(a);
  };
  return (
    <div
      class="present-form"
      role="group"
      aria-label={`Where is the ${CHECKLIST_LABEL[props.item].toLowerCase()}?`}
    >
      <NumberField
        label="Position from the start mark"
        unit="mm"
        step={10}
        min={0}
        max={props.seamLength}
        value={position}
        onChange={(v) => {
          setPosition(v);
          setError(undefined);
        }}
        error={error}
      />
      <TextField label="Note" value={note} onChange={setNote} hint="e.g. size, which side, photo number" />
      <div class="actions">
        <button type="button" class="primary" onClick={save}>
          Save “present”
        </button>
        <button type="button" onClick={props.onCancel}>
          Cancel
        </button>
      </div>
    </div>
  );
}

function ItemRow(props: {
  readonly item: ChecklistItem;
  readonly answer: StoredAnswer;
  readonly grade: ChecklistGrade['items'][number] | undefined;
  readonly seamLength: number;
  readonly onAnswer: ChecklistPanelProps['onAnswer'];
}) {
  const { item, answer, grade } = props;
  const [asking, setAsking] = useState(false);
  const [saving, setSaving] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const label = CHECKLIST_LABEL[item];
  const send = async (a: ChecklistAnswer) => {
    if (!props.onAnswer) return;
    setSaving(true);
    setError(null);
    try {
      await props.onAnswer(item, a);
      setAsking(false);
    } catch (e) {
      setError(`not saved: ${e instanceof Error ? e.message : String(e)}`);
    } finally {
      setSaving(false);
    }
  };
  const tap = (kind: ChecklistAnswerKind) => {
    if (kind === 'present') setAsking(true);
    else void send({ answer: kind });
  };
  const headingId = `cl-${item}`;
  return (
    <li class={`cl-item cl-${answer?.answer ?? 'open'}`} aria-labelledby={headingId}>
      <div class="cl-head">
        <span id={headingId} class="cl-label">
          {label}
          {grade ? <span class="cl-ref"> (ISO 6520-1 {grade.ref})</span> : null}
        </span>
        <span class="cl-answer">
          {answer ? (
            <>
              <span aria-hidden="true">{SHAPE[answer.answer]} </span>
              {ANSWER_LABEL[answer.answer]}
              {answer.position !== undefined ? ` at ${fmtNumber(answer.position)} mm` : ''}
              {answer.note ? ` — ${answer.note}` : ''}
            </>
          ) : (
            <>
              <span aria-hidden="true">◌ </span>not answered
            </>
          )}
        </span>
      </div>
      {props.onAnswer ? (
        <div class="cl-buttons" role="group" aria-label={`Answer for ${label}`}>
          {(['noneFound', 'present', 'notAccessible'] as const).map((kind) => {
            const on = answer?.answer === kind;
            return (
              <button
                key={kind}
                type="button"
                class={on ? 'cl-btn cl-on' : 'cl-btn'}
                aria-pressed={on}
                disabled={saving}
                onClick={() => tap(kind)}
              >
                <span aria-hidden="true" class="cl-shape">
                  {on ? SHAPE[kind] : '○'}
                </span>{' '}
                {ANSWER_LABEL[kind]}
              </button>
            );
          })}
        </div>
      ) : null}
      {asking ? (
        <PresentForm
          item={item}
          seamLength={props.seamLength}
          initial={answer?.answer === 'present' ? answer : undefined}
          onSave={(a) => void send(a)}
          onCancel={() => setAsking(false)}
        />
      ) : null}
      {grade && grade.answer === 'present' ? (
        <p class={grade.meetsRequired ? 'cl-result' : 'cl-result cl-result-below'}>
          <span aria-hidden="true">{grade.meetsRequired ? '✓ ' : '✗ '}</span>
          Present: level met {fmtLevel(grade.levelMet)},{' '}
          {grade.meetsRequired ? `meets required ${grade.required}` : `below required ${grade.required}`}
          {grade.status === 'unverified' ? <span class="mark mark-unverified">unverified</span> : null}
          {grade.notes.length ? `. ${grade.notes.join('; ')}` : ''}
        </p>
      ) : null}
      {error ? (
        <p role="alert" class="help help-error">
          ⚠ {error}
        </p>
      ) : null}
    </li>
  );
}

/** The visual checklist of one round: one row per item, three one-tap answers, saved at once. */
export function ChecklistPanel({ round, grade, seamLength, onAnswer }: ChecklistPanelProps) {
  const answered = CHECKLIST_ITEMS.filter((i) => round.checklist[i] !== undefined).length;
  return (
    <div class="checklist">
      <p class={answered === CHECKLIST_ITEMS.length ? 'cl-progress' : 'cl-progress cl-progress-open'}>
        <span aria-hidden="true">{answered === CHECKLIST_ITEMS.length ? '■ ' : '◌ '}</span>
        {answered} of {CHECKLIST_ITEMS.length} answered
        {answered === CHECKLIST_ITEMS.length
          ? ': checklist complete'
          : ': the round stays incomplete until all are'}
      </p>
      <ul class="cl-list">
        {CHECKLIST_ITEMS.map((item) => (
          <ItemRow
            key={item}
            item={item}
            answer={round.checklist[item]}
            grade={grade?.items.find((g) => g.item === item)}
            seamLength={seamLength}
            onAnswer={onAnswer}
          />
        ))}
      </ul>
    </div>
  );
}
