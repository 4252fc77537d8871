import { useId, useState } from 'preact/hooks';
import { parseDecimal, stepBy } from './parse-decimal.js';

export interface NumberFieldProps {
  readonly label: string;
  readonly unit: string;
  readonly value: number | undefined;
  readonly onChange: (value: number | undefined) => void;
  /** Stepper increment: the resolution of the instrument in the user's hand. */
  readonly step: number;
  readonly min?: number;
  readonly max?: number;
  readonly hint?: string;
  readonly error?: string | undefined;
  readonly name?: string;
}

/** A gloves-friendly number field: decimal keypad, decimal comma, unit always shown, big steppers. */
export function NumberField(props: NumberFieldProps) {
  const id = useId();
  const [text, setText] = useState(props.value === undefined ? '' : String(props.value));
  const [typedError, setTypedError] = useState<string | null>(null);
  const shown = props.value === undefined ? '' : String(props.value);
  const display =
    parseDecimal(text) === (props.value ?? null) || (text === '' && props.value === undefined) ? text : shown;
  const commit = (raw: string) => {
    setText(raw);
    if (raw.trim() === '') {
      setTypedError(null);
      props.onChange(undefined);
      return;
    }
    const n = parseDecimal(raw);
    if (n === null) {
      setTypedError(`type a number in ${props.unit}, e.g. 1,5`);
      return;
    }
    setTypedError(null);
    props.onChange(n);
  };
  const bump = (direction: 1 | -1) => {
    let next = stepBy(props.value ?? props.min ?? 0, props.step, direction);
    if (props.min !== undefined) next = Math.max(props.min, next);
    if (props.max !== undefined) next = Math.min(props.max, next);
    setText(String(next));
    setTypedError(null);
    props.onChange(next);
  };
  const error = typedError ?? props.error;
  return (
    <div class={error ? 'field field-error' : 'field'}>
      <label for={id}>
        {props.label} <span class="unit">({props.unit})</span>
      </label>
      <div class="field-row">
        <button
          type="button"
          class="step"
          aria-label={`${props.label} minus ${props.step} ${props.unit}`}
          onClick={() => bump(-1)}
        >
          −
        </button>
        <input
          id={id}
          name={props.name}
          type="text"
          inputMode="decimal"
          autoComplete="off"
          value={display}
          aria-invalid={error ? 'true' : 'false'}
          aria-describedby={`${id}-help`}
          onInput={(e) => commit((e.target as HTMLInputElement).value)}
        />
        <span class="unit-suffix" aria-hidden="true">
          {props.unit}
        </span>
        <button
          type="button"
          class="step"
          aria-label={`${props.label} plus ${props.step} ${props.unit}`}
          onClick={() => bump(1)}
        >
          +
        </button>
      </div>
      <p id={`${id}-help`} class={error ? 'help help-error' : 'help'}>
        {error ? `⚠ ${error}` : (props.hint ?? '')}
      </p>
    </div>
  );
}
