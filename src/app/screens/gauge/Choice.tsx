import type { ComponentChildren } from 'preact';

export interface ChoiceOption<T extends string> {
  readonly value: T;
  readonly label: ComponentChildren;
  readonly disabled?: boolean;
}

/**
 * A row of big buttons, one pressed. Buttons with aria-pressed keep it to Tab and Enter/Space for a keyboard
 * or switch user; the pressed one carries a tick and a heavy border, so colour is never the only cue.
 */
export function Choice<T extends string>(props: {
  readonly legend: ComponentChildren;
  readonly options: readonly ChoiceOption<T>[];
  readonly value: T | undefined;
  readonly onChange: (value: T) => void;
  readonly error?: string | undefined;
  readonly compact?: boolean;
  readonly class?: string;
}) {
  return (
    <fieldset class={`gauge-choice${props.compact ? ' gauge-choice-compact' : ''} ${props.class ?? ''}`}>
      <legend>{props.legend}</legend>
      <div class="gauge-choice-row">
        {props.options.map((o) => {
          const pressed = o.value === props.value;
          return (
            <button
              key={o.value}
              type="button"
              class="gauge-option"
              aria-pressed={pressed}
              disabled={o.disabled}
              onClick={() => props.onChange(o.value)}
            >
              <span class="gauge-mark" aria-hidden="true">
                {pressed ? '✓' : ''}
              </span>
              <span>{o.label}</span>
            </button>
          );
        })}
      </div>
      {props.error ? <p class="help help-error">⚠ {props.error}</p> : null}
    </fieldset>
  );
}

/** One on/off button (aria-pressed), e.g. "Runs along the seam". */
export function Toggle(props: {
  readonly label: ComponentChildren;
  readonly pressed: boolean;
  readonly onChange: (pressed: boolean) => void;
}) {
  return (
    <button
      type="button"
      class="gauge-option gauge-toggle"
      aria-pressed={props.pressed}
      onClick={() => props.onChange(!props.pressed)}
    >
      <span class="gauge-mark gauge-box" aria-hidden="true">
        {props.pressed ? '✓' : ''}
      </span>
      <span>{props.label}</span>
    </button>
  );
}
