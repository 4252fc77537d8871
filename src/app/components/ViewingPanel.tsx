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

/** The form's values: numbers may be left empty, words trimmed; only what was given is kept. */
function conditionsOf(form: {
  viewing: ViewingKind;
  illuminanceLx: number | undefined;
  distanceMm: number | undefined;
  angleDeg: number | undefined;
  lighting: string;
  aids: string;
}): ViewingConditions {
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
  const [form, setForm] = useState({
    viewing: saved?.viewing ?? ('direct' as ViewingKind),
    illuminanceLx: saved?.illuminanceLx,
    distanceMm: saved?.distanceMm,
    angleDeg: saved?.angleDeg,
    lighting: saved?.lighting ?? '',
    aids: saved?.aids ?? '',
  });
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const onSave = props.onSave;
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
      <ChoiceGroup
        legend="Viewing"
        options={KINDS}
        value={form.viewing}
        onChange={(viewing) => setForm({ ...form, viewing })}
      />
      <NumberField
        label="Illuminance on the surface"
        unit="lx"
        step={50}
        min={0}
        max={200_000}
        value={form.illuminanceLx}
        onChange={(illuminanceLx) => setForm({ ...form, illuminanceLx })}
        hint="Measured with a light meter at the surface examined"
      />
      <NumberField
        label="Viewing distance"
        unit="mm"
        step={50}
        min={0}
        value={form.distanceMm}
        onChange={(distanceMm) => setForm({ ...form, distanceMm })}
      />
      <NumberField
        label="Viewing angle to the surface"
        unit="°"
        step={5}
        min={0}
        max={90}
        value={form.angleDeg}
        onChange={(angleDeg) => setForm({ ...form, angleDeg })}
      />
      <TextField
        label="Lighting"
        value={form.lighting}
        onChange={(lighting) => setForm({ ...form, lighting })}
        hint="e.g. daylight, hall lighting, hand lamp"
      />
      <TextField
        label="Aids"
        value={form.aids}
        onChange={(aids) => setForm({ ...form, aids })}
        hint="e.g. mirror, magnifier ×2, borescope"
      />
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
