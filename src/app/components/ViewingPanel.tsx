import { useState } from 'preact/hooks';
import { describeViewing, type ViewingConditions, type ViewingKind } from '../../domain/model/viewing.js';
import type { RoundRecord } from '../../store/api.js';
import { ChoiceGroup } from './ChoiceGroup.js';
import { NumberField } from './NumberField.js';
import { TextField } from './TextField.js';

const KINDS = [
  { value: 'direct', label: 'Direct (eye on the surface)' },
  { value: 'remote', label: 'Remote (borescope, camera)' },
] as const satisfies readonly { value: ViewingKind; label: string }[];

interface ViewingForm {
  readonly viewing: ViewingKind;
  readonly illuminanceLx: number | undefined;
  readonly distanceMm: number | undefined;
  readonly angleDeg: number | undefined;
  readonly lighting: string;
  readonly aids: string;
}

/** The form's values: numbers may be left empty, words trimmed; only what was given is kept. */
function conditionsOf(form: ViewingForm): ViewingConditions {
  return {
    viewing: form.viewing,
    ...(form.illuminanceLx !== undefined ? { illuminanceLx: Math.round(form.illuminanceLx) } : {}),
    ...(form.distanceMm !== undefined ? { distanceMm: form.distanceMm } : {}),
    ...(form.angleDeg !== undefined ? { angleDeg: form.angleDeg } : {}),
    ...(form.lighting.trim() ? { lighting: form.lighting.trim() } : {}),
    ...(form.aids.trim() ? { aids: form.aids.trim() } : {}),
  };
}

/**
 * How the round was looked at, for the inspection report: viewing, illuminance, distance, angle, lighting and
 * aids. Saving again corrects the earlier entry (both are kept in the history sent to the server).
 */
export function ViewingPanel(props: {
  readonly round: RoundRecord;
  /** Absent for an earlier round: shown, not changed. */
  readonly onSave?: (conditions: ViewingConditions) => Promise<void>;
}) {
  const saved = props.round.viewing;
  const [editing, setEditing] = useState(false);
  const [form, setForm] = useState<ViewingForm>({
    viewing: saved?.viewing ?? 'direct',
    illuminanceLx: saved?.illuminanceLx,
    distanceMm: saved?.distanceMm,
    angleDeg: saved?.angleDeg,
    lighting: saved?.lighting ?? '',
    aids: saved?.aids ?? '',
  });
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const onSave = props.onSave;
  // Every field edits one key of the form the same way; each field below names only its key.
  const bind = <K extends keyof ViewingForm>(key: K) => ({
    value: form[key],
    onChange: (value: ViewingForm[K]) => setForm({ ...form, [key]: value }),
  });
  const summary = <p class="viewing-summary">{saved ? describeViewing(saved) : 'Not recorded yet.'}</p>;
  if (!onSave || !editing)
    return (
      <div class="viewing-panel">
        {summary}
        {onSave ? (
          <button type="button" class="secondary" onClick={() => setEditing(true)}>
            {saved ? 'Correct the viewing conditions' : 'Record the viewing conditions'}
          </button>
        ) : null}
      </div>
    );
  const save = async () => {
    setBusy(true);
    setError(null);
    try {
      await onSave(conditionsOf(form));
      setEditing(false);
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    } finally {
      setBusy(false);
    }
  };
  return (
    <form
      class="viewing-panel"
      onSubmit={(e) => {
        e.preventDefault();
        void save();
      }}
    >
      {summary}
      <ChoiceGroup legend="Viewing" options={KINDS} {...bind('viewing')} />
      <NumberField
        label="Illuminance on the surface"
        unit="lx"
        step={50}
        min={0}
        max={200_000}
        {...bind('illuminanceLx')}
        hint="Measured with a light meter at the surface examined"
      />
      <NumberField
        label="Viewing distance"
        unit="mm"
        step={50}
        min={0}
        max={100_000}
        {...bind('distanceMm')}
      />
      <NumberField
        label="Viewing angle to the surface"
        unit="°"
        step={5}
        min={0}
        max={90}
        {...bind('angleDeg')}
      />
      <TextField label="Lighting" {...bind('lighting')} hint="e.g. daylight, hall lighting, hand lamp" />
      <TextField label="Aids" {...bind('aids')} hint="e.g. mirror, magnifier ×2, borescope" />
      {error ? (
        <p class="error" role="alert">
          {error}
        </p>
      ) : null}
      <button type="submit" disabled={busy}>
        Save the viewing conditions
      </button>
      <button type="button" class="secondary" onClick={() => setEditing(false)}>
        Cancel
      </button>
    </form>
  );
}
