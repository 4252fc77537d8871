import { useId, useState } from 'preact/hooks';
import type { Seam } from '../../../domain/index.js';
import { NumberField } from '../../components/NumberField.js';
import { Choice } from './Choice.js';
import { instrumentDef, instrumentsFor, type InstrumentKey } from './instruments.js';
import { checkSetting, localDate, type InstrumentSetting } from './instrument-settings.js';

/** Which instrument is in the hand. */
export function InstrumentPicker(props: {
  readonly seam: Seam;
  readonly value: InstrumentKey;
  readonly onChange: (key: InstrumentKey) => void;
}) {
  return (
    <Choice<InstrumentKey>
      class="gauge-instruments"
      legend="Instrument in your hand"
      value={props.value}
      onChange={props.onChange}
      options={instrumentsFor(props.seam).map((d) => ({
        value: d.key,
        label: (
          <>
            {d.name} <span class="gauge-sub">{d.reads}</span>
          </>
        ),
      }))}
    />
  );
}

const scaleText = (s: InstrumentSetting): string =>
  [
    s.resolutionMm === undefined ? null : `${s.resolutionMm} mm`,
    s.resolutionDeg === undefined ? null : `${s.resolutionDeg}°`,
  ]
    .filter(Boolean)
    .join(' / ');

/**
 * The instrument's id, resolution and calibration date: set once per session (remembered on this device, so a new
 * session only confirms). Its own form, so Enter here confirms the instrument rather than saving a reading.
 */
export function InstrumentSetup(props: {
  readonly instrument: InstrumentKey;
  readonly setting: InstrumentSetting;
  readonly confirmed: boolean;
  readonly onConfirm: (s: InstrumentSetting) => void;
  readonly onEdit: () => void;
}) {
  const def = instrumentDef(props.instrument);
  const idField = useId();
  const dateField = useId();
  const [draft, setDraft] = useState<InstrumentSetting>(props.setting);
  const [shown, setShown] = useState(false);
  const problems = checkSetting(props.instrument, draft, localDate(new Date()));

  if (props.confirmed) {
    const s = props.setting;
    return (
      <div class="gauge-instrument-summary">
        <p>
          <strong>{def.name}</strong> {s.id} · steps {scaleText(s)} ·{' '}
          {s.calibratedOn ? `calibrated ${s.calibratedOn}` : 'no calibration date given'}
        </p>
        <button type="button" onClick={props.onEdit}>
          Change {def.name.toLowerCase()}
        </button>
      </div>
    );
  }
  const set = (patch: { readonly [K in keyof InstrumentSetting]?: InstrumentSetting[K] | undefined }) => {
    // Cleared fields are left out rather than kept as undefined (the setting has optional fields).
    const merged: Record<string, unknown> = { ...draft, ...patch };
    const kept = Object.entries(merged).filter(([k, v]) => k === 'id' || (v !== undefined && v !== ''));
    setDraft({ id: '', ...Object.fromEntries(kept) } as InstrumentSetting);
  };
  const confirm = (e: Event) => {
    e.preventDefault();
    setShown(true);
    if (Object.keys(problems).length === 0) props.onConfirm({ ...draft, id: draft.id.trim() });
  };
  const err = (k: keyof typeof problems) => (shown ? problems[k] : undefined);
  return (
    <form class="gauge-instrument-setup" onSubmit={confirm} aria-label={`${def.name} for this session`}>
      <p class="help">
        Set the {def.name.toLowerCase()} once for this session: its id, the smallest step it reads (the + and
        − buttons step by it, and it decides “borderline”), and when it was last calibrated.
      </p>
      <div class={err('id') ? 'field field-error' : 'field'}>
        <label for={idField}>{def.name} id</label>
        <input
          id={idField}
          type="text"
          autoComplete="off"
          value={draft.id}
          aria-invalid={err('id') ? 'true' : 'false'}
          onInput={(e) => set({ id: (e.target as HTMLInputElement).value })}
        />
        <p class={err('id') ? 'help help-error' : 'help'}>
          {err('id') ? `⚠ ${err('id')}` : 'as marked on the gauge'}
        </p>
      </div>
      {def.scales.mm ? (
        <NumberField
          label="Length resolution"
          unit="mm"
          step={0.05}
          min={0.01}
          max={10}
          value={draft.resolutionMm}
          onChange={(v) => set({ resolutionMm: v })}
          error={err('resolutionMm')}
        />
      ) : null}
      {def.scales.deg ? (
        <NumberField
          label="Angle resolution"
          unit="°"
          step={0.5}
          min={0.1}
          max={10}
          value={draft.resolutionDeg}
          onChange={(v) => set({ resolutionDeg: v })}
          error={err('resolutionDeg')}
        />
      ) : null}
      <div class={err('calibratedOn') ? 'field field-error' : 'field'}>
        <label for={dateField}>Calibrated on</label>
        <input
          id={dateField}
          type="date"
          value={draft.calibratedOn ?? ''}
          max={localDate(new Date())}
          aria-invalid={err('calibratedOn') ? 'true' : 'false'}
          onInput={(e) => set({ calibratedOn: (e.target as HTMLInputElement).value })}
        />
        <p class={err('calibratedOn') ? 'help help-error' : 'help'}>
          {err('calibratedOn') ? `⚠ ${err('calibratedOn')}` : 'from the calibration label or certificate'}
        </p>
      </div>
      <button type="submit" class="gauge-primary">
        Use this {def.name.toLowerCase()}
      </button>
    </form>
  );
}
