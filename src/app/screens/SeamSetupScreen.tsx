import type { RenderableProps } from 'preact';
import { useEffect, useMemo, useState } from 'preact/hooks';
import {
  BUILT_IN_CRITERIA,
  CHECKLIST_LABEL,
  CHECKLIST_RULES,
  EDITIONS,
  EXECUTION_CLASS_PRESETS,
  EXECUTION_CLASSES,
  JOINT_TYPES,
  LEVELS,
  PREPARATIONS,
  SURFACE_CONDITIONS,
  type ChecklistItem,
  type Edition,
  type Level,
} from '../../domain/index.js';
import type { SeamRecord } from '../../store/api.js';
import { uuidv7 } from '../../store/ids.js';
import { ChoiceGroup } from '../components/ChoiceGroup.js';
import { JOINT_LABEL, PREPARATION_LABEL, SETTING_LABEL, SURFACE_LABEL } from '../components/format.js';
import { NumberField } from '../components/NumberField.js';
import {
  checkSetup,
  emptyForm,
  formFromSeam,
  isFillet,
  type SetupField,
  type SetupForm,
} from '../components/setup-form.js';
import { TextField } from '../components/TextField.js';
import { hrefOf, navigate } from '../router.js';
import { takePendingTag } from '../scan/pending-tag.js';
import { shownTag } from '../../domain/tags/tag-text.js';
import { getStore } from '../services/store.js';

type Errors = Partial<Record<SetupField, string[]>>;

const FIELD_NAME: Partial<Record<SetupField, string>> = {
  label: 'Label',
  tags: 'Tags',
  drawing: 'Drawing',
  drawingPosition: 'Position on the drawing',
  jointType: 'Joint type',
  preparation: 'Preparation',
  t1: 'Plate 1 thickness',
  t2: 'Plate 2 thickness',
  buttThickness: 'Butt-weld thickness s',
  nominalThroat: 'Nominal throat a',
  leg1: 'Nominal leg z1',
  leg2: 'Nominal leg z2',
  legs: 'Nominal legs',
  length: 'Length',
  surface: 'Surface condition',
  materialName: 'Material',
  materialGroup: 'Material group',
  acceptance: 'Acceptance',
  level: 'Required level',
  preset: 'Execution class',
  overrides: 'Per-imperfection levels',
  edition: 'Edition',
  process: 'Process number',
  welder: 'Welder',
  procedure: 'Procedure (WPS)',
  form: 'Seam',
};

/** ISO 6520-1 numbers an override may name in the edition, each with what it is, for the picker. */
function overrideChoices(edition: Edition): { ref: string; title: string }[] {
  const titles = new Map<string, string>();
  for (const row of BUILT_IN_CRITERIA[edition].rows)
    for (const ref of row.refs)
      if (!titles.has(ref)) titles.set(ref, row.title.replace(/ \((butt|fillet) weld\)$/, ''));
  for (const [item, rule] of Object.entries(CHECKLIST_RULES))
    if (!titles.has(rule.ref)) titles.set(rule.ref, CHECKLIST_LABEL[item as ChecklistItem]);
  return [...titles.entries()]
    .map(([ref, title]) => ({ ref, title }))
    .sort((a, b) => a.ref.localeCompare(b.ref, 'en', { numeric: true }));
}

const joined = (e: Errors, f: SetupField): string | undefined => e[f]?.join('; ');

function ErrorSummary({ errors }: { readonly errors: Errors }) {
  const fields = Object.keys(errors) as SetupField[];
  if (!fields.length) return null;
  return (
    <div role="alert" class="banner banner-bad error-summary">
      <p>
        <strong>
          ⚠ {fields.length} {fields.length === 1 ? 'thing needs' : 'things need'} fixing before the seam can
          be saved:
        </strong>
      </p>
      <ul>
        {fields.map((f) => (
          <li key={f}>
            <a
              href={`#f-${f}`}
              onClick={(ev) => {
                ev.preventDefault();
                document.getElementById(`f-${f}`)?.scrollIntoView({ block: 'center' });
                (
                  document.querySelector(
                    `#f-${f} input, #f-${f} select, #f-${f} textarea`,
                  ) as HTMLElement | null
                )?.focus();
              }}
            >
              {FIELD_NAME[f] ?? f}
            </a>
            : {errors[f]?.join('; ')}
          </li>
        ))}
      </ul>
    </div>
  );
}

