import { jointFamily, type Seam, type Side } from '../../../domain/index.js';
import { JointDrawing } from './JointDrawing.js';
import { plateName, sideName, toeName } from './field-labels.js';
import { sidesWithToes } from './joint-geometry.js';
import type { Where } from './reading-builder.js';

const cap = (s: string): string => s.charAt(0).toUpperCase() + s.slice(1);

function SideWords({ side, seam }: { readonly side: Side; readonly seam: Seam }) {
  const butt = jointFamily(seam.joint.type) === 'butt';
  const what = butt
    ? side === 'face'
      ? 'cap'
      : 'root bead'
    : side === 'face'
      ? 'face-side fillet'
      : 'root-side fillet';
  return (
    <>
      {cap(sideName(side))} <span class="gauge-sub">({what})</span>
    </>
  );
}

/**
 * Where on the cross-section: four toe targets laid out as the toes lie on the drawing (butt: face above, root
 * below, plate 1 left; T joint: attachment toes above, main-plate toes below, face side left), or, when only a
 * side matters, the two sides. Each target is a button with its name in text and aria-pressed.
 */
export function ToePicker(props: {
  readonly seam: Seam;
  readonly where: Where;
  readonly mode: 'toe' | 'side';
  readonly onChange: (where: Where) => void;
  readonly error?: string | undefined;
  /** Words about which values the toe or side applies to. */
  readonly hint?: string | undefined;
}) {
  const { seam, where, mode } = props;
  const butt = jointFamily(seam.joint.type) === 'butt';
  const sides = sidesWithToes(seam);
  const toeButton = (plate: 1 | 2, side: Side) => {
    if (!sides.includes(side)) return <span class="toe-slot-empty" />;
    const pressed = where.plate === plate && where.side === side;
    return (
      <button
        type="button"
        class="gauge-option toe-button"
        aria-pressed={pressed}
        onClick={() => props.onChange({ plate, side })}
      >
        <span class="gauge-mark" aria-hidden="true">
          {pressed ? '✓' : ''}
        </span>
        <span>{cap(toeName({ plate, side }, seam))}</span>
      </button>
    );
  };
  const sideButton = (side: Side) => {
    if (!sides.includes(side)) return <span class="toe-slot-empty" />;
    const pressed = where.side === side;
    return (
      <button
        type="button"
        class="gauge-option toe-button"
        aria-pressed={pressed}
        onClick={() => props.onChange({ plate: where.plate, side })}
      >
        <span class="gauge-mark" aria-hidden="true">
          {pressed ? '✓' : ''}
        </span>
        <span>
          <SideWords side={side} seam={seam} />
        </span>
      </button>
    );
  };
  // Rows mirror the drawing so the button sits on the same side as the toe it names.
  const top = butt
    ? [toeButton(1, 'face'), toeButton(2, 'face')]
    : [toeButton(2, 'face'), toeButton(2, 'root')];
  const bottom = butt
    ? [toeButton(1, 'root'), toeButton(2, 'root')]
    : [toeButton(1, 'face'), toeButton(1, 'root')];
  const chosen =
    mode === 'toe' ? toeName({ plate: where.plate, side: where.side }, seam) : sideName(where.side);
  return (
    <fieldset class="gauge-where">
      <legend>{mode === 'toe' ? 'Which toe' : 'Which side'}</legend>
      <div class={`toe-grid toe-grid-${mode}`}>
        {mode === 'toe' ? (
          <>
            <div class="toe-row">{top}</div>
            <JointDrawing
              seam={seam}
              toe={{ plate: where.plate, side: where.side }}
              side={null}
              onPickToe={(t) => props.onChange(t)}
            />
            <div class="toe-row">{bottom}</div>
          </>
        ) : butt ? (
          <>
            <div class="toe-row toe-row-single">{sideButton('face')}</div>
            <JointDrawing seam={seam} toe={null} side={where.side} />
            <div class="toe-row toe-row-single">{sideButton('root')}</div>
          </>
        ) : (
          <>
            <div class="toe-row">
              {sideButton('face')}
              {sideButton('root')}
            </div>
            <JointDrawing seam={seam} toe={null} side={where.side} />
          </>
        )}
      </div>
      <p class="gauge-chosen" aria-live="polite">
        Chosen: <strong>{chosen}</strong>
        {mode === 'toe'
          ? ` (${plateName(where.plate, seam)} is ${where.plate === 1 ? seam.plate1.thickness : seam.plate2.thickness} mm)`
          : ''}
      </p>
      {props.hint ? <p class="help">{props.hint}</p> : null}
      {props.error ? <p class="help help-error">⚠ {props.error}</p> : null}
    </fieldset>
  );
}
