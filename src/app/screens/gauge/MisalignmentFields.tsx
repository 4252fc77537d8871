import type { Seam } from '../../../domain/index.js';
import { NumberField } from '../../components/NumberField.js';
import { Choice } from './Choice.js';
import {
  describeOffset,
  offsetOf,
  signLinear,
  type AngularEntry,
  type GaugeSurface,
  type KinkDirection,
  type LinearEntry,
  type StepDirection,
} from './misalignment-entry.js';

/**
 * Linear misalignment in the inspector's words: which way plate 2 stands and by how much, and on unequal plates
 * which surface the gauge sat on. The signed value is worked out on save; the mid-plane offset it stands for is
 * shown back as a check.
 */
export function LinearMisalignmentFields(props: {
  readonly seam: Seam;
  readonly entry: LinearEntry;
  readonly onChange: (e: LinearEntry) => void;
  readonly step: number;
  readonly error?: string | undefined;
  readonly basisError?: string | undefined;
}) {
  const { seam, entry } = props;
  const t1 = seam.plate1.thickness;
  const t2 = seam.plate2.thickness;
  const unequal = t1 !== t2;
  const signed = signLinear(entry, t1, t2);
  const check =
    signed.ok === true ? describeOffset(offsetOf(signed.value.value, signed.value.basis, t1, t2)) : null;
  return (
    <fieldset class="gauge-group">
      <legend>Linear misalignment e</legend>
      <Choice<StepDirection>
        legend="Which way does plate 2 stand?"
        value={entry.direction}
        onChange={(direction) => props.onChange({ ...entry, direction })}
        options={[
          {
            value: 'towardFace',
            label: (
              <>
                Plate 2 stands proud toward the face side{' '}
                <span class="gauge-sub">(same as plate 1 toward the root side)</span>
              </>
            ),
          },
          {
            value: 'towardRoot',
            label: (
              <>
                Plate 2 stands proud toward the root side{' '}
                <span class="gauge-sub">(same as plate 1 toward the face side)</span>
              </>
            ),
          },
          { value: 'flush', label: 'Flush' },
        ]}
      />
      {unequal ? (
        <Choice<GaugeSurface>
          legend={`Where did the gauge sit? (plates ${t1} mm and ${t2} mm)`}
          value={entry.surface}
          onChange={(surface) => props.onChange({ ...entry, surface })}
          error={props.basisError}
          options={[
            { value: 'faceSurface', label: 'On the face surface' },
            { value: 'rootSurface', label: 'On the root surface' },
            { value: 'midPlane', label: 'It reads the mid-plane offset' },
          ]}
        />
      ) : null}
      {entry.direction === 'flush' ? null : (
        <NumberField
          label="Step, as read"
          unit="mm"
          name="linearMisalignment"
          step={props.step}
          min={0}
          max={100}
          value={entry.amount}
          onChange={(amount) => props.onChange({ ...entry, amount })}
          hint="a positive number; the choice above gives the direction"
          error={props.error}
        />
      )}
      {entry.direction === 'flush' && props.error ? <p class="help help-error">⚠ {props.error}</p> : null}
      {check ? (
        <p class="gauge-check" aria-live="polite">
          Check: {check}
        </p>
      ) : null}
    </fieldset>
  );
}

/** Angular misalignment: which way the joint peaks and by how many degrees. */
export function AngularMisalignmentFields(props: {
  readonly entry: AngularEntry;
  readonly onChange: (e: AngularEntry) => void;
  readonly step: number;
  readonly error?: string | undefined;
}) {
  const { entry } = props;
  return (
    <fieldset class="gauge-group">
      <legend>Angular misalignment β</legend>
      <Choice<KinkDirection>
        legend="Which way does the joint peak?"
        value={entry.direction}
        onChange={(direction) => props.onChange({ ...entry, direction })}
        options={[
          { value: 'peaksTowardFace', label: 'Peaks toward the face side' },
          { value: 'peaksTowardRoot', label: 'Peaks toward the root side' },
          { value: 'straight', label: 'Straight' },
        ]}
      />
      {entry.direction === 'straight' ? (
        props.error ? (
          <p class="help help-error">⚠ {props.error}</p>
        ) : null
      ) : (
        <NumberField
          label="Kink"
          unit="°"
          name="angularMisalignment"
          step={props.step}
          min={0}
          max={45}
          value={entry.amount}
          onChange={(amount) => props.onChange({ ...entry, amount })}
          hint="a positive number; the choice above gives the direction"
          error={props.error}
        />
      )}
    </fieldset>
  );
}