function SelectField<T extends string>(props: {
  readonly label: string;
  readonly value: T;
  readonly options: readonly { readonly value: T; readonly label: string }[];
  readonly onChange: (v: T) => void;
  readonly error?: string | undefined;
  readonly hint?: string;
}) {
  const id = `sel-${props.label.replace(/\W+/g, '-').toLowerCase()}`;
  return (
    <div class={props.error ? 'field field-error' : 'field'}>
      <label for={id}>{props.label}</label>
      <select
        id={id}
        value={props.value}
        onChange={(e) => props.onChange((e.target as HTMLSelectElement).value as T)}
      >
        {props.options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      <p class={props.error ? 'help help-error' : 'help'}>
        {props.error ? `⚠ ${props.error}` : (props.hint ?? '')}
      </p>
    </div>
  );
}

function SetupFormView({ rec }: { readonly rec: SeamRecord | null }) {
  const [form, setForm] = useState<SetupForm>(() => (rec ? formFromSeam(rec.seam) : emptyForm()));
  // A tag the user chose "New seam with this tag" for: linked once the seam is saved.
  const [pendingTag] = useState(() => (rec ? null : takePendingTag()));
  const [id] = useState(() => rec?.id ?? uuidv7());
  const [tried, setTried] = useState(false);
  const [saving, setSaving] = useState(false);
  const [saveError, setSaveError] = useState<string | null>(null);
  const set = <K extends keyof SetupForm>(key: K, value: SetupForm[K]) =>
    setForm((f) => ({ ...f, [key]: value }));
  const check = useMemo(() => checkSetup(form, id, rec?.seam), [form, id, rec]);
  const errors: Errors = tried && !check.ok ? check.errors : {};
  const err = (f: SetupField) => joined(errors, f);
  const fillet = isFillet(form.jointType);
  const choices = useMemo(() => overrideChoices(form.edition), [form.edition]);

  const save = async (ev: Event) => {
    ev.preventDefault();
    setTried(true);
    setSaveError(null);
    if (!check.ok) return;
    setSaving(true);
    try {
      const store = await getStore();
      const saved = await store.saveSeam(check.seam, rec?.namespace ?? 'live');
      if (pendingTag) await store.linkTag(saved.id, pendingTag.tag, pendingTag.via);
      navigate({ name: 'seam', id: saved.id });
    } catch (e) {
      setSaveError(e instanceof Error ? e.message : String(e));
      setSaving(false);
    }
  };

  const setJoint = (type: SetupForm['jointType']) =>
    setForm((f) => ({
      ...f,
      jointType: type,
      // A fillet joint has no groove preparation to speak of; a butt joint needs one.
      preparation: type === 'butt' ? (f.preparation === 'fillet' ? 'singleV' : f.preparation) : 'fillet',
    }));

  return (
    <form class="setup" onSubmit={(e) => void save(e)} noValidate>
      <h1>{rec ? `Set-up of ${rec.seam.label}` : 'Set up a seam'}</h1>
      {rec?.namespace === 'demo' ? (
        <p class="note">
          <span class="tag tag-demo">demo</span> This is a demo seam; changes stay in the demo data.
        </p>
      ) : null}
      {pendingTag ? (
        <p class="note pending-tag">
          The tag{' '}
          <code class="tag-text" title={pendingTag.tag}>
            {shownTag(pendingTag.tag)}
          </code>{' '}
          will be linked to this seam when it is saved.
        </p>
      ) : null}
      <ErrorSummary errors={errors} />

      <fieldset class="group">
        <legend>Seam</legend>
        <div class="grid">
          <div id="f-label">
            <TextField
              label="Label"
              required
              value={form.label}
              onChange={(v) => set('label', v)}
              error={err('label')}
              hint="What the seam is called on site, e.g. the mark next to it"
            />
          </div>
          <div id="f-tags">
            <TextField
              label="Tags"
              value={form.tags}
              onChange={(v) => set('tags', v)}
              error={err('tags')}
              hint="Tag codes on the seam, separated by commas"
            />
          </div>
          <div id="f-drawing">
            <TextField
              label="Drawing"
              value={form.drawing}
              onChange={(v) => set('drawing', v)}
              error={err('drawing')}
            />
          </div>
          <div id="f-drawingPosition">
            <TextField
              label="Position on the drawing"
              value={form.drawingPosition}
              onChange={(v) => set('drawingPosition', v)}
              error={err('drawingPosition')}
            />
          </div>
        </div>
      </fieldset>

      <fieldset class="group">
        <legend>Joint</legend>
        <div id="f-jointType">
          <ChoiceGroup
            legend="Joint type"
            value={form.jointType}
            onChange={setJoint}
            error={err('jointType')}
            options={JOINT_TYPES.map((t) => ({ value: t, label: JOINT_LABEL[t] }))}
          />
        </div>
        <div class="grid">
          <div id="f-preparation">
            <SelectField
              label="Preparation"
              value={form.preparation}
              onChange={(v) => set('preparation', v)}
              error={err('preparation')}
              options={[
                { value: '', label: 'Not recorded' },
                // A fillet joint's plate may be bevelled or J-prepared for penetration; a butt joint is never "fillet".
                ...PREPARATIONS.filter(
                  (p) =>
                    p === form.preparation ||
                    (fillet ? p === 'fillet' || p.includes('Bevel') || p.includes('J') : p !== 'fillet'),
                ).map((p) => ({ value: p as string, label: PREPARATION_LABEL[p] ?? p })),
              ]}
            />
          </div>
          <div id="f-sides">
            <ChoiceGroup
              legend="Welded from"
              value={form.sides}
              onChange={(v) => set('sides', v)}
              error={err('sides')}
              options={[
                { value: 'one', label: 'One side' },
                { value: 'two', label: 'Both sides' },
              ]}
            />
          </div>
          <div id="f-setting">
            <ChoiceGroup
              legend="Where"
              value={form.setting}
              onChange={(v) => set('setting', v)}
              error={err('setting')}
              options={[
                { value: 'shopFlat', label: SETTING_LABEL['shopFlat'] ?? 'Shop' },
                { value: 'site', label: SETTING_LABEL['site'] ?? 'Site' },
              ]}
            />
          </div>
          {form.sides === 'two' ? (
            <div id="f-faceSideNote">
              <TextField
                label="Face side marked as"
                value={form.faceSideNote}
                onChange={(v) => set('faceSideNote', v)}
                error={err('faceSideNote')}
                hint="Which physical side counts as the face, e.g. “outside of the tank”"
              />
            </div>
          ) : null}
        </div>
      </fieldset>

      <fieldset class="group">
        <legend>Plates and weld size</legend>
        <p class="explain">
          <strong>Plate 1</strong> is the loaded plate: the one the loads are measured on or, in a T or
          cruciform joint, the main (through) plate. <strong>Plate 2</strong> is the other one (the
          attachment). Which is which is fixed here and stays so for every reading.
        </p>
        <div class="grid">
          <div id="f-t1">
            <NumberField
              label="Plate 1 thickness t1"
              unit="mm"
              step={0.5}
              min={0.5}
              value={form.t1}
              onChange={(v) => set('t1', v)}
              error={err('t1')}
              hint="The loaded / main plate"
            />
          </div>
          <div id="f-t2">
            <NumberField
              label="Plate 2 thickness t2"
              unit="mm"
              step={0.5}
              min={0.5}
              value={form.t2}
              onChange={(v) => set('t2', v)}
              error={err('t2')}
              hint={fillet ? 'The attached plate' : 'The other plate'}
            />
          </div>
          {fillet ? (
            <>
              <div id="f-nominalThroat">
                <NumberField
                  label="Nominal throat a"
                  unit="mm"
                  step={0.5}
                  min={0}
                  value={form.nominalThroat}
                  onChange={(v) => set('nominalThroat', v)}
                  error={err('nominalThroat')}
                  hint="From the drawing; needed to grade throat, gap and asymmetry"
                />
              </div>
              <div id="f-leg1">
                <NumberField
                  label="Nominal leg z1 (on plate 1)"
                  unit="mm"
                  step={0.5}
                  min={0}
                  value={form.leg1}
                  onChange={(v) => set('leg1', v)}
                  error={err('leg1') ?? err('legs')}
                  hint="Optional; give both legs or neither"
                />
              </div>
              <div id="f-leg2">
                <NumberField
                  label="Nominal leg z2 (on plate 2)"
                  unit="mm"
                  step={0.5}
                  min={0}
                  value={form.leg2}
                  onChange={(v) => set('leg2', v)}
                  error={err('leg2') ?? err('legs')}
                />
              </div>
            </>
          ) : (
            <div id="f-buttThickness">
              <NumberField
                label="Butt-weld thickness s"
                unit="mm"
                step={0.5}
                min={0.5}
                value={form.buttThickness}
                onChange={(v) => set('buttThickness', v)}
                error={err('buttThickness')}
                hint="Partial penetration only; leave empty for full penetration"
              />
            </div>
          )}
        </div>
      </fieldset>

      <fieldset class="group">
        <legend>Length and surface</legend>
        <div class="grid">
          <div id="f-length">
            <NumberField
              label="Length"
              unit="mm"
              step={10}
              min={0}
              value={form.length}
              onChange={(v) => set('length', v)}
              error={err('length')}
              hint="From the start mark to the end mark"
            />
          </div>
          <div id="f-circumferential">
            <ChoiceGroup
              legend="Runs round"
              value={form.circumferential ? 'yes' : 'no'}
              onChange={(v) => set('circumferential', v === 'yes')}
              error={err('circumferential')}
              options={[
                { value: 'no', label: 'Straight / open' },
                { value: 'yes', label: 'Circumferential' },
              ]}
              hint="A circumferential seam ends where it started"
            />
          </div>
          <div id="f-surface">
            <SelectField
              label="Surface condition"
              value={form.surface}
              onChange={(v) => set('surface', v)}
              error={err('surface')}
              options={SURFACE_CONDITIONS.map((s) => ({ value: s, label: SURFACE_LABEL[s] ?? s }))}
            />
          </div>
        </div>
      </fieldset>

      <fieldset class="group">
        <legend>Material</legend>
        <div class="grid">
          <div id="f-materialName">
            <TextField
              label="Material"
              required
              value={form.materialName}
              onChange={(v) => set('materialName', v)}
              error={err('materialName')}
              hint="e.g. S355J2"
            />
          </div>
          <div id="f-materialGroup">
            <TextField
              label="ISO/TR 15608 group"
              inputMode="decimal"
              value={form.materialGroup}
              onChange={(v) => set('materialGroup', v)}
              error={err('materialGroup')}
              hint="e.g. 1.2 or 22"
            />
          </div>
          <div id="f-materialKind">
            <ChoiceGroup
              legend="Kind"
              value={form.materialKind}
              onChange={(v) => set('materialKind', v)}
              error={err('materialKind')}
              options={[
                { value: 'steel', label: 'Steel' },
                { value: 'aluminium', label: 'Aluminium' },
              ]}
            />
          </div>
        </div>
      </fieldset>

      <fieldset class="group">
        <legend>Acceptance</legend>
        <div id="f-acceptance">
          <ChoiceGroup
            legend="The seam must meet"
            value={form.acceptanceMode}
            onChange={(v) => set('acceptanceMode', v)}
            error={err('acceptance')}
            options={[
              { value: 'level', label: 'A quality level' },
              { value: 'preset', label: 'An execution class' },
            ]}
          />
        </div>
        {form.acceptanceMode === 'level' ? (
          <div id="f-level">
            <ChoiceGroup
              legend="Required level (ISO 5817)"
              value={form.level}
              onChange={(v) => set('level', v)}
              error={err('level')}
              options={LEVELS.map((l) => ({ value: l, label: `Level ${l}` }))}
              hint="B is the most demanding, D the least"
            />
          </div>
        ) : (
          <div id="f-preset">
            <ChoiceGroup
              legend="Execution class (EN 1090-2)"
              value={form.preset}
              onChange={(v) => set('preset', v)}
              error={err('preset')}
              options={EXECUTION_CLASSES.map((c) => ({
                value: c,
                label: `${c} → ${EXECUTION_CLASS_PRESETS[c].level}`,
              }))}
              hint={
                EXECUTION_CLASS_PRESETS[form.preset].note ??
                (Object.keys(EXECUTION_CLASS_PRESETS[form.preset].overrides).length
                  ? `${form.preset} asks level ${EXECUTION_CLASS_PRESETS[form.preset].level}, with D for ${Object.keys(EXECUTION_CLASS_PRESETS[form.preset].overrides).join(', ')}`
                  : `${form.preset} asks level ${EXECUTION_CLASS_PRESETS[form.preset].level}`)
              }
            />
          </div>
        )}
        <div id="f-overrides" class={err('overrides') ? 'overrides field-error' : 'overrides'}>
          <p class="sub">Per-imperfection levels (optional)</p>
          {form.overrides.length === 0 ? (
            <p class="help">None: every imperfection is graded at the required level.</p>
          ) : null}
          {form.overrides.map((o, i) => (
            <div class="override" key={i}>
              <SelectField
                label={`Imperfection ${i + 1}`}
                value={o.ref}
                onChange={(v) =>
                  set(
                    'overrides',
                    form.overrides.map((x, j) => (j === i ? { ...x, ref: v } : x)),
                  )
                }
                options={choices.map((c) => ({ value: c.ref, label: `${c.ref} — ${c.title}` }))}
              />
              <ChoiceGroup
                legend={`Level for ${o.ref}`}
                value={o.level}
                onChange={(v: Level) =>
                  set(
                    'overrides',
                    form.overrides.map((x, j) => (j === i ? { ...x, level: v } : x)),
                  )
                }
                options={LEVELS.map((l) => ({ value: l, label: l }))}
              />
              <button
                type="button"
                onClick={() =>
                  set(
                    'overrides',
                    form.overrides.filter((_, j) => j !== i),
                  )
                }
              >
                Remove {o.ref}
              </button>
            </div>
          ))}
          {err('overrides') ? <p class="help help-error">⚠ {err('overrides')}</p> : null}
          <button
            type="button"
            onClick={() =>
              set('overrides', [
                ...form.overrides,
                {
                  ref: choices.find((c) => !form.overrides.some((o) => o.ref === c.ref))?.ref ?? '5011',
                  level: 'D',
                },
              ])
            }
          >
            + Add a per-imperfection level
          </button>
        </div>
        <div id="f-edition">
          <ChoiceGroup
            legend="Edition of ISO 5817"
            value={form.edition}
            onChange={(v) => set('edition', v)}
            error={err('edition')}
            options={EDITIONS.map((e) => ({ value: e, label: e }))}
          />
        </div>
      </fieldset>

      <fieldset class="group">
        <legend>Welding</legend>
        <div class="grid">
          <div id="f-process">
            <TextField
              label="Process number (ISO 4063)"
              inputMode="numeric"
              value={form.process}
              onChange={(v) => set('process', v)}
              error={err('process')}
              hint="e.g. 135"
            />
          </div>
          <div id="f-welder">
            <TextField
              label="Welder"
              value={form.welder}
              onChange={(v) => set('welder', v)}
              error={err('welder')}
              hint="Name or stamp"
            />
          </div>
          <div id="f-procedure">
            <TextField
              label="Procedure (WPS)"
              value={form.procedure}
              onChange={(v) => set('procedure', v)}
              error={err('procedure')}
            />
          </div>
        </div>
      </fieldset>

      {errors.form ? (
        <p class="banner banner-bad" role="alert">
          ⚠ {errors.form.join('; ')}
        </p>
      ) : null}
      {saveError ? (
        <p class="banner banner-bad" role="alert">
          ⚠ The seam was not saved: {saveError}
        </p>
      ) : null}
      <div class="actions sticky-actions">
        <button type="submit" class="primary" disabled={saving}>
          {saving ? 'Saving…' : rec ? 'Save set-up' : 'Save seam'}
        </button>
        <a class="button" href={rec ? hrefOf({ name: 'seam', id: rec.id }) : hrefOf({ name: 'seams' })}>
          Cancel
        </a>
      </div>
    </form>
  );
}

/** Sets up a new seam, or edits the set-up of seam `id`. */
// RenderableProps: a component whose only prop is optional must still accept the `{}` the router passes.
export default function SeamSetupScreen({ id }: RenderableProps<{ readonly id?: string | undefined }>) {
  const [rec, setRec] = useState<SeamRecord | null | 'loading' | 'missing'>(
    id === undefined ? null : 'loading',
  );
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    if (id === undefined) {
      setRec(null);
      return;
    }
    let live = true;
    getStore()
      .then((s) => s.getSeam(id))
      .then(
        (r) => live && setRec(r ?? 'missing'),
        (e: unknown) => live && setError(e instanceof Error ? e.message : String(e)),
      );
    return () => {
      live = false;
    };
  }, [id]);
  if (error)
    return (
      <p role="alert" class="banner banner-bad">
        ⚠ The seam could not be read ({error}).
      </p>
    );
  if (rec === 'loading') return <p aria-busy="true">Loading the set-up…</p>;
  if (rec === 'missing') {
    return (
      <p role="alert">
        There is no seam with this id on this device.{' '}
        <a href={hrefOf({ name: 'seams' })}>Back to the seams</a>
      </p>
    );
  }
  return <SetupFormView key={rec?.id ?? 'new'} rec={rec} />;
}
