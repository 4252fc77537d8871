import type { Reading } from '../../../domain/index.js';
import { NumberField } from '../../components/NumberField.js';
import { Choice, Toggle } from './Choice.js';
import type { AfterSave } from './positions.js';
import type { FieldProblems } from './reading-builder.js';

/** Where along the seam: the position (or a start and end), the pitch and one tap to the next position. */
export function PositionPanel(props: {
  readonly length: number;
  readonly position: number | undefined;
  readonly onPosition: (x: number | undefined) => void;
  readonly pitch: number | undefined;
  readonly onPitch: (x: number | undefined) => void;
  readonly pitchError: string | null;
  readonly onNext: () => void;
  readonly nextNote: string | null;
  readonly sampling: Reading['sampling'];
  readonly onSampling: (s: Reading['sampling']) => void;
  /** Null when none of the fields on screen can run along the seam. */
  readonly runsAlong: boolean | null;
  readonly onRunsAlong: (on: boolean) => void;
  readonly start: number | undefined;
  readonly end: number | undefined;
  readonly onStart: (x: number | undefined) => void;
  readonly onEnd: (x: number | undefined) => void;
  readonly afterSave: AfterSave;
  readonly onAfterSave: (a: AfterSave) => void;
  readonly toeMode: boolean;
  readonly problems: FieldProblems;
  readonly correcting: boolean;
}) {
  const { length, problems } = props;
  const within = `0 to ${length} mm from the start mark`;
  return (
    <fieldset class="gauge-group gauge-position">
      <legend>Where along the seam</legend>
      <Choice<Reading['sampling']>
        compact
        legend="Sampling"
        value={props.sampling}
        onChange={props.onSampling}
        options={[
          { value: 'atPitch', label: 'At pitch' },
          { value: 'targeted', label: 'Targeted (looks worst)' },
        ]}
      />
      {props.runsAlong ? (
        <div class="gauge-pair">
          <NumberField
            label="Starts at"
            unit="mm"
            name="start"
            step={1}
            min={0}
            max={length}
            value={props.start}
            onChange={props.onStart}
            hint={within}
            error={problems.start}
          />
          <NumberField
            label="Ends at"
            unit="mm"
            name="end"
            step={1}
            min={0}
            max={length}
            value={props.end}
            onChange={props.onEnd}
            hint={within}
            error={problems.end}
          />
        </div>
      ) : (
        <div class="gauge-position-row">
          <NumberField
            label="Position"
            unit="mm"
            name="position"
            step={1}
            min={0}
            max={length}
            value={props.position}
            onChange={props.onPosition}
            hint={within}
            error={problems.position}
          />
          {props.correcting ? null : (
            <button type="button" class="gauge-next" onClick={props.onNext}>
              Next position <span class="gauge-sub">+{props.pitch ?? '?'} mm</span>
            </button>
          )}
        </div>
      )}
      {props.nextNote ? (
        <p class="gauge-note" role="status">
          {props.nextNote}
        </p>
      ) : null}
      {props.runsAlong === null ? null : (
        <Toggle
          label="Runs along the seam (start and end)"
          pressed={props.runsAlong}
          onChange={props.onRunsAlong}
        />
      )}
      {props.correcting ? null : (
        <details class="gauge-more">
          <summary>
            Pitch {props.pitch ?? '—'} mm · after saving: {afterSaveWords(props.afterSave)}
          </summary>
          <NumberField
            label="Pitch"
            unit="mm"
            name="pitch"
            step={5}
            min={1}
            max={length}
            value={props.pitch}
            onChange={props.onPitch}
            hint="spacing of at-pitch readings"
            error={props.pitchError ?? undefined}
          />
          <Choice<AfterSave>
            compact
            legend="After saving"
            value={props.afterSave}
            onChange={props.onAfterSave}
            options={[
              { value: 'nextPosition', label: 'Go to the next position' },
              ...(props.toeMode
                ? [{ value: 'nextToe' as const, label: 'Next toe, then next position' }]
                : []),
              { value: 'stay', label: 'Stay here' },
            ]}
          />
        </details>
      )}
    </fieldset>
  );
}

const afterSaveWords = (a: AfterSave): string =>
  a === 'nextPosition' ? 'next position' : a === 'nextToe' ? 'next toe' : 'stay here';
